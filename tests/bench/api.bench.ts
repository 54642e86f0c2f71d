/**
 * `npm run bench` (after the engine bench): the API under load with autocannon, against the real
 * app on 127.0.0.1 with 10,000 stored proposals in the listed project (api-bench-server.ts,
 * forked so the load generator does not share the server's thread). One server, its engine first
 * on the request thread and then in its worker pool (one thread per core, as a server starts by
 * default), so that the two sit side by side on the same data in the same run:
 * 1. engine inline: POST /api/specs/:id/proposals where the engine runs (each request names a
 *    spec version never ranked), 32 connections;
 * 2. engine in the pool: the same route with one connection (the time one request takes, nobody
 *    queued ahead) and with 32; the same route on one spec version asked again and again (the
 *    server reuses its ranking); GET /api/projects/:id/proposals, pages from first to last, with
 *    32 connections and with one.
 * While rankings run, the server measures its event loop's delay (perf_hooks
 * monitorEventLoopDelay): how long any other request waits for the thread.
 * A designer signs in through the CSRF flow; each route runs for a bounded time, and exact
 * p50/p95/p99 latencies come from every response.
 * Not a test: targets are printed beside the figures; only errors, timeouts, non-2xx answers or
 * server errors (the figures would then mean little) exit 1. The machine's other work shares its
 * CPUs: the load average is printed, and the ratios (pool against inline) mean more than the
 * absolute figures when it is busy.
 * LONGTAIL_BENCH_PROFILE=<dir>: CPU profiles of the server's thread during the list and the
 * pooled proposal creation runs are written there (.cpuprofile, open in Chrome DevTools).
 * Targets: proposal list ≥ 1,500 req/s at 32 connections and p50 ≤ 1 ms at one; creation with the
 * engine running ≥ 1.8× the inline req/s at 32 connections; event-loop delay p99 ≤ 20 ms while
 * rankings run; proposal creation p95 ≤ 50 ms, list page p95 ≤ 20 ms.
 */
import autocannon from 'autocannon';
import { fork } from 'node:child_process';
import { once } from 'node:events';
import { availableParallelism, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import type { BenchServerDelay, BenchServerEngine, BenchServerMessage, BenchServerReady, BenchServerStopped } from './api-bench-server';

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
/** The engine route's bound: every pool thread needs a few dozen rankings before its JIT has settled. */
const ENGINE_WARM_UP_MAX_MS = 15_000;
const TARGET_P95_MS = { create: 50, list: 20 };
const TARGET_LIST_REQUESTS_PER_S = 1500;
const TARGET_LIST_ONE_P50_MS = 1;
const TARGET_POOL_SPEED_UP = 1.8;
const TARGET_DELAY_P99_MS = 20;
/** Threads of the engine pool: one per core, as a server starts by default (LONGTAIL_ENGINE_WORKERS). */
const ENGINE_WORKERS = availableParallelism();
/** Parallel warm-up loops on the engine route, so that every pool thread's JIT has settled too. */
const ENGINE_WARM_UP_LOOPS = 2 * ENGINE_WORKERS;
const PROFILE_DIR = process.env.LONGTAIL_BENCH_PROFILE;

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

async function warmUp(base: string, path: () => string, init: RequestInit, loops = 1, maxMs = WARM_UP_MAX_MS): Promise<void> {
  if (loops > 1) {
    await Promise.all(Array.from({ length: loops }, () => warmUp(base, path, init, 1, maxMs)));
    return;
  }
  const start = performance.now();
  for (let i = 0; i < WARM_UP_REQUESTS && performance.now() - start < maxMs; i += 1) {
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


interface BenchServer {
  ready: BenchServerReady;
  base: string;
  headers: Record<string, string>;
  /** Sends a message and waits for the answer of the given type. */
  ask<T>(message: BenchServerMessage, answer: string): Promise<T>;
  tell(message: BenchServerMessage): void;
  stop(): Promise<BenchServerStopped>;
}

async function startServer(): Promise<BenchServer> {
  const child = fork(fileURLToPath(new URL('./api-bench-server.ts', import.meta.url)));
  const [ready] = (await once(child, 'message')) as [BenchServerReady];
  const base = `http://127.0.0.1:${ready.port}`;
  const ask = async <T>(message: BenchServerMessage, answer: string) => {
    const answered = new Promise<T>((resolve) => {
      const listener = (m: { type?: string }) => {
        if (m?.type !== answer) return;
        child.off('message', listener);
        resolve(m as T);
      };
      child.on('message', listener);
    });
    child.send(message);
    return answered;
  };
  return {
    ready,
    base,
    headers: await signIn(base, ready.designerEmail, ready.password),
    ask,
    tell: (message) => child.send(message),
    async stop() {
      const exited = once(child, 'exit');
      const stopped = await ask<BenchServerStopped>('stop', 'stopped');
      await exited;
      return stopped;
    },
  };
}

/** Proposal creation where the engine runs, each request naming a spec version never ranked. */
function engineRoute(server: BenchServer) {
  let used = 0;
  const path = () => `/api/specs/${server.ready.freshSpecIds[used++ % server.ready.freshSpecIds.length]}/proposals`;
  const requests: autocannon.Request[] = [{ method: 'POST', setupRequest: (request) => ({ ...request, path: path() }) }];
  return { path, requests, ranOut: () => Math.max(0, used - server.ready.freshSpecIds.length) };
}

/** A load run with the server's event-loop delay measured over it. */
async function loadWithDelay(server: BenchServer, options: autocannon.Options): Promise<[Measured, BenchServerDelay]> {
  server.tell({ type: 'delay-start' });
  const measured = await load(options);
  return [measured, await server.ask<BenchServerDelay>({ type: 'delay-stop' }, 'delay')];
}

/** A load run, profiled into PROFILE_DIR/<name>.cpuprofile when asked. */
async function profiled<T>(server: BenchServer, name: string, run: () => Promise<T>): Promise<T> {
  if (!PROFILE_DIR) return run();
  server.tell({ type: 'profile-start' });
  const result = await run();
  await server.ask({ type: 'profile-stop', file: join(PROFILE_DIR, `${name}.cpuprofile`) }, 'profiled');
  return result;
}

const loadBefore = loadavg()[0];

const bench = await startServer();
const { ready, base, headers } = bench;
const post = { method: 'POST', headers };

// 1. The engine on the request thread
const inlineRoute = engineRoute(bench);
await warmUp(base, inlineRoute.path, post, ENGINE_WARM_UP_LOOPS, ENGINE_WARM_UP_MAX_MS);
const [inlineEngine, inlineDelay] = await loadWithDelay(bench, { url: base, connections: CONNECTIONS, duration: DURATION_S, headers, requests: inlineRoute.requests });

// 2. The engine in its pool, and the other routes
const { workers } = await bench.ask<BenchServerEngine>({ type: 'engine', workers: ENGINE_WORKERS }, 'engine');
const pooledRoute = inlineRoute;
await warmUp(base, pooledRoute.path, post, ENGINE_WARM_UP_LOOPS, ENGINE_WARM_UP_MAX_MS);
const engineOne = await load({ url: base, connections: 1, duration: ONE_CONNECTION_DURATION_S, headers, requests: pooledRoute.requests });
const [engine, poolDelay] = await profiled(bench, 'create-pool', () =>
  loadWithDelay(bench, { url: base, connections: CONNECTIONS, duration: DURATION_S, headers, requests: pooledRoute.requests }),
);

const reusedUrl = `${base}/api/specs/${ready.reusedSpecId}/proposals`;
await warmUp(base, () => `/api/specs/${ready.reusedSpecId}/proposals`, post);
const reusedOne = await load({ url: reusedUrl, method: 'POST', connections: 1, duration: ONE_CONNECTION_DURATION_S, headers });
const reused = await load({ url: reusedUrl, method: 'POST', connections: CONNECTIONS, duration: DURATION_S, headers });

const listPath = (page: number) => `/api/projects/${ready.listedProjectId}/proposals?page=${page}&pageSize=${PAGE_SIZE}`;
const lastPage = (await (await fetch(`${base}${listPath(PAGES.at(-1)!)}`, { headers })).json()) as { items: unknown[]; total: number };
await warmUp(base, () => listPath(1), { headers });
const listRequests: autocannon.Request[] = PAGES.map((page) => ({ method: 'GET', path: listPath(page) }));
const list = await profiled(bench, 'list', () => load({ url: base, connections: CONNECTIONS, duration: DURATION_S, headers, requests: listRequests }));
const listOne = await load({ url: base, connections: 1, duration: ONE_CONNECTION_DURATION_S, headers, requests: listRequests });
const stopped = await bench.stop();

const ms = (value: number) => `${value.toFixed(1)} ms`;
const met = (ok: boolean) => (ok ? 'met' : 'missed');
const verdict = (p95Ms: number, targetMs: number) => `target ≤ ${targetMs} ms: ${met(p95Ms <= targetMs)}`;
const row = (name: string, value: string, target = '') => console.log(`${name.padEnd(62)} ${value.padStart(14)}   ${target}`);
function rows(title: string, m: Measured, targetMs?: number): void {
  row(title, `${m.completed.toLocaleString('en')} req`);
  row('  latency p50', ms(m.p50Ms));
  row('  latency p95', ms(m.p95Ms), targetMs === undefined ? '' : verdict(m.p95Ms, targetMs));
  row('  latency p99', ms(m.p99Ms));
  row('  requests per second', m.requestsPerS.toFixed(1));
  row('  errors / timeouts / non-2xx', `${m.errors} / ${m.timeouts} / ${m.non2xx}`, 'must be 0 / 0 / 0');
}
const delayRow = (d: BenchServerDelay) => `p50 ${d.p50Ms.toFixed(1)} / p99 ${d.p99Ms.toFixed(1)} / max ${d.maxMs.toFixed(0)}`;

console.log(`Longtail API benchmark — autocannon on 127.0.0.1, ${CONNECTIONS} connections, ${DURATION_S} s per route, Node ${process.version}`);
console.log(`${ready.storedProposals.toLocaleString('en')} stored proposals in the listed project (engine once + bulk copies in ${ready.seedMs.toFixed(0)} ms)`);
console.log(`spec ranked: "${ready.specTitle}"; the engine ran ${stopped.engineRuns.toLocaleString('en')} times for ${stopped.proposalsMade.toLocaleString('en')} proposals made`);
console.log(`engine: on the request thread first (engine workers 0), then in a pool of ${workers} worker threads`);
console.log(`list: pages ${PAGES.join(', ')} in turn; the last holds ${lastPage.items.length} of ${lastPage.total.toLocaleString('en')}`);
// Other work on the machine shares the CPUs with the server: say how busy it was
console.log(`1-minute load average ${loadBefore.toFixed(1)} before, ${loadavg()[0].toFixed(1)} after, on ${availableParallelism()} CPUs${loadBefore > availableParallelism() ? ' (busy: absolute figures are low, compare the ratios)' : ''}`);
console.log(`warm-up before each route: up to ${WARM_UP_REQUESTS} sequential requests or ${WARM_UP_MAX_MS / 1000} s (${ENGINE_WARM_UP_LOOPS} loops at once for up to ${ENGINE_WARM_UP_MAX_MS / 1000} s on the engine route)\n`);
rows(`POST /api/specs/:id/proposals, engine runs inline, ${CONNECTIONS} connections`, inlineEngine, TARGET_P95_MS.create);
row('  event-loop delay while it runs, ms', delayRow(inlineDelay));
rows('POST /api/specs/:id/proposals, engine runs in the pool, 1 connection', engineOne);
rows(`POST /api/specs/:id/proposals, engine runs in the pool, ${CONNECTIONS} conn.`, engine, TARGET_P95_MS.create);
row('  event-loop delay while it runs, ms', delayRow(poolDelay));
rows('POST /api/specs/:id/proposals, ranking reused, 1 connection', reusedOne);
rows(`POST /api/specs/:id/proposals, ranking reused, ${CONNECTIONS} conn.`, reused, TARGET_P95_MS.create);
rows(`GET /api/projects/:id/proposals?page=N&pageSize=${PAGE_SIZE}, ${CONNECTIONS} conn.`, list, TARGET_P95_MS.list);
rows(`GET /api/projects/:id/proposals?page=N&pageSize=${PAGE_SIZE}, 1 connection`, listOne);
row('server errors logged', String(stopped.serverErrors), 'must be 0');
const ranOut = pooledRoute.ranOut();
if (ranOut > 0) row('  fresh spec versions ran out: some asks reused a ranking', String(ranOut));

const speedUp = engine.requestsPerS / inlineEngine.requestsPerS;
console.log('\nTargets (figures measured above, in this run)');
row('proposal list, 32 connections, requests per second', list.requestsPerS.toFixed(0), `target ≥ ${TARGET_LIST_REQUESTS_PER_S.toLocaleString('en')}: ${met(list.requestsPerS >= TARGET_LIST_REQUESTS_PER_S)}`);
row('proposal list, 1 connection, latency p50', ms(listOne.p50Ms), `target ≤ ${TARGET_LIST_ONE_P50_MS} ms: ${met(listOne.p50Ms <= TARGET_LIST_ONE_P50_MS)}`);
row(
  `creation with the engine, ${CONNECTIONS} conn., pool / inline req/s`,
  `${speedUp.toFixed(2)}×`,
  `target ≥ ${TARGET_POOL_SPEED_UP}×: ${met(speedUp >= TARGET_POOL_SPEED_UP)} (${engine.requestsPerS.toFixed(1)} / ${inlineEngine.requestsPerS.toFixed(1)})`,
);
row('event-loop delay p99 while rankings run (pool)', ms(poolDelay.p99Ms), `target ≤ ${TARGET_DELAY_P99_MS} ms: ${met(poolDelay.p99Ms <= TARGET_DELAY_P99_MS)} (inline: ${ms(inlineDelay.p99Ms)})`);
if (PROFILE_DIR) console.log(`\nCPU profiles of the server's thread: ${PROFILE_DIR}/create-pool.cpuprofile, ${PROFILE_DIR}/list.cpuprofile`);

const failures = [inlineEngine, engineOne, engine, reusedOne, reused, list, listOne].reduce(
  (n, m) => n + m.errors + m.timeouts + m.non2xx,
  stopped.serverErrors,
);
if (failures > 0) console.log(`\n${failures} failed request(s) or server error(s): the figures above do not describe a healthy server.`);
process.exit(failures > 0 ? 1 : 0);
