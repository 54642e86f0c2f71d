/**
 * A spec that lists the PTAT (constant-gm) tail, through the HTTP routes: saved only with its PNP,
 * ranked with the PTAT option sized (area ratio N, RE4, start-up RSU) and its sizing step worded,
 * exported with the area ratios as plain numbers (ranking CSV, SPICE netlist), and own values that
 * change the ratios checked against the design schema's bounds. The spec is the demo's invented
 * seismic node: a gain held to ±2 % from −40 to 85 °C.
 */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { OptionEvaluation } from '#shared/api/proposals';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

const SPEC = JSON.parse(readFileSync(new URL('../../api/demo/specs/seismic-node-receiver.json', import.meta.url), 'utf8')) as Record<string, unknown> & { device: Record<string, unknown>; temperatureC: { min: number; max: number } };
const { pnp: _pnp, ...NPN_ONLY } = SPEC.device;

let api: TestApi;
let author: ApiClient;
let designer: ApiClient;
let projectId: number;
let proposalId: number;
let ptat: OptionEvaluation;
let mirror: OptionEvaluation;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
  projectId = (await api.createProject(['requirements', 'designer'])).id;
  author = await api.agentFor('requirements');
  designer = await api.agentFor('designer');
  const spec = await author.post(`/api/projects/${projectId}/specs`).send({ title: String(SPEC.title), payload: SPEC }).expect(201);
  const proposal = await designer.post(`/api/specs/${spec.body.id}/proposals`).expect(201);
  proposalId = proposal.body.id;
  ptat = (proposal.body.result.options as OptionEvaluation[]).find((o) => o.topology === 'ptat')!;
  mirror = (proposal.body.result.options as OptionEvaluation[]).find((o) => o.topology === 'simple-mirror')!;
}, 60_000);

afterAll(() => api.close());

describe('POST /api/projects/:id/specs with the PTAT tail', () => {
  test('when the spec lists ptat without device.pnp, then 400 names /payload/device/pnp and says what it needs', async () => {
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title: 'Harrier without its PNP', payload: { ...SPEC, device: NPN_ONLY } }).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toEqual(['/payload/device/pnp']);
    expect(response.body.details[0].message).toMatch(/^is required: the tail options include the PTAT \(constant-gm\) source, whose mirror is PNP/);
  });
});

describe('POST /api/specs/:id/proposals with the PTAT tail', () => {
  test('when ranked, then the PTAT option is sized: area ratio N, RE4 and RSU, the output ratio left at its default', () => {
    expect(ptat.design?.tail).toMatchObject({ topology: 'ptat', areaRatio: expect.any(Number), emitterResistanceOhm: expect.any(Number), startupResistanceOhm: expect.any(Number) });
    const tail = ptat.design!.tail as { areaRatio: number; outputAreaRatio?: number };
    expect(tail.areaRatio).toBeGreaterThan(1);
    expect(tail.outputAreaRatio).toBeUndefined();
    expect(ptat.design?.device.pnp).toEqual(SPEC.device.pnp);
  });

  test('when ranked, then the option carries the PTAT cell’s sizing step in words, with its N', () => {
    const tail = ptat.design!.tail as { areaRatio: number };
    const step = ptat.sizingNotes.find((note) => note.startsWith('PTAT (constant-gm) cell:'));
    expect(step).toBeDefined();
    expect(step).toContain(`Q4 at ${tail.areaRatio}× Q3's emitter area`);
    expect(step).toContain('VT·ln(N)');
  });

  test('when ranked, then the tail current rises as absolute temperature does: hot over cold is the ratio of their kelvins (within 5 %)', () => {
    // ENGINE-CONTRACT.md: the current is VT·ln(N)/R per branch, VT = kT/q, so I ∝ T (in kelvin)
    const { min, max } = SPEC.temperatureC;
    const at = (temperatureC: number) => ptat.corners!.find((c) => c.temperatureC === temperatureC && c.inputCommonModeV === ptat.corners![0].inputCommonModeV)!.tailCurrentA;
    const idealRatio = (max + 273.15) / (min + 273.15);
    expect(at(max) / at(min)).toBeGreaterThan(idealRatio * 0.95);
    expect(at(max) / at(min)).toBeLessThan(idealRatio * 1.05);
    // and the drift check judges it against that law, not against a flat current
    const drift = ptat.checks.find((c) => c.rule === 'tail-current-drift')!;
    expect(drift.passed).toBe(true);
    expect(drift.reason).toContain('PTAT law');
  });

  test('when ranked, then the PTAT option holds the gain over temperature where the flat-current mirrors do not', () => {
    const gainCheck = (option: OptionEvaluation) => option.checks.find((c) => c.rule === 'gain-over-conditions')!;
    expect(gainCheck(ptat).passed).toBe(true);
    expect(ptat.passes).toBe(true);
    expect(gainCheck(mirror).passed).toBe(false);
  });
});

describe('exports of a ranking with the PTAT tail', () => {
  test('GET ranking.csv lists the PTAT tail’s ratios as plain numbers beside its resistors in ohms', async () => {
    const response = await designer.get(`/api/proposals/${proposalId}/ranking.csv`).expect(200);
    const rows = Papa.parse<Record<string, string>>(response.text.trimEnd(), { header: true, newline: '\r\n' }).data;
    const tail = ptat.design!.tail as { emitterResistanceOhm: number; startupResistanceOhm: number; areaRatio: number };
    expect(rows.find((r) => r.topology === 'ptat')?.tail_values).toBe(
      `emitterResistanceOhm=${tail.emitterResistanceOhm} startupResistanceOhm=${tail.startupResistanceOhm} areaRatio=${tail.areaRatio} outputAreaRatio=1`,
    );
  });

  test('GET netlist.cir of the PTAT option has the PNP model and Q4 at its emitter area', async () => {
    const response = await designer.get(`/api/proposals/${proposalId}/netlist.cir?topology=ptat&drive=differential`).expect(200);
    const tail = ptat.design!.tail as { areaRatio: number };
    // SPICE: "QXXX nc nb ne <ns> mname <area>", the area a plain multiplier; a PNP takes a .model of type PNP
    expect(response.text).toMatch(/^\.model \S+ PNP \(/m);
    expect(response.text).toMatch(new RegExp(`^Q4 \\S+ \\S+ \\S+ \\S+ \\S+ area=${tail.areaRatio}$`, 'm'));
    expect(response.text).toMatch(/^Q7 .* QPNP$/m);
  });
});

describe('own values of the PTAT option', () => {
  test('POST /evaluation with another area ratio and an output ratio of 2: checked like any own values', async () => {
    const design = { ...ptat.design!, tail: { ...ptat.design!.tail, areaRatio: 12, outputAreaRatio: 2 } };
    const response = await designer.post(`/api/proposals/${proposalId}/evaluation`).send({ design }).expect(200);
    expect(response.body.design.tail).toMatchObject({ areaRatio: 12, outputAreaRatio: 2 });
    expect(response.body.figures.gainPredicted).toBeGreaterThan(0);
  });

  test.each([
    ['areaRatio', 1, '/design/tail/areaRatio'], // N = 1 leaves no ΔVBE: the schema asks for more than 1
    ['areaRatio', 150, '/design/tail/areaRatio'],
    ['outputAreaRatio', 0, '/design/tail/outputAreaRatio'],
  ])('POST /evaluation with %s %d: 400 at %s', async (field, value, path) => {
    const design = { ...ptat.design!, tail: { ...ptat.design!.tail, [field]: value } };
    const response = await designer.post(`/api/proposals/${proposalId}/evaluation`).send({ design }).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain(path);
  });

  test('POST /evaluation of the PTAT design without its PNP: 400 at /design/device/pnp', async () => {
    const { pnp: _dropped, ...device } = ptat.design!.device;
    const response = await designer.post(`/api/proposals/${proposalId}/evaluation`).send({ design: { ...ptat.design!, device } }).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toEqual(['/design/device/pnp']);
  });
});
