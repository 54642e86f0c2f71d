/** Accounts (admin only). */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { currentUser, requirePermission } from '../auth/require';
import { createUser, listUsers, updateUser } from '../services/users.service';
import { NEW_USER_BODY, USER_CHANGES_BODY } from '../validation/bodies';
import { idParam, validateBody } from '../validation/validate-request';

export function usersRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.use(requirePermission('users:manage'));
  router.get('/', async (_req, res) => {
    res.json({ items: await listUsers(dataSource) });
  });
  router.post('/', validateBody(NEW_USER_BODY), async (req, res) => {
    res.status(201).json(await createUser(dataSource, currentUser(req).id, req.body));
  });
  router.patch('/:id', validateBody(USER_CHANGES_BODY), async (req, res) => {
    res.json(await updateUser(dataSource, currentUser(req).id, idParam(req.params.id, 'user'), req.body));
  });
  return router;
}
