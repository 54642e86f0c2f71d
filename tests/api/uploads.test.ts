/**
 * Every upload route answers the same way (api/uploads.ts): a file over the route's limit is
 * 413 `file-too-large` on `/file`; a file in another form field, or two files, is 400 on that
 * field; a body that is not readable multipart is 400; no file at all is 400 on `/file`; a file
 * that is not text (a NUL byte: binary, or UTF-16) is 400 on `/file` from the one text check
 * (shared/text/upload-text.ts). Nothing is stored by a refused upload.
 *
 * The limits are the ones each route documents: 256 KiB for a library file of .model cards and
 * for a bench measurement CSV, 1 MiB for a spec import file (1 KB = 1024 bytes, as the answers
 * print them). The files are invented (Fernhollow Instruments).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { decide } from '../../api/services/proposals.service';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';
import { countRows } from '../helpers/api-validation-helpers';

let api: TestApi;
let uploadsDir: string;
let projectId: number;
let decidedId: number;
let deviceId: number;
let designer: ApiClient;
let requirements: ApiClient;

const CARD = '.model FH-U1 NPN (IS=5f BF=200 VAF=70)\n';

interface UploadRoute {
  name: string;
  method: 'post' | 'put';
  url: () => string;
  client: () => ApiClient;
  /** The route's documented limit, bytes, and as its answers print it. */
  maxBytes: number;
  limitText: string;
  /** What the route's reader says about a file with a NUL byte. */
  notText: RegExp;
}

const ROUTES: UploadRoute[] = [
  { name: 'POST a library file', method: 'post', url: () => `/api/projects/${projectId}/devices`, client: () => designer, maxBytes: 256 * 1024, limitText: '256 KB', notText: /NUL bytes/ },
  { name: 'PUT a library card', method: 'put', url: () => `/api/projects/${projectId}/devices/${deviceId}`, client: () => designer, maxBytes: 256 * 1024, limitText: '256 KB', notText: /NUL bytes/ },
  { name: 'POST a bench measurement', method: 'post', url: () => `/api/proposals/${decidedId}/measurements`, client: () => designer, maxBytes: 256 * 1024, limitText: '256 KB', notText: /NUL bytes/ },
  { name: 'POST a spec import', method: 'post', url: () => `/api/projects/${projectId}/specs/import?dryRun=false`, client: () => requirements, maxBytes: 1024 * 1024, limitText: '1 MB', notText: /is not a text file/ },
];

const send = (route: UploadRoute) => route.client()[route.method](route.url());

beforeAll(async () => {
  uploadsDir = mkdtempSync(join(tmpdir(), 'longtail-uploads-test-'));
  api = await buildApiApp({ uploadsDir, accounts: ['admin', 'requirements', 'designer', 'reviewer'] });
  projectId = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Quillon sensor head')).id;
  const spec = await api.createSpec(projectId);
  const decided = await api.createProposal(spec.id);
  await decide(api.dataSource, api.users.designer, decided.id, { kind: 'accept' }, api.ruleSet);
  decidedId = decided.id;
  [designer, requirements] = await Promise.all([api.agentFor('designer'), api.agentFor('requirements')]);
  const uploaded = await designer.post(`/api/projects/${projectId}/devices`).attach('file', Buffer.from(CARD), 'fh-u1.lib');
  expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
  deviceId = uploaded.body.items[0].id;
});

afterAll(async () => {
  await api?.close();
  rmSync(uploadsDir, { recursive: true, force: true });
});

describe.each(ROUTES)('$name: the one answer to each refused upload', (route) => {
  test('when the file is one byte over the limit, then 413 file-too-large on /file naming the limit, and nothing stored', async () => {
    const before = await countRows(api.dataSource);
    const response = await send(route).attach('file', Buffer.alloc(route.maxBytes + 1, 'a'), 'big.txt');
    expect(response.status).toBe(413);
    expect(response.body.code).toBe('file-too-large');
    expect(response.body.error).toMatch(new RegExp(`^The file is larger than ${route.limitText}; `));
    expect(response.body.details).toEqual([{ path: '/file', message: `is over ${route.limitText}` }]);
    expect(await countRows(api.dataSource)).toEqual(before);
  });

  test('when the file comes in another form field, then 400 on that field, asking for the field "file"', async () => {
    const response = await send(route).attach('upload', Buffer.from(CARD), 'fh-u1.lib');
    expect(response.status).toBe(400);
    expect(response.body.error).toBe('The upload has the wrong form fields.');
    expect(response.body.details).toEqual([{ path: '/upload', message: 'send one file, in the form field "file"' }]);
  });

  test('when two files come in the field "file", then 400 on /file', async () => {
    const response = await send(route).attach('file', Buffer.from(CARD), 'a.lib').attach('file', Buffer.from(CARD), 'b.lib');
    expect(response.status).toBe(400);
    expect(response.body.details).toEqual([{ path: '/file', message: 'send one file, in the form field "file"' }]);
  });

  test('when no file is attached, then 400 on /file asking for one', async () => {
    const response = await send(route).type('form').send('x=1');
    expect(response.status).toBe(400);
    expect(response.body.error).toBe('No file was uploaded.');
    expect(response.body.details).toEqual([{ path: '/file', message: expect.stringMatching(/^attach .+ in the form field "file" \(multipart\/form-data\)$/) }]);
  });

  test('when the body is not readable multipart, then 400 saying so', async () => {
    const response = await send(route).set('Content-Type', 'multipart/form-data; boundary=fernhollow').send('--fernhollow\r\nContent-Disposition: form-data; name="file"; filename="a.lib"\r\n\r\nno closing boundary');
    expect(response.status).toBe(400);
    expect(response.body.error).toBe('The upload could not be read.');
    expect(response.body.details).toEqual([{ path: '', message: 'is not a readable multipart/form-data upload' }]);
  });

  test('when the file is not text (UTF-16, so NUL bytes), then 400 on /file, and nothing stored', async () => {
    const before = await countRows(api.dataSource);
    const utf16 = Buffer.from(`\uFEFF${CARD}`, 'utf16le');
    const response = await send(route).attach('file', utf16, 'utf16.txt');
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.details[0].path).toBe('/file');
    expect(response.body.details[0].message).toMatch(route.notText);
    expect(await countRows(api.dataSource)).toEqual(before);
  });
});
