/** Administration pages' data that is not about accounts: the local mail server's messages. */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { requirePermission } from '../auth/require';
import { listReceivedMail } from '../services/notifications.service';

export function adminRoutes(dataSource: DataSource): Router {
  const router = Router();
  router.get('/mail', requirePermission('mail:read'), async (_req, res) => {
    res.json(await listReceivedMail(dataSource));
  });
  return router;
}
