/**
 * `npm run bench` (after the engine bench): the API under load with autocannon, against the real
 * app on 127.0.0.1 with 10,000 stored proposals in the listed project (api-bench-server.ts,
 * forked so the load generator does not share the server's thread). A designer signs in through
 * the CSRF flow; then 32 connections for a bounded time on each route, printing exact
 * p50/p95/p99 latencies from every response and requests per second:
 * - POST /api/specs/:id/proposals where the engine runs (each request names a spec version never
 *   ranked), with one connection first (the time one request takes, nobody queued ahead);
 * - the same route on one spec version asked again and again (the server reuses its ranking);
 * - GET /api/projects/:id/proposals, pages from first to last (proposal creation goes first, so
 *   a slow list cannot leave a backlog behind it).
 * Not a test: targets are printed beside the figures; only errors, timeouts, non-2xx answers or
 * server errors (the figures would then mean little) exit 1.
 * Targets (the issue): proposal creation p95 ≤ 50 ms, list page p95 ≤ 20 ms.
 */
import autocannon from 'autocannon';
import { fork } from 'node:child_process';
import { once } from 'node:events';
import { availableParallelism, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import type { BenchServerReady, BenchServerStopped } from './api-bench-server';

const CONNECTIONS = 32;
const DURATION_S = 10;
/** One connection for a few seconds: the time one request takes with nobody queued ahead of it. */
const ONE_CONNECTION_DURATION_S = 5;
const PAGE_SIZE = 20;
/** Pages every connection asks for in turn: the first ones (most used) to the last (largest OFFSET). */
const PAGES = [1, 2, 3, 5, 10, 50, 125, 250, 375, 500];
/** Sequential requests before each measurement, so the JIT has settled (a server runs for hours), within a time bound. */
const WARM_UP_REQUESTS = 50;
const WARM_UP_MAX_MS = 3000;
const TARGET_P95_MS = { create: 50, list: 20 };

interface Measured {
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  requestsPerS: number;
  completed: number;
  errors: number;
  timeouts: number;
  non2xx: number;
}

/** Nearest-rank percentile of sorted values. */
function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length, Math.max(1, Math.ceil((p / 100) * sorted.length))) - 1];
}

const cookiePairs = (response: Response) => response.headers.getSetCookie().map((c) => c.split(';')[0]);

/** Signs in through GET /api/auth/csrf and POST /api/auth/login; the headers every request then carries. */
async function signIn(base: string, email: string, password: string): Promise<Record<string, string>> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const { token } = (await csrf.json()) as { token: string };
  const csrfCookies = cookiePairs(csrf);
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie: csrfCookies.join('; ') },
    body: JSON.stringify({ email, password }),
  });
  if (!login.ok) throw new Error(`sign-in failed: ${login.status} ${await login.text()}`);
  // Sign-in starts a new session: its cookie and its CSRF token replace the visitor's.
  const { csrfToken } = (await login.json()) as { csrfToken: string };
  return { cookie: cookiePairs(login).join('; '), 'x-csrf-token': csrfToken };
}

async function warmUp(path: () => string, init: RequestInit): Promise<void> {
  const start = performance.now();
  for (let i = 0; i < WARM_UP_REQUESTS && performance.now() - start < WARM_UP_MAX_MS; i += 1) {
    const url = `${base}${path()}`;
    const response = await fetch(url, init);
    await response.arrayBuffer();
    if (!response.ok) throw new Error(`warm-up ${init.method ?? 'GET'} ${url}: ${response.status}`);
  }
}

async function load(options: autocannon.Options): Promise<Measured> {
  const latenciesMs: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(options, (error, done) => (error ? reject(error) : resolve(done)));
    instance.on('response', (_client, _status, _bytes, responseTimeMs) => latenciesMs.push(responseTimeMs));
  });
  latenciesMs.sort((a, b) => a - b);
  const elapsedS = (new Date(result.finish).getTime() - new Date(result.start).getTime()) / 1000;
  return {
    p50Ms: percentile(latenciesMs, 50),
    p95Ms: percentile(latenciesMs, 95),
    p99Ms: percentile(latenciesMs, 99),
    requestsPerS: latenciesMs.length / elapsedS,
    completed: latenciesMs.length,
    errors: result.errors,
    timeouts: result.timeouts,
    non2xx: result.non2xx,
  };
}

const loadBefore = loadavg()[0];
const server = fork(fileURLToPath(new URL('./api-bench-server.ts', import.meta.url)));
const [ready] = (await once(server, 'message')) as [BenchServerReady];
const base = `http://127.0.0.1:${ready.port}`;
const headers = await signIn(base, ready.designerEmail, ready.password);
const post = { method: 'POST', headers };

// A spec version never ranked for every request (autocannon asks setupRequest before each one)
let freshUsed = 0;
const freshPath = () => `/api/specs/${ready.freshSpecIds[freshUsed++ % ready.freshSpecIds.length]}/proposals`;
const engineRequests: autocannon.Request[] = [{ method: 'POST', setupRequest: (request) => ({ ...request, path: freshPath() }) }];
await warmUp(freshPath, post);
const engineOne = await load({ url: base, connections: 1, duration: ONE_CONNECTION_DURATION_S, headers, requests: engineRequests });
const engine = await load({ url: base, connections: CONNECTIONS, duration: DURATION_S, headers, requests: engineRequests });

const reusedUrl = `${base}/api/specs/${ready.reusedSpecId}/proposals`;
await warmUp(() => `/api/specs/${ready.reusedSpecId}/proposals`, post);
const reusedOne = await load({ url: reusedUrl, method: 'POST', connections: 1, duration: ONE_CONNECTION_DURATION_S, headers });
const reused = await load({ url: reusedUrl, method: 'POST', connections: CONNECTIONS, duration: DURATION_S, headers });

const listPath = (page: number) => `/api/projects/${ready.listedProjectId}/proposals?page=${page}&pageSize=${PAGE_SIZE}`;
const lastPage = (await (await fetch(`${base}${listPath(PAGES.at(-1)!)}`, { headers })).json()) as { items: unknown[]; total: number };
await warmUp(() => listPath(1), { headers });
const list = await load({
  url: base,
  connections: CONNECTIONS,
  duration: DURATION_S,
  headers,
  requests: PAGES.map((page) => ({ method: 'GET', path: listPath(page) })),
});

server.send('stop');
const [stopped] = (await once(server, 'message')) as [BenchServerStopped];
await once(server, 'exit');

const ms = (value: number) => `${value.toFixed(1)} ms`;
const verdict = (p95Ms: number, targetMs: number) => `target ≤ ${targetMs} ms: ${p95Ms <= targetMs ? 'met' : 'missed'}`;
const row = (name: string, value: string, target = '') => console.log(`${name.padEnd(58)} ${value.padStart(14)}   ${target}`);
function rows(title: string, m: Measured, targetMs?: number): void {
  row(title, `${m.completed.toLocaleString('en')} req`);
  row('  latency p50', ms(m.p50Ms));
  row('  latency p95', ms(m.p95Ms), targetMs === undefined ? '' : verdict(m.p95Ms, targetMs));
  row('  latency p99', ms(m.p99Ms));
  row('  requests per second', m.requestsPerS.toFixed(1));
  row('  errors / timeouts / non-2xx', `${m.errors} / ${m.timeouts} / ${m.non2xx}`, 'must be 0 / 0 / 0');
}

console.log(`Longtail API benchmark — autocannon on 127.0.0.1, ${CONNECTIONS} connections, ${DURATION_S} s per route, Node ${process.version}`);
console.log(`${ready.storedProposals.toLocaleString('en')} stored proposals in the listed project (engine once + bulk copies in ${ready.seedMs.toFixed(0)} ms)`);
console.log(`spec ranked: "${ready.specTitle}"; the engine ran ${stopped.engineRuns.toLocaleString('en')} times for ${stopped.proposalsMade.toLocaleString('en')} proposals made`);
console.log(`list: pages ${PAGES.join(', ')} in turn; the last holds ${lastPage.items.length} of ${lastPage.total.toLocaleString('en')}`);
// Other work on the machine shares the CPUs with the server: say how busy it was
console.log(`1-minute load average ${loadBefore.toFixed(1)} before, ${loadavg()[0].toFixed(1)} after, on ${availableParallelism()} CPUs`);
console.log(`warm-up before each route: up to ${WARM_UP_REQUESTS} sequential requests or ${WARM_UP_MAX_MS / 1000} s\n`);
rows('POST /api/specs/:id/proposals, engine runs, 1 connection', engineOne);
rows(`POST /api/specs/:id/proposals, engine runs, ${CONNECTIONS} connections`, engine, TARGET_P95_MS.create);
rows('POST /api/specs/:id/proposals, ranking reused, 1 connection', reusedOne);
rows(`POST /api/specs/:id/proposals, ranking reused, ${CONNECTIONS} conn.`, reused, TARGET_P95_MS.create);
rows(`GET /api/projects/:id/proposals?page=N&pageSize=${PAGE_SIZE}`, list, TARGET_P95_MS.list);
row('server errors logged', String(stopped.serverErrors), 'must be 0');
if (freshUsed > ready.freshSpecIds.length) row('  fresh spec versions ran out: some asks reused a ranking', String(freshUsed - ready.freshSpecIds.length));

const failures = [engineOne, engine, reusedOne, reused, list].reduce((n, m) => n + m.errors + m.timeouts + m.non2xx, stopped.serverErrors);
if (failures > 0) console.log(`\n${failures} failed request(s) or server error(s): the figures above do not describe a healthy server.`);
process.exit(failures > 0 ? 1 : 0);
