/**
 * Answers travel gzip-compressed when the browser accepts it (RFC 9110 content coding, as every
 * browser asks with Accept-Encoding): the app's scripts and the stored rankings, which are tens of
 * kB; small answers and clients that do not ask stay plain.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createApp, type LongtailApp } from '../../api/app';
import { openDatabase } from '../../api/data-source';
import { loadRuleSet } from '../../rules/index';
import { buildApiApp, type TestApi } from '../helpers/api-app';

// The client (superagent) unpacks a gzip body itself: a body equal to the original under a
// `Content-Encoding: gzip` header shows the bytes were valid gzip of it.

describe('the built app served with compression', () => {
  const dir = mkdtempSync(join(tmpdir(), 'longtail-static-'));
  const script = `export const table = ${JSON.stringify(Array.from({ length: 400 }, (_, i) => ({ row: i, note: 'tail current source' })))};\n`;
  let app: LongtailApp;
  let close: () => Promise<void>;

  beforeAll(async () => {
    writeFileSync(join(dir, 'index.html'), '<!doctype html><title>Longtail</title><script type="module" src="/app.js"></script>');
    writeFileSync(join(dir, 'app.js'), script);
    const dataSource = await openDatabase(':memory:');
    app = createApp({ dataSource, sessionSecret: 'x'.repeat(40), ruleSet: await loadRuleSet(), staticDir: dir, log: () => {} });
    close = async () => {
      app.closeApp();
      await app.verification.close();
      await dataSource.destroy();
    };
  });
  afterAll(async () => {
    await close();
    rmSync(dir, { recursive: true, force: true });
  });

  test('when the browser accepts gzip, then a script comes gzip-encoded and unpacks to the file', async () => {
    const response = await request(app).get('/app.js').set('Accept-Encoding', 'gzip').expect(200);
    expect(response.headers['content-encoding']).toBe('gzip');
    expect(response.text).toBe(script);
  });

  test('when the client does not ask for it, then the script comes plain', async () => {
    const response = await request(app).get('/app.js').set('Accept-Encoding', 'identity').expect(200);
    expect(response.headers['content-encoding']).toBeUndefined();
    expect(response.headers['content-length']).toBe(String(Buffer.byteLength(script)));
    expect(response.text).toBe(script);
  });
});

describe('API answers with compression', () => {
  let api: TestApi;
  let proposalId: number;
  beforeAll(async () => {
    api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer'] });
    const project = await api.createProject(['requirements', 'designer']);
    const spec = await api.createSpec(project.id);
    proposalId = (await api.createProposal(spec.id)).id;
  });
  afterAll(() => api.close());

  test('when a stored ranking is read with gzip accepted, then it is compressed and unpacks to the same JSON', async () => {
    const designer = await api.agentFor('designer');
    const plain = await designer.get(`/api/proposals/${proposalId}`).set('Accept-Encoding', 'identity').expect(200);
    const packed = await designer.get(`/api/proposals/${proposalId}`).set('Accept-Encoding', 'gzip').expect(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(packed.headers['content-encoding']).toBe('gzip');
    expect(packed.body).toEqual(plain.body);
  });

  test('when an answer is small, then it stays plain', async () => {
    const response = await request(api.app).get('/api/auth/csrf').set('Accept-Encoding', 'gzip').expect(200);
    expect(response.headers['content-encoding']).toBeUndefined();
  });
});
