/**
 * Load: the real server (api/server.ts, a child process, so the load generator does not share
 * its thread) on a fresh database with the demo organisation, then autocannon with 64
 * connections for a bounded time on each main route, as signed-in demo accounts:
 * - reads: the project's proposal list, one proposal (with its engine output), one spec;
 * - writes: a new spec version (PUT /api/specs/:id) and a proposal on a spec version already
 *   ranked (POST /api/specs/:id/proposals: the ranking is reused, the write is real);
 * requests, errors (connection errors, timeouts and non-2xx answers: must be 0), p50/p95/p99 from
 * every response. Then a soak: a mix of those routes at 16 connections for a few minutes, the
 * server's resident memory sampled after a warm-up and at the end (growth reported).
 */
import autocannon from 'autocannon';
import { join } from 'node:path';
import { specPayload } from '../helpers/api-app';
import { demoEmail, DEMO_PASSWORD, freePort, HttpClient, mb, percentile, residentBytes, row, sleep, spawnServer, stopServer, tempDir, waitHealthy, type PartResult, type RunOptions } from './lib';

const PART = 'Load';
const CONNECTIONS = 64;
const SOAK_CONNECTIONS = 16;

interface Measured {
  completed: number;
  failed: number;
  p50: number;
  p95: number;
  p99: number;
  perS: number;
}

async function measure(opts: autocannon.Options): Promise<Measured> {
  const latencies: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(opts, (error, done) => (error ? reject(error) : resolve(done)));
    instance.on('response', (_client, _status, _bytes, ms) => latencies.push(ms));
  });
  latencies.sort((a, b) => a - b);
  const elapsedS = (new Date(result.finish).getTime() - new Date(result.start).getTime()) / 1000;
  return {
    completed: latencies.length,
    failed: result.errors + result.timeouts + result.non2xx,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    p99: percentile(latencies, 99),
    perS: latencies.length / elapsedS,
  };
}

export async function loadPart(options: RunOptions): Promise<PartResult> {
  const { log, quick } = options;
  const durationS = quick ? 5 : 8;
  const temp = tempDir('longtail-reliability-load-');
  const port = await freePort();
  const server = spawnServer({ databasePath: join(temp.dir, 'longtail.sqlite'), port, seed: true });
  try {
    await waitHealthy(server, 240_000);
    const base = server.baseUrl;
    const designer = new HttpClient(base);
    await designer.signIn(demoEmail('designer'), DEMO_PASSWORD);
    const author = new HttpClient(base);
    await author.signIn(demoEmail('requirements'), DEMO_PASSWORD);

    // A spec of our own (ranked once, so later proposals of this version reuse the ranking) and one to revise
    const projectId = ((await designer.request('GET', '/api/projects')).json as { items: { id: number }[] }).items[0].id;
    const created = await author.request('POST', `/api/projects/${projectId}/specs`, { title: 'Load run — thermopile pair', payload: specPayload() });
    const specId = (created.json as { id: number }).id;
    const ranked = await designer.request('POST', `/api/specs/${specId}/proposals`);
    const proposalId = (ranked.json as { id: number }).id;
    const revisedSpec = (await author.request('POST', `/api/projects/${projectId}/specs`, { title: 'Load run — revised again and again', payload: specPayload() })).json as { id: number };
    if (created.status !== 201 || ranked.status !== 201) throw new Error(`setting up: ${created.status} ${ranked.status}`);

    const json = { 'content-type': 'application/json' };
    const routes: { name: string; kind: 'read' | 'write'; opts: autocannon.Options }[] = [
      { name: 'GET /api/projects/:id/proposals', kind: 'read', opts: { url: `${base}/api/projects/${projectId}/proposals?page=1&pageSize=20`, headers: designer.headers() } },
      { name: 'GET /api/proposals/:id', kind: 'read', opts: { url: `${base}/api/proposals/${proposalId}`, headers: designer.headers() } },
      { name: 'GET /api/specs/:id', kind: 'read', opts: { url: `${base}/api/specs/${specId}`, headers: designer.headers() } },
      {
        name: 'PUT /api/specs/:id (new version)',
        kind: 'write',
        opts: { url: `${base}/api/specs/${revisedSpec.id}`, method: 'PUT', headers: { ...author.headers(), ...json }, body: JSON.stringify({ title: 'Load run — revised again and again', payload: specPayload() }) },
      },
      { name: 'POST /api/specs/:id/proposals (ranking reused)', kind: 'write', opts: { url: `${base}/api/specs/${specId}/proposals`, method: 'POST', headers: designer.headers() } },
    ];

    const results: { name: string; m: Measured }[] = [];
    for (const route of routes) {
      // A short warm-up, so the JIT has settled, then the measured run
      await measure({ ...route.opts, connections: 4, amount: 40 });
      const m = await measure({ ...route.opts, connections: CONNECTIONS, duration: durationS });
      results.push({ name: route.name, m });
      log(`${route.name.padEnd(48)} ${String(m.completed).padStart(6)} req  ${m.perS.toFixed(0).padStart(5)}/s  p50 ${m.p50.toFixed(0)} ms  p95 ${m.p95.toFixed(0)} ms  p99 ${m.p99.toFixed(0)} ms  errors ${m.failed}`);
    }

    // Soak: every route in turn on each connection, for a bounded time
    const soakS = Math.max(20, Math.min(quick ? 30 : 90, Math.floor((options.deadline - performance.now()) / 1000) - 15));
    const mix: autocannon.Request[] = [
      { method: 'GET', path: `/api/projects/${projectId}/proposals?page=1&pageSize=20`, headers: designer.headers() },
      { method: 'GET', path: `/api/proposals/${proposalId}`, headers: designer.headers() },
      { method: 'GET', path: `/api/specs/${specId}`, headers: designer.headers() },
      { method: 'POST', path: `/api/specs/${specId}/proposals`, headers: designer.headers() },
      { method: 'PUT', path: `/api/specs/${revisedSpec.id}`, headers: { ...author.headers(), ...json }, body: JSON.stringify({ title: 'Load run — revised again and again', payload: specPayload() }) },
    ];
    await measure({ url: base, requests: mix, connections: SOAK_CONNECTIONS, duration: 5 });
    await sleep(500);
    const pid = server.child.pid!;
    const rssStart = await residentBytes(pid);
    const soak = await measure({ url: base, requests: mix, connections: SOAK_CONNECTIONS, duration: soakS });
    await sleep(500);
    const rssEnd = await residentBytes(pid);
    const growth = rssEnd - rssStart;
    log(`soak ${soakS} s at ${SOAK_CONNECTIONS} connections: ${soak.completed} req, errors ${soak.failed}, p95 ${soak.p95.toFixed(0)} ms; resident memory ${mb(rssStart)} → ${mb(rssEnd)}`);

    const total = results.reduce((s, r) => s + r.m.completed, 0);
    const failed = results.reduce((s, r) => s + r.m.failed, 0);
    const rows = [
      row(PART, `requests (${CONNECTIONS} conn., ${durationS} s × ${routes.length} routes)`, total, '> 0', total > 0),
      row(PART, 'errors (conn./timeouts/non-2xx)', failed, '0', failed === 0),
      ...results.map((r) => row(PART, `${r.name} p50/p95/p99`, `${r.m.p50.toFixed(0)}/${r.m.p95.toFixed(0)}/${r.m.p99.toFixed(0)} ms`, 'reported', null)),
      row(PART, `soak requests (${soakS} s, ${SOAK_CONNECTIONS} conn.)`, soak.completed, '> 0', soak.completed > 0),
      row(PART, 'soak errors', soak.failed, '0', soak.failed === 0),
      row(PART, 'soak resident memory growth', `${growth >= 0 ? '+' : ''}${mb(growth)} (${((growth / rssStart) * 100).toFixed(0)} %)`, 'reported', null),
    ];
    return { rows };
  } finally {
    await stopServer(server, 'SIGTERM');
    temp.remove();
  }
}
