/** The stateless parts: what-if analysis, the spec schema for the form (and as a CSV template), the topology catalogue, health. */
import { Router } from 'express';
import { analyze, ConvergenceError, ENGINE_VERSION, ESTIMATE_NOTICE } from '#shared/engine/index';
import { TOPOLOGIES, type Design, type RuleSet } from '#shared/engine/types';
import { specCsvTemplate } from '#shared/import/spec-columns';
import { DESIGN_SCHEMA, SPEC_SCHEMA, validateDesign } from '#shared/validate';
import { requireSignIn } from '../auth/require';
import { AppError } from '../errors';
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
  router.post('/analyze', requireSignIn, validateBody(validateDesign), (req, res) => {
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
  return router;
}
