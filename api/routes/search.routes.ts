/** The one search across what the signed-in person may see: projects, specs, proposals, people. */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requireSignIn } from '../auth/require';
import { search } from '../services/search.service';
import { SEARCH_QUERY } from '../validation/bodies';
import { validateQuery } from '../validation/validate-request';

export function searchRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.use(requireSignIn);
  router.get('/', validateQuery(SEARCH_QUERY), async (req, res) => {
    res.json(await search(dataSource, currentUser(req), res.locals.query));
  });
  return router;
}
