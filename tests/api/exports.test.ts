/**
 * Exports of a proposal: the ranking as CSV (RFC 4180) and the whole record as JSON.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { parseNetlistElements } from '#shared/engine/netlist';
import { csvField } from '#shared/export/ranking-csv';
import { runSpice } from '../helpers/spice';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let designer: ApiClient;
let proposalId: number;
/** A proposal of a spec with noise, bias-current, slew-rate and offset targets. */
let targetsProposalId: number;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
  const project = await api.createProject(['requirements', 'designer']);
  const spec = await api.createSpec(project.id);
  proposalId = (await api.createProposal(spec.id)).id;
  const targets = { noise: { maxVPerRtHz: 1e-8, atFrequencyHz: 1000 }, inputBiasCurrentMaxA: 3e-6, loadCapacitanceF: 2e-11, slewRateMinVPerS: 5e6, offset: { maxV: 0.004 } };
  const targetSpec = await api.createSpec(project.id, { title: 'Quillon sensor head — quiet channel', payload: { ...specPayload(), title: 'Quillon sensor head — quiet channel', ...targets } });
  targetsProposalId = (await api.createProposal(targetSpec.id)).id;
  designer = await api.agentFor('designer');
});

afterAll(() => api.close());

/** A small RFC 4180 reader for the test (quoted fields, doubled quotes, CRLF). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i += 1) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') (field += '"'), (i += 1);
      else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') row.push(field), (field = '');
    else if (ch === '\r' && text[i + 1] === '\n') row.push(field), rows.push(row), (row = []), (field = ''), (i += 1);
    else field += ch;
  }
  return rows;
}

describe('GET /api/proposals/:id/ranking.csv', () => {
  test('when downloaded, then one row per option in rank order, every row as wide as the header, figures as the proposal has them', async () => {
    const csv = await designer.get(`/api/proposals/${proposalId}/ranking.csv`).expect(200).expect('content-type', /text\/csv/).expect('content-disposition', /attachment/);
    const proposal = (await designer.get(`/api/proposals/${proposalId}`).expect(200)).body;
    const [header, ...rows] = parseCsv(csv.text);
    expect(rows).toHaveLength(proposal.result.options.length);
    for (const row of rows) expect(row).toHaveLength(header.length);
    const column = (name: string) => header.indexOf(name);
    expect(rows.map((r) => r[column('topology')])).toEqual(proposal.result.options.map((o: { topology: string }) => o.topology));
    const first = proposal.result.options[0];
    // At the page's precision: three significant digits for a current, one decimal for dB.
    expect(Number(rows[0][column('tail_current_a')])).toBe(Number(first.predicted.tailCurrentA.toPrecision(3)));
    for (const row of rows) for (const name of header.filter((h) => h.endsWith('_db'))) expect(row[column(name)]).toMatch(/^(|-?\d+(\.\d)?)$/);
    expect(rows.filter((r) => r[column('recommended')] === 'true').map((r) => r[column('topology')])).toEqual(proposal.result.recommended ? [proposal.result.recommended] : []);
  });

  test('when the spec sets optional targets, then each option carries their worst-corner figures, the limits and its tail-current window', async () => {
    const csv = await designer.get(`/api/proposals/${targetsProposalId}/ranking.csv`).expect(200);
    const proposal = (await designer.get(`/api/proposals/${targetsProposalId}`).expect(200)).body;
    const [header, ...rows] = parseCsv(csv.text);
    const column = (name: string) => header.indexOf(name);
    const sig = (v: number) => Number(v.toPrecision(3));
    proposal.result.options.forEach((option: { figures: Record<string, number>; tailCurrentWindow: { lower: { currentA: number }; upper: { currentA: number }; setBy: string } }, i: number) => {
      const row = rows[i];
      expect(Number(row[column('noise_worst_v_per_rthz')])).toBe(sig(option.figures.noiseVPerRtHz));
      expect(Number(row[column('noise_limit_v_per_rthz')])).toBe(1e-8);
      expect(Number(row[column('noise_frequency_hz')])).toBe(1000);
      expect(Number(row[column('input_bias_current_worst_a')])).toBe(sig(option.figures.inputBiasCurrentWorstA));
      expect(Number(row[column('input_bias_current_limit_a')])).toBe(3e-6);
      expect(Number(row[column('slew_rate_worst_v_per_s')])).toBe(sig(option.figures.slewRateWorstVPerS));
      expect(Number(row[column('offset_at_sigmas_v')])).toBe(sig(option.figures.offsetAtSigmasV));
      expect(Number(row[column('offset_limit_v')])).toBe(0.004);
      // targets the spec leaves out stay empty
      for (const name of ['bandwidth_worst_hz', 'bandwidth_limit_hz', 'psrr_positive_worst_db', 'linear_input_range_worst_v', 'offset_drift_at_sigmas_v_per_c']) expect(row[column(name)]).toBe('');
      expect(Number(row[column('tail_current_window_low_a')])).toBe(sig(option.tailCurrentWindow.lower.currentA));
      expect(Number(row[column('tail_current_window_high_a')])).toBe(sig(option.tailCurrentWindow.upper.currentA));
      expect(row[column('tail_current_set_by')]).toBe(option.tailCurrentWindow.setBy);
    });
    // the first proposal's spec sets none of them: the columns are there, empty
    const plain = parseCsv((await designer.get(`/api/proposals/${proposalId}/ranking.csv`).expect(200)).text);
    expect(plain[0]).toEqual(header);
    for (const row of plain.slice(1)) for (const name of ['noise_worst_v_per_rthz', 'tail_current_window_low_a', 'tail_current_set_by']) expect(row[plain[0].indexOf(name)]).toBe('');
  });

  test.each([
    ['plain', 'plain'],
    ['a, b', '"a, b"'],
    ['say "hi"', '"say ""hi"""'],
    ['two\r\nlines', 'two  lines'],
    ['=HYPERLINK("http://x.test")', `"'=HYPERLINK(""http://x.test"")"`],
    ['-tail', "'-tail"],
    [-3.5, '-3.5'],
  ])('a field %j is written %j (RFC 4180, one line, never a formula)', (value, written) => {
    expect(csvField(value)).toBe(written);
  });
});

describe('GET /api/proposals/:id/netlist.cir', () => {
  test('when the recommended option is downloaded, then the netlist names its origin, holds the pair and runs in ngspice', async () => {
    const response = await designer.get(`/api/proposals/${proposalId}/netlist.cir`).expect(200).expect('content-disposition', /\.cir/);
    const text = response.text;
    expect(text).toContain(`* Exported by Longtail: proposal #${proposalId}`);
    expect(text).toMatch(/simulation and bench measurement/);
    const names = parseNetlistElements(text).map((e) => e.name);
    expect(names).toEqual(expect.arrayContaining(['Q1', 'Q2', 'RC1', 'RC2', 'VIN1', 'VIN2']));
    const result = await runSpice(text, 'AC Analysis');
    expect(result.numPoints).toBeGreaterThan(100);
  });

  test('when a decision is asked for before any decision, then 400 names ?source', async () => {
    const response = await designer.get(`/api/proposals/${proposalId}/netlist.cir?source=decision`).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain('?source');
  });

  test('when the drive is not known, then 400 names ?drive', async () => {
    const response = await designer.get(`/api/proposals/${proposalId}/netlist.cir?drive=sideways`).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain('?drive');
  });
});

describe('GET /api/proposals/:id/export.json', () => {
  test('when downloaded, then it holds the proposal with its spec snapshot, versions, the audit trail and the estimates notice', async () => {
    const response = await designer.get(`/api/proposals/${proposalId}/export.json`).expect(200).expect('content-disposition', /attachment/);
    expect(response.body.proposal.id).toBe(proposalId);
    expect(response.body.proposal.specVersion.payload.supply).toBeDefined();
    expect(response.body.proposal.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(response.body.proposal.rulesetVersion).toMatch(/^[0-9a-f]{64}$/);
    expect(response.body.audit.map((e: { action: string }) => e.action)).toContain('proposal.ranked');
    expect(response.body.notice).toMatch(/simulation and bench measurement/);
  });

  test('when the spec sets optional targets, then every option carries their facts and its tail-current window', async () => {
    const response = await designer.get(`/api/proposals/${targetsProposalId}/export.json`).expect(200);
    for (const option of response.body.proposal.result.options) {
      expect(option.figures).toMatchObject({ noiseTargetSet: true, noiseMaxVPerRtHz: 1e-8, inputBiasTargetSet: true, slewRateTargetSet: true, offsetTargetSet: true, bandwidthTargetSet: false });
      expect(option.figures.noiseVPerRtHz).toBeGreaterThan(0);
      expect(option.tailCurrentWindow.bounds.map((b: { requirement: string }) => b.requirement)).toEqual(expect.arrayContaining(['noise', 'slew-rate', 'input-bias-current', 'power-budget']));
      // the option runs at the window's current (within the sizing's 2 % and the series' snapping)
      expect(Math.abs(option.predicted.tailCurrentA / option.tailCurrentWindow.currentA - 1)).toBeLessThan(0.05);
    }
  });
});
