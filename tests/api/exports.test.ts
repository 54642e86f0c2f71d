/**
 * Exports of a proposal: the ranking as CSV (RFC 4180) and the whole record as JSON.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { parseNetlistElements } from '#shared/engine/netlist';
import { csvField } from '#shared/export/ranking-csv';
import { runSpice } from '../helpers/spice';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let designer: ApiClient;
let proposalId: number;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
  const project = await api.createProject(['requirements', 'designer']);
  const spec = await api.createSpec(project.id);
  proposalId = (await api.createProposal(spec.id)).id;
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
});
