/** The stateless parts: what-if analysis, the trade-off sweep, the spec schema for the form (and as a CSV template), the topology catalogue, health. */
import { Router } from 'express';
import { analyze, ConvergenceError, ENGINE_VERSION, ESTIMATE_NOTICE } from '#shared/engine/index';
import { TOPOLOGIES, type Design, type RuleSet } from '#shared/engine/types';
import { specCsvTemplate } from '#shared/import/spec-columns';
import type { TradeoffInput, TradeoffResponse } from '#shared/api/engine';
import { DESIGN_SCHEMA, SPEC_SCHEMA, validateDesign, validateSpec } from '#shared/validate';
import { sweepTradeoff } from '../engine/engine-pool';
import { TRADEOFF_BODY } from '../validation/bodies';
import { requireSignIn } from '../auth/require';
import { AppError, invalid } from '../errors';
import { validateBody } from '../validation/validate-request';

export function engineRoutes(ruleSet: RuleSet): Router {
  const router = Router();
  router.get('/health', (_req, res) => {
    res.json({ status: 'ok', engineVersion: ENGINE_VERSION, rulesetVersion: ruleSet.version });
  });
  router.get('/schema/spec', (_req, res) => {
    res.json(SPEC_SCHEMA);
  });
  router.get('/schema/spec.csv', (_req, res) => {
    res.attachment('longtail-spec-template.csv').type('text/csv; charset=utf-8').send(specCsvTemplate());
  });
  router.get('/schema/design', (_req, res) => {
    res.json(DESIGN_SCHEMA);
  });
  router.get('/topologies', (_req, res) => {
    res.json({ items: TOPOLOGIES.map((id, i) => ({ id, simplicityRank: i + 1 })) });
  });
  router.post('/analyze', requireSignIn, validateBody(validateDesign, DESIGN_SCHEMA), (req, res) => {
    try {
      res.json({ ...analyze(req.body as Design), notice: ESTIMATE_NOTICE });
    } catch (error) {
      if (error instanceof ConvergenceError) {
        const details = error.fields.map((path) => ({ path, message: 'makes the operating point hard to solve' }));
        throw new AppError('not-solvable', 422, `This design cannot be solved: ${error.message}.`, details);
      }
      throw error;
    }
  });
  // A topology sized at each tail current, each point's nominal figures or its message (on the engine pool: up to 40 sizings).
  router.post('/tradeoff', requireSignIn, validateBody(TRADEOFF_BODY), async (req, res) => {
    const body = req.body as TradeoffInput;
    const checked = validateSpec(body.spec);
    if (!checked.ok) throw invalid(checked.errors.map((e) => ({ path: `/spec${e.path}`, message: e.message })));
    const answer: TradeoffResponse = { topology: body.topology, points: await sweepTradeoff(checked.value, body.topology, body.tailCurrentsA), notice: ESTIMATE_NOTICE };
    res.json(answer);
  });
  return router;
}
