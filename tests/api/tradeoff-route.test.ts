/**
 * POST /api/tradeoff: a spec's topology sized at each tail current, each point's nominal figures
 * (or its message). Signed in only; the body's shape, the current count (1 to 40) and the spec
 * itself are checked (spec errors under /spec); a current the sizing cannot use answers 200 with
 * that point's reason and the other points' figures; the answer is the engine's, with the notice.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { ESTIMATE_NOTICE } from '#shared/engine/index';
import { tradeoffSweep } from '#shared/engine/tradeoff-sweep';
import { checkedSpecDocument } from '../../api/services/specs.service';
import { buildApiApp, csrfClient, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

describe('POST /api/tradeoff', () => {
  let api: TestApi;
  let designer: ApiClient;
  const body = () => ({ spec: specPayload(), topology: 'wilson', tailCurrentsA: [1e-4, 3e-4, 1e-3] });

  beforeAll(async () => {
    api = await buildApiApp({ accounts: ['admin', 'designer'] });
    designer = await api.agentFor('designer');
  });

  afterAll(() => api?.close());

  test('when nobody is signed in, then 401', async () => {
    const anonymous = await csrfClient(api.app);
    await anonymous.post('/api/tradeoff').send(body()).expect(401);
  });

  test('when a designer asks for three currents, then each point has the engine’s figures, in order, with the notice', async () => {
    const answer = await designer.post('/api/tradeoff').send(body()).expect(200);
    expect(answer.body.notice).toBe(ESTIMATE_NOTICE);
    expect(answer.body.topology).toBe('wilson');
    const expected = tradeoffSweep(checkedSpecDocument(specPayload()), 'wilson', [1e-4, 3e-4, 1e-3]);
    expect(answer.body.points).toEqual(JSON.parse(JSON.stringify(expected)));
    expect(answer.body.points.map((p: { ok: boolean; tailCurrentA: number }) => [p.ok, p.tailCurrentA])).toEqual([
      [true, 1e-4],
      [true, 3e-4],
      [true, 1e-3],
    ]);
    // more tail current: more power (the rails deliver it)
    const powers = answer.body.points.map((p: { powerW: number }) => p.powerW);
    expect(powers[1]).toBeGreaterThan(powers[0]);
    expect(powers[2]).toBeGreaterThan(powers[1]);
  });

  test('when one current is out of range, then 200: that point carries the reason, the others their figures', async () => {
    const answer = await designer.post('/api/tradeoff').send({ ...body(), tailCurrentsA: [1e-3, -2e-3] }).expect(200);
    expect(answer.body.points[0].ok).toBe(true);
    expect(answer.body.points[1]).toEqual({ ok: false, tailCurrentA: -2e-3, error: expect.stringMatching(/outside what the sizing works at/) });
  });

  test.each([
    ['no currents', { tailCurrentsA: [] }, '/tailCurrentsA'],
    ['41 currents', { tailCurrentsA: Array.from({ length: 41 }, (_, i) => 1e-4 * (i + 1)) }, '/tailCurrentsA'],
    ['a current as text', { tailCurrentsA: ['450 µA'] }, '/tailCurrentsA/0'],
    ['an unknown topology', { topology: 'tunnel-diode' }, '/topology'],
    ['an unknown field', { extra: 1 }, '/extra'],
  ])('when the body has %s, then 400 naming the path', async (_name, change, path) => {
    const answer = await designer.post('/api/tradeoff').send({ ...body(), ...change }).expect(400);
    expect(answer.body.details.map((d: { path: string }) => d.path)).toContain(path);
  });

  test('when the spec is not a valid spec, then 400 with the spec’s own paths under /spec', async () => {
    const spec = { ...specPayload(), powerBudgetW: -1 };
    const answer = await designer.post('/api/tradeoff').send({ ...body(), spec }).expect(400);
    expect(answer.body.details.map((d: { path: string }) => d.path)).toContain('/spec/powerBudgetW');
  });
});
