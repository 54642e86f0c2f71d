/** One spec: read, new version, history, differences; asking for a proposal. */
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { RuleSet } from '#shared/engine/types';
import { currentUser, requirePermission, requireSignIn } from '../auth/require';
import { checkProposalRate, PROPOSALS_PER_MINUTE } from '../services/proposal-rate';
import { createProposalJson } from '../services/proposals.service';
import { diffVersions, getSpec, listVersions, updateSpec } from '../services/specs.service';
import { DIFF_QUERY, SPEC_BODY } from '../validation/bodies';
import { idParam, validateBody, validateQuery } from '../validation/validate-request';

export function specsRoutes(dataSource: DataSource, ruleSet: RuleSet, proposalsPerMinute = PROPOSALS_PER_MINUTE): Router {
  const router = Router();
  router.use(requireSignIn);
  router.get('/:id', async (req, res) => {
    res.json(await getSpec(dataSource, currentUser(req), idParam(req.params.id, 'spec')));
  });
  router.put('/:id', requirePermission('specs:write'), validateBody(SPEC_BODY), async (req, res) => {
    res.json(await updateSpec(dataSource, currentUser(req), idParam(req.params.id, 'spec'), req.body));
  });
  router.get('/:id/versions', async (req, res) => {
    res.json({ items: await listVersions(dataSource, currentUser(req), idParam(req.params.id, 'spec')) });
  });
  router.get('/:id/diff', validateQuery(DIFF_QUERY), async (req, res) => {
    const { from, to } = res.locals.query as { from: number; to: number };
    res.json(await diffVersions(dataSource, currentUser(req), idParam(req.params.id, 'spec'), from, to));
  });
  router.post('/:id/proposals', requirePermission('proposals:create'), async (req, res) => {
    // Before the engine runs: a 429 costs nothing.
    await checkProposalRate(dataSource, currentUser(req).id, proposalsPerMinute);
    res.status(201).type('application/json').send(await createProposalJson(dataSource, currentUser(req), idParam(req.params.id, 'spec'), ruleSet));
  });
  return router;
}
