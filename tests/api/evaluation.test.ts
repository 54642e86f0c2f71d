/**
 * POST /api/proposals/:id/evaluation: a designer's own values checked as an override would be,
 * with nothing recorded.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Design } from '#shared/engine/types';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';
import { countRows } from '../helpers/api-validation-helpers';

let api: TestApi;
let designer: ApiClient;
let proposalId: number;
let design: Design;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
  const project = await api.createProject(['requirements', 'designer']);
  const spec = await api.createSpec(project.id);
  const proposal = await api.createProposal(spec.id);
  proposalId = proposal.id;
  design = proposal.result.options.find((o) => o.design)!.design!;
  designer = await api.agentFor('designer');
});

afterAll(() => api.close());

describe('POST /api/proposals/:id/evaluation', () => {
  test('when a designer sends own values, then every rule is decided and nothing is written', async () => {
    const before = await countRows(api.dataSource);
    const changed = { ...design, collectorResistanceOhm: design.collectorResistanceOhm * 1.5 };
    const response = await designer.post(`/api/proposals/${proposalId}/evaluation`).send({ design: changed }).expect(200);
    expect(response.body.design.collectorResistanceOhm).toBe(changed.collectorResistanceOhm);
    expect(response.body.checks.map((c: { rule: string }) => c.rule)).toEqual(api.ruleSet.rules.map((r) => r.rule));
    expect(response.body.figures.gainPredicted).toBeGreaterThan(0);
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when the rails are swapped, then 400 names /design/supply/negativeV', async () => {
    const response = await designer
      .post(`/api/proposals/${proposalId}/evaluation`)
      .send({ design: { ...design, supply: { positiveV: -5, negativeV: 5 } } })
      .expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain('/design/supply/negativeV');
  });
});
