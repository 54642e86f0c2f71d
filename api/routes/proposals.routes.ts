/** One proposal: read it, decide, review, and its audit trail. */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { RuleSet } from '../../shared/engine/types';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { decide, getProposal, proposalAudit, review } from '../services/proposals.service';
import { DECISION_BODY, REVIEW_BODY } from '../validation/bodies';
import { idParam, validateBody } from '../validation/validate-request';

export function proposalsRoutes(dataSource: DataSource, ruleSet: RuleSet): Router {
  const router = Router();
  router.use(requireSignIn);
  router.get('/:id', async (req, res) => {
    res.json(await getProposal(dataSource, currentUser(req), idParam(req.params.id, 'proposal')));
  });
  router.post('/:id/decision', requirePermission('proposals:decide'), validateBody(DECISION_BODY), async (req, res) => {
    res.status(201).json(await decide(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), req.body, ruleSet));
  });
  router.post('/:id/review', requirePermission('proposals:review'), validateBody(REVIEW_BODY), async (req, res) => {
    res.status(201).json(await review(dataSource, currentUser(req), idParam(req.params.id, 'proposal'), req.body));
  });
  router.get('/:id/audit', async (req, res) => {
    res.json({ items: await proposalAudit(dataSource, currentUser(req), idParam(req.params.id, 'proposal')) });
  });
  return router;
}
