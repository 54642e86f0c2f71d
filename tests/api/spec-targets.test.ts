/**
 * The spec's optional targets and corners over HTTP: accepted and stored in the version as sent
 * (the offset's 3 sigmas filled in), refused with the field named under /payload, compared
 * between versions field by field, carried through a CSV row back into an import unchanged, and
 * ranked by the engine (which may not check them yet, but must not refuse a spec that has them).
 * Values are invented, in SI units.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { cellText, SPEC_CSV_COLUMNS } from '#shared/import/spec-columns';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let requirements: ApiClient;
let designer: ApiClient;
let projectId: number;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
  projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Sallow gauge')).id;
  requirements = await api.agentFor('requirements');
  designer = await api.agentFor('designer');
});

afterAll(() => api.close());

const TITLE = 'Sallow gauge — strain input pair';

/** Every optional target and corner, each away from its default. */
const TARGETS = {
  noise: { maxVPerRtHz: 8e-9, atFrequencyHz: 1000 },
  inputBiasCurrentMaxA: 3e-6,
  offset: { maxV: 0.004, driftMaxVPerC: 2e-5 },
  slewRateMinVPerS: 2e5,
  bandwidthMinHz: 20000,
  psrrMinDb: { positive: 40 },
  linearInputRangeMinV: 0.005,
  loadCapacitanceF: 20e-12,
  sourceResistanceOhm: 350,
  supplyTolerance: { positivePercent: 3, negativePercent: 10 },
  betaRange: { min: 90, max: 400 },
  resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 25 },
};

const withTargets = () => ({ ...specPayload(), title: TITLE, ...TARGETS });

describe('a spec with every optional target and corner', () => {
  let specId: number;

  beforeAll(async () => {
    specId = (await requirements.post(`/api/projects/${projectId}/specs`).send({ title: TITLE, payload: withTargets() }).expect(201)).body.id;
  });

  test('when it is saved, then its version stores each as sent, with 3 sigmas for the offset', async () => {
    const stored = (await requirements.get(`/api/specs/${specId}`).expect(200)).body.latest.payload;
    expect(stored).toMatchObject({ ...TARGETS, offset: { ...TARGETS.offset, sigmas: 3 } });
  });

  test('when a new version changes a target and adds another, then the diff names exactly those fields', async () => {
    const next = { ...withTargets(), noise: { maxVPerRtHz: 6e-9, atFrequencyHz: 1000 }, psrrMinDb: { positive: 40, negative: 35 } };
    await requirements.put(`/api/specs/${specId}`).send({ title: TITLE, payload: next, note: 'Quieter input; the negative rail is now checked.' }).expect(200);

    const diff = (await requirements.get(`/api/specs/${specId}/diff?from=1&to=2`).expect(200)).body;

    expect(diff.changes).toEqual([
      { path: '/noise/maxVPerRtHz', kind: 'changed', before: 8e-9, after: 6e-9 },
      { path: '/psrrMinDb/negative', kind: 'added', after: 35 },
    ]);
  });

  test('when its stored version is written as a CSV row and imported, then the import finds it unchanged', async () => {
    const stored = (await requirements.get(`/api/specs/${specId}`).expect(200)).body.latest.payload as Record<string, unknown>;
    const valueAt = (path: readonly string[]) => path.reduce<unknown>((node, key) => (node as Record<string, unknown> | undefined)?.[key], stored);
    const quote = (text: string) => (/[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text);
    const csv = `${SPEC_CSV_COLUMNS.map((c) => c.name).join(',')}\r\n${SPEC_CSV_COLUMNS.map((c) => quote(cellText(valueAt(c.path)))).join(',')}\r\n`;

    const report = (await requirements.post(`/api/projects/${projectId}/specs/import`).attach('file', Buffer.from(csv, 'utf8'), 'targets.csv').expect(200)).body;

    expect(report.rows).toHaveLength(1);
    expect(report.rows[0]).toMatchObject({ ok: true, errors: [], action: 'unchanged', specId, version: 2 });
  });

  test('when it is ranked, then the engine accepts it and answers every option', async () => {
    const proposal = (await designer.post(`/api/specs/${specId}/proposals`).expect(201)).body;
    expect(proposal.result.options.length).toBeGreaterThan(0);
  });
});

describe('a spec with a half-stated target', () => {
  test.each([
    ['an offset target with only its sigmas', { offset: { sigmas: 4 } }, '/payload/offset/maxV', 'is required unless the largest offset drift is given (leave the input offset out to check neither)'],
    ['a noise limit without its frequency', { noise: { maxVPerRtHz: 8e-9 } }, '/payload/noise/atFrequencyHz', 'is required with the largest noise density (leave the input noise out to check no noise)'],
    ['a slew rate of zero', { slewRateMinVPerS: 0 }, '/payload/slewRateMinVPerS', 'must be > 0 V/s, got 0 V/s'],
    ['a current-gain spread above the nominal', { betaRange: { min: 200 } }, '/payload/betaRange/min', 'must be at most the current gain (beta) (180), got 200'],
  ])('when %s is sent, then 400 names the field and nothing is saved', async (_name, patch, path, message) => {
    const before = (await requirements.get(`/api/projects/${projectId}/specs`).expect(200)).body.items.length;

    const response = await requirements.post(`/api/projects/${projectId}/specs`).send({ title: 'Sallow gauge — spare', payload: { ...specPayload(), title: 'Sallow gauge — spare', ...patch } }).expect(400);

    expect(response.body.details).toEqual([{ path, message }]);
    expect((await requirements.get(`/api/projects/${projectId}/specs`).expect(200)).body.items).toHaveLength(before);
  });
});
