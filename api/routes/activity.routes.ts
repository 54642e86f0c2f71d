/** A project's activity: a page of the audit events of its specs and proposals, and all of them as CSV. */
import { once } from 'node:events';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requireSignIn } from '../auth/require';
import { activityCsv, listActivity } from '../services/activity.service';
import { ACTIVITY_CSV_QUERY, ACTIVITY_QUERY } from '../validation/bodies';
import { idParam, validateQuery } from '../validation/validate-request';

export function activityRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.use(requireSignIn);
  router.get('/:id/activity', validateQuery(ACTIVITY_QUERY), async (req, res) => {
    res.json(await listActivity(dataSource, currentUser(req), idParam(req.params.id, 'project'), res.locals.query));
  });
  router.get('/:id/activity.csv', validateQuery(ACTIVITY_CSV_QUERY), async (req, res) => {
    const { fileName, chunks } = await activityCsv(dataSource, currentUser(req), idParam(req.params.id, 'project'), res.locals.query);
    res.attachment(fileName).type('text/csv; charset=utf-8');
    for await (const chunk of chunks) if (!res.write(chunk)) await once(res, 'drain');
    res.end();
  });
  return router;
}
