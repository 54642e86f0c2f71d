/** The signed-in person's own personal API tokens: list, make (the token shown once), revoke. A session is needed (not a token). */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { requireSession } from '../auth/bearer';
import { currentUser, requireSignIn } from '../auth/require';
import { createApiToken, listApiTokens, revokeApiToken } from '../services/api-tokens.service';
import { API_TOKEN_BODY } from '../validation/bodies';
import { idParam, validateBody } from '../validation/validate-request';

export function apiTokensRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.use(requireSignIn, requireSession);
  router.get('/', async (req, res) => {
    res.set('Cache-Control', 'no-store');
    res.json({ items: await listApiTokens(dataSource, currentUser(req).id) });
  });
  router.post('/', validateBody(API_TOKEN_BODY), async (req, res) => {
    res.set('Cache-Control', 'no-store');
    res.status(201).json(await createApiToken(dataSource, currentUser(req).id, req.body));
  });
  router.delete('/:id', async (req, res) => {
    res.json(await revokeApiToken(dataSource, currentUser(req).id, idParam(req.params.id, 'api-token')));
  });
  return router;
}
