/**
 * User text never becomes a line of an exported netlist: hostile spec titles and device-model
 * names are refused at the API (400 naming the field), and rows stored before that check (written
 * here straight into the database) still export netlists whose every non-comment line is the
 * writer's own, which ngspice runs as the plain circuit: no `.control`, `shell`, `.include` or
 * `.lib` line, nothing outside comments.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { SpecVersionEntity } from '../../api/entities/spec-version.entity';
import { SpecEntity } from '../../api/entities/spec.entity';
import { spiceNetlist } from '#shared/engine/netlist';
import type { Design } from '#shared/engine/types';
import { runSpice } from '../helpers/spice';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

/** Titles from the attack review, and each other line break a reader may honour. */
const HOSTILE_TITLES: [label: string, title: string][] = [
  ['LF and a .control block', 'Kestrel rev C\n.control\nshell id > somefile\n.endc\n*'],
  ['CR alone', 'Kestrel rev C\r.include /etc/passwd\r*'],
  ['CRLF', 'Kestrel rev C\r\n.lib evil.lib tt\r\n*'],
  ['vertical tab', 'Kestrel\u000b.control\u000bshell id\u000b.endc'],
  ['form feed', 'Kestrel\u000c.control\u000cshell id\u000c.endc'],
  ['next line (NEL)', 'Kestrel\u0085.control\u0085shell id\u0085.endc'],
  ['line separator', 'Kestrel\u2028.control\u2028shell id\u2028.endc'],
  ['paragraph separator', 'Kestrel\u2029.include x.lib'],
  ['a *# command line', 'Kestrel\n#shell id\n*#shell id'],
  ['bidi override', 'Kestrel \u202e.endc\u202c'],
];

/** Device-model names (64 characters at most in the schema) that try the same. */
const HOSTILE_DEVICE_NAMES: [label: string, name: string][] = [
  ['LF and a .control block', 'QX\n.control\nshell id > somefile\n.endc'],
  ['CR and .lib', 'QX\r.lib /tmp/evil.lib tt'],
  ['line separator and .include', 'QX\u2028.include /etc/passwd'],
];

/** Lines that must never appear, whatever their case or indentation. */
const FORBIDDEN_CARD = /^\s*(\.control|\.endc|shell|\.include|\.inc|\.lib|\*#)/i;

let api: TestApi;
let designer: ApiClient;
let author: ApiClient;
let projectId: number;
let proposalId: number;
let specVersionId: number;
let specId: number;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
  projectId = (await api.createProject(['requirements', 'designer'])).id;
  const spec = await api.createSpec(projectId);
  specId = spec.id;
  proposalId = (await api.createProposal(spec.id)).id;
  const version = await api.dataSource.getRepository(SpecVersionEntity).findOneByOrFail({ specId: spec.id, version: 1 });
  specVersionId = version.id;
  designer = await api.agentFor('designer');
  author = await api.agentFor('requirements');
  await designer.post(`/api/proposals/${proposalId}/decision`).send({ kind: 'accept' }).expect(201);
});

afterAll(() => api.close());

/** Writes a stored row as an older server (before the API check) could have stored it. */
async function storeRaw(title: string, deviceName?: string) {
  const repository = api.dataSource.getRepository(SpecVersionEntity);
  const version = await repository.findOneByOrFail({ id: specVersionId });
  const payload = { ...version.payload, title, ...(deviceName === undefined ? {} : { deviceModel: { name: deviceName, checksum: 'ab'.repeat(32) } }) };
  await repository.update({ id: specVersionId }, { title, payload });
  await api.dataSource.getRepository(SpecEntity).update({ id: specId }, { title });
}

/** The lines that are not comments (the title line is the writer's own). */
function nonCommentLines(text: string): string[] {
  return text.split('\n').filter((line) => line.trim() !== '' && !line.startsWith('* '));
}

/** Checks one exported netlist against the writer's own lines for the same design, then runs it. */
async function expectHarmless(text: string) {
  for (const line of text.split(/\r\n|[\n\r\u000b\u000c\u0085\u2028\u2029]/)) expect(line, `line ${JSON.stringify(line)}`).not.toMatch(FORBIDDEN_CARD);
  expect(text).not.toMatch(/[\r\u000b\u000c\u0085\u2028\u2029\u202a-\u202e\u2066-\u2069]/);
  const proposal = (await designer.get(`/api/proposals/${proposalId}`).expect(200)).body;
  const design = proposal.result.options.find((o: { topology: string }) => o.topology === proposal.result.recommended).design as Design;
  const own = spiceNetlist(design, { analysis: 'ac-differential', startHz: 1, stopHz: 1e9, pointsPerDecade: 20 });
  expect(nonCommentLines(text)).toEqual(nonCommentLines(own));
  const result = await runSpice(text, 'AC Analysis');
  expect(result.numPoints).toBeGreaterThan(100);
}

describe('exported netlists of stored rows with hostile text', () => {
  test.each(HOSTILE_TITLES)('when the stored spec title holds %s, then the option and decision netlists keep it on comment lines and run as the plain circuit', async (_label, title) => {
    await storeRaw(title);
    for (const query of ['', '?source=decision']) {
      const response = await designer.get(`/api/proposals/${proposalId}/netlist.cir${query}`).expect(200);
      expect(response.text).toMatch(/^\* spec "Kestrel/m);
      await expectHarmless(response.text);
    }
  });

  test.each(HOSTILE_DEVICE_NAMES)('when the stored device-model name holds %s, then the netlist keeps it on a comment line', async (_label, deviceName) => {
    await storeRaw('Kestrel rev C', deviceName);
    for (const query of ['', '?source=decision']) {
      const response = await designer.get(`/api/proposals/${proposalId}/netlist.cir${query}`).expect(200);
      expect(response.text).toMatch(/^\* The spec names library card QX/m);
      await expectHarmless(response.text);
    }
  });
});

describe('the API refuses control characters and bidi overrides in text', () => {
  test.each(HOSTILE_TITLES)('when a spec title holds %s, then 400 names /title', async (_label, title) => {
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title, payload: specPayload() }).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain('/title');
    const detail = response.body.details.find((d: { path: string }) => d.path === '/title');
    expect(detail.message).toMatch(/must not contain U\+[0-9A-F]{4}/);
  });

  test.each(HOSTILE_DEVICE_NAMES)('when a device-model name holds %s, then 400 names /payload/deviceModel/name', async (_label, name) => {
    const payload = { ...specPayload(), deviceModel: { name, checksum: 'ab'.repeat(32) } };
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title: 'Kestrel rev C', payload }).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toEqual(['/payload/deviceModel/name']);
  });

  test('when a spec title is plain text with accents and symbols, then it is stored as written', async () => {
    const title = 'Kestrel rev C — Ω-Brücke, 2 µA "fast" <b>';
    const response = await author.post(`/api/projects/${projectId}/specs`).send({ title, payload: specPayload() }).expect(201);
    expect(response.body.title).toBe(title);
  });
});

describe('other text fields refuse control characters and bidi overrides, naming the field', () => {
  test.each([
    ['a project name with a line break', 'admin', '/api/projects', { name: 'Kestrel\n.control' }, '/name'],
    ['a project description with a right-to-left override', 'admin', '/api/projects', { name: 'Kestrel', description: 'see \u202egnp.exe' }, '/description'],
    ['a project description with CR line ends', 'admin', '/api/projects', { name: 'Kestrel', description: 'one\r\ntwo' }, '/description'],
    ['a display name with a tab', 'admin', '/api/users', { email: 'tab.person@tests.longtail.test', displayName: 'Tab\tPerson', role: 'designer', password: 'tern-lantern-0417-quay' }, '/displayName'],
    ['an e-mail address with NEL', 'admin', '/api/users', { email: 'nel\u0085person@tests.longtail.test', displayName: 'Nel Person', role: 'designer', password: 'tern-lantern-0417-quay' }, '/email'],
  ] as const)('when %s is sent, then 400 names it', async (_label, who, url, body, path) => {
    const client = await api.agentFor(who);
    const response = await client.post(url).send(body).expect(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain(path);
  });

  test('when a project description keeps LF line breaks, then it is stored as written', async () => {
    const client = await api.agentFor('admin');
    const response = await client.post('/api/projects').send({ name: 'Kestrel bench', description: 'first line\nsecond line' }).expect(201);
    expect(response.body.description).toBe('first line\nsecond line');
  });

  test('when a decision reason or a review comment holds a bidi override or a form feed, then 400 names it; LF is kept', async () => {
    const spec = await api.createSpec(projectId, { payload: { ...specPayload(), title: 'Kestrel rev D' } });
    const proposal = await api.createProposal(spec.id);
    const choose = proposal.result.options.find((o) => o.topology !== proposal.result.recommended)!.topology;
    const refused = await designer.post(`/api/proposals/${proposal.id}/decision`).send({ kind: 'choose', topology: choose, reason: 'simpler\u202e to build' }).expect(400);
    expect(refused.body.details.map((d: { path: string }) => d.path)).toEqual(['/reason']);
    const decided = await designer.post(`/api/proposals/${proposal.id}/decision`).send({ kind: 'choose', topology: choose, reason: 'simpler to build\nfewer parts' }).expect(201);
    expect(decided.body.decisions.at(-1).reason).toBe('simpler to build\nfewer parts');
  });

  test('when a stored spec title would be a formula with a line break, then the batch CSV keeps it on one line with a leading apostrophe', async () => {
    await storeRaw('=HYPERLINK("http://x.test")\r\n=cmd|\' /C calc\'!A0');
    const response = await designer.get(`/api/projects/${projectId}/proposals.csv?ids=${proposalId}`).expect(200);
    const lines = response.text.split('\r\n');
    expect(lines).toHaveLength(3); // header, the row, and the empty string after the last CRLF
    expect(response.text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    expect(lines[1].startsWith(`"'=HYPERLINK`)).toBe(true);
  });
});
