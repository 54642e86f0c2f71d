/** What waits for the signed-in person across their projects: the counts (for the navigation) and one kind's page (the home page). */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requireSignIn } from '../auth/require';
import { listWaiting, waitingCounts } from '../services/waiting.service';
import { WAITING_QUERY } from '../validation/bodies';
import { validateQuery } from '../validation/validate-request';

export function waitingRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.use(requireSignIn);
  router.get('/counts', async (req, res) => {
    res.json(await waitingCounts(dataSource, currentUser(req)));
  });
  router.get('/', validateQuery(WAITING_QUERY), async (req, res) => {
    res.json(await listWaiting(dataSource, currentUser(req), res.locals.query));
  });
  return router;
}
