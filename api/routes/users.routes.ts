/** Accounts (admin only): list, create, change (name, role, disabled), send a reset link. */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { AccountRole } from '#shared/workflow/roles';
import { currentUser, requirePermission } from '../auth/require';
import { createUser, issuePasswordReset, listUsers, setAccountDisabled, updateUser } from '../services/users.service';
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
    const actorId = currentUser(req).id;
    const id = idParam(req.params.id, 'user');
    const { disabled, ...changes } = req.body as { displayName?: string; role?: AccountRole; disabled?: boolean };
    // Disabling first: its one refusal (your own account) comes before anything is written.
    let user = disabled !== undefined ? await setAccountDisabled(dataSource, actorId, id, disabled) : null;
    if (Object.keys(changes).length > 0) user = await updateUser(dataSource, actorId, id, changes);
    res.json(user);
  });
  router.post('/:id/password-reset', async (req, res) => {
    res.status(202).json(await issuePasswordReset(dataSource, currentUser(req).id, idParam(req.params.id, 'user')));
  });
  return router;
}
