/**
 * POST /api/analyze beyond validation: a design the engine cannot solve answers 422 naming the
 * fields that make it hard (each in `details`), and a JSON body with a UTF-8 byte-order mark in
 * front is read like the same body without one.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

const DESIGN = {
  device: { beta: 210, earlyVoltageV: 62, saturationCurrentA: 1.4e-14 },
  supply: { positiveV: 15, negativeV: -15 },
  collectorResistanceOhm: 10000,
  tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
};
/** 1 GΩ collector and cascode reference resistors around a 1 mΩ pair emitter resistor: no operating point found. */
const HARD = { ...DESIGN, collectorResistanceOhm: 1e9, pairEmitterResistanceOhm: 1e-3, tail: { topology: 'cascode', referenceResistanceOhm: 1e9 } };

describe('POST /api/analyze', () => {
  let api: TestApi;
  let designer: ApiClient;

  beforeAll(async () => {
    api = await buildApiApp();
    designer = await api.agentFor('designer');
  });

  afterAll(async () => {
    await api?.close();
  });

  test('a design that cannot be solved: 422, the message and details name the fields that make it hard', async () => {
    const answer = await designer.post('/api/analyze').send(HARD).expect(422);
    expect(answer.body.code).toBe('not-solvable');
    expect(answer.body.error).toMatch(/the fields that make it hard: \/pairEmitterResistanceOhm, \/collectorResistanceOhm, \/tail\/referenceResistanceOhm/);
    expect(answer.body.details.map((d: { path: string }) => d.path)).toEqual(['/pairEmitterResistanceOhm', '/collectorResistanceOhm', '/tail/referenceResistanceOhm']);
  });

  test('a body with a UTF-8 byte-order mark in front gets the same answer as without', async () => {
    const plain = await designer.post('/api/analyze').send(DESIGN).expect(200);
    const marked = await designer
      .post('/api/analyze')
      .set('Content-Type', 'application/json')
      .send(`\uFEFF${JSON.stringify(DESIGN)}`); // a string goes out as it is (UTF-8: EF BB BF first)
    expect(marked.status, JSON.stringify(marked.body)).toBe(200);
    expect(marked.body).toEqual(plain.body);
  });
});
