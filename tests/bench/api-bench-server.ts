/**
 * The server half of the API benchmark, forked by api.bench.ts so that the load generator does
 * not share the server's thread: a fresh SQLite file in a temp dir holding
 * - a listed project with 10,000 stored proposals (the engine run once through the service,
 *   then 9,999 copies of its row in one INSERT), which keeps exactly that many;
 * - a second project with one spec (asked again and again: its ranking is reused after the
 *   first) and 2,000 copies of it, each a spec version never ranked (asked once each: the
 *   engine runs for every request);
 * and the real app on 127.0.0.1 on an ephemeral port, the engine on the request thread (the
 * app's engine workers 0). Says `ready` over IPC; then
 * - `{ type: 'engine', workers }` with workers > 0 starts the process's engine pool (which the
 *   app's services then use, api/engine/engine-pool.ts), with 0 stops it; answers `engine`;
 * - `{ type: 'delay-start' }` resets and starts an event-loop delay histogram
 *   (perf_hooks.monitorEventLoopDelay), `{ type: 'delay-stop' }` stops it and answers `delay`;
 * - `{ type: 'profile-start' }` starts a CPU profile of the server's thread (node:inspector),
 *   `{ type: 'profile-stop', file }` writes it (.cpuprofile, for Chrome DevTools) and answers `profiled`;
 * - `stop` answers `stopped` (server errors logged, proposals made and engine runs), closes
 *   everything and removes the temp dir.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import { Session } from 'node:inspector/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { loadRuleSet } from '../../rules/index';
import { createApp } from '../../api/app';
import { acquireEnginePool, type EnginePoolLease } from '../../api/engine/engine-pool';
import { openDatabase } from '../../api/data-source';
import { addMember, createProject } from '../../api/services/projects.service';
import { createProposal } from '../../api/services/proposals.service';
import { createSpec } from '../../api/services/specs.service';
import { createUser } from '../../api/services/users.service';

const STORED_PROPOSALS = 10_000;
/** More never-ranked spec versions than the engine-bound runs can use up (a few hundred per second at best). */
const FRESH_SPECS = 5_000;
/** The demo spec every benchmarked proposal ranks (six topologies, 2,000 Monte Carlo draws). */
const BENCH_SPEC_FILE = 'studio-line-receiver.json';
const PASSWORD = 'bench-password-0815';

export interface BenchServerReady {
  type: 'ready';
  port: number;
  /** The project holding the stored proposals (listed). */
  listedProjectId: number;
  /** A spec asked repeatedly (its ranking is reused after the first proposal). */
  reusedSpecId: number;
  /** Specs whose latest version was never ranked: each asked once, the engine runs. */
  freshSpecIds: number[];
  specTitle: string;
  designerEmail: string;
  password: string;
  storedProposals: number;
  seedMs: number;
}

/** Where the engine runs now: threads of the process's pool (0: on the request thread). */
export interface BenchServerEngine {
  type: 'engine';
  workers: number;
}

/** The server thread's event-loop delay over a measured stretch, ms. */
export interface BenchServerDelay {
  type: 'delay';
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
}

export type BenchServerMessage =
  | { type: 'engine'; workers: number }
  | { type: 'delay-start' } | { type: 'delay-stop' } | { type: 'profile-start' } | { type: 'profile-stop'; file: string } | 'stop';

export interface BenchServerStopped {
  type: 'stopped';
  serverErrors: number;
  /** Proposals made during the run, and how many distinct spec versions they rank (engine runs). */
  proposalsMade: number;
  engineRuns: number;
}

const PROPOSAL_COLUMNS = 'project_id, spec_id, spec_version_id, engine_version, ruleset_version, ranking_id, recommended_topology, status, created_by_id, created_at, updated_at';
const COPIES = 'WITH RECURSIVE copy(n) AS (SELECT 1 UNION ALL SELECT n + 1 FROM copy WHERE n < ?)';

const dir = mkdtempSync(join(tmpdir(), 'longtail-api-bench-'));
const dataSource = await openDatabase(join(dir, 'bench.sqlite'));
const ruleSet = await loadRuleSet();

const account = (role: 'admin' | 'requirements' | 'designer') =>
  createUser(dataSource, null, { email: `${role}@bench.longtail.test`, displayName: `Bench ${role}`, role: role === 'admin' ? 'admin' : 'member', password: PASSWORD });
const admin = await account('admin');
const author = await account('requirements');
const designer = await account('designer');
const specPath = join(fileURLToPath(new URL('.', import.meta.url)), '..', '..', 'api', 'demo', 'specs', BENCH_SPEC_FILE);
const payload = JSON.parse(readFileSync(specPath, 'utf8')) as { title: string };

/** A project with the author and the designer as members, and the demo spec in it. */
async function projectWithSpec(name: string) {
  const project = await createProject(dataSource, admin.id, { name });
  await addMember(dataSource, admin, project.id, author.id, 'requirements');
  await addMember(dataSource, admin, project.id, designer.id, 'designer');
  const spec = await createSpec(dataSource, author, project.id, { title: payload.title, payload });
  return { project, spec };
}
const listed = await projectWithSpec('API benchmark: stored proposals');
const asked = await projectWithSpec('API benchmark: new proposals');

const seedStart = performance.now();
const first = await createProposal(dataSource, designer, listed.spec.id, ruleSet);
await dataSource.transaction(async (manager) => {
  await manager.query(`${COPIES} INSERT INTO proposal (${PROPOSAL_COLUMNS}) SELECT ${PROPOSAL_COLUMNS} FROM proposal, copy WHERE proposal.id = ?`, [STORED_PROPOSALS - 1, first.id]);
  // Copies of the asked spec, each with a version 1 of the same document
  await manager.query(
    `${COPIES} INSERT INTO spec (project_id, title, latest_version, created_by_id, created_at, updated_at)
     SELECT project_id, title, latest_version, created_by_id, created_at, updated_at FROM spec, copy WHERE spec.id = ?`,
    [FRESH_SPECS, asked.spec.id],
  );
  await manager.query(
    `INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at)
     SELECT s.id, 1, v.title, v.payload, v.created_by_id, v.created_at FROM spec s, spec_version v WHERE s.project_id = ? AND s.id > ? AND v.spec_id = ?`,
    [asked.project.id, asked.spec.id, asked.spec.id],
  );
});
// Start from a checkpointed file, as a server that has been running a while would
await dataSource.query('PRAGMA wal_checkpoint(TRUNCATE)');
const seedMs = performance.now() - seedStart;
const [{ n: storedProposals }] = await dataSource.query('SELECT count(*) AS n FROM proposal WHERE project_id = ?', [listed.project.id]);
const freshSpecs: { id: number }[] = await dataSource.query('SELECT id FROM spec WHERE project_id = ? AND id > ? ORDER BY id', [asked.project.id, asked.spec.id]);

let serverErrors = 0;
const app = createApp({ dataSource, sessionSecret: 'bench-session-secret-0123456789abcdef', ruleSet, log: (m) => { serverErrors += 1; if (process.env.BENCH_DEBUG) console.error(m); }, proposalsPerMinute: 1_000_000}); // throughput, not the per-person limit
const server = http.createServer(app);
server.listen(0, '127.0.0.1', () => {
  const address = server.address() as { port: number };
  const ready: BenchServerReady = {
    type: 'ready',
    port: address.port,
    listedProjectId: listed.project.id,
    reusedSpecId: asked.spec.id,
    freshSpecIds: freshSpecs.map((s) => s.id),
    specTitle: asked.spec.title,
    designerEmail: designer.email,
    password: PASSWORD,
    storedProposals: Number(storedProposals),
    seedMs,
  };
  process.send?.(ready);
});

let stopping = false;
async function stop(): Promise<void> {
  if (stopping) return;
  stopping = true;
  const [made] = await dataSource.query('SELECT count(*) AS proposals, count(DISTINCT spec_version_id) AS versions FROM proposal WHERE project_id = ?', [asked.project.id]);
  const stopped: BenchServerStopped = { type: 'stopped', serverErrors, proposalsMade: Number(made.proposals), engineRuns: Number(made.versions) };
  await new Promise((resolve) => process.send?.(stopped, undefined, undefined, resolve));
  server.closeAllConnections();
  await new Promise((resolve) => server.close(resolve));
  app.closeApp();
  await pool?.release();
  await dataSource.destroy();
  rmSync(dir, { recursive: true, force: true });
  process.exit(0);
}
const delay = monitorEventLoopDelay({ resolution: 5 });
let profiler: Session | null = null;
let pool: EnginePoolLease | null = null;
const reply = (message: object) => new Promise((resolve) => process.send?.(message, undefined, undefined, resolve));
process.on('message', (message: BenchServerMessage) => {
  if (message === 'stop') void stop();
  else if (message.type === 'engine') {
    void (async () => {
      await pool?.release();
      pool = message.workers > 0 ? acquireEnginePool(message.workers) : null;
      const answer: BenchServerEngine = { type: 'engine', workers: pool?.workers ?? 0 };
      await reply(answer);
    })();
  } else if (message.type === 'delay-start') {
    delay.reset();
    delay.enable();
  } else if (message.type === 'delay-stop') {
    delay.disable();
    const answer: BenchServerDelay = { type: 'delay', p50Ms: delay.percentile(50) / 1e6, p99Ms: delay.percentile(99) / 1e6, maxMs: delay.max / 1e6 };
    void reply(answer);
  } else if (message.type === 'profile-start') {
    profiler = new Session();
    profiler.connect();
    void profiler.post('Profiler.enable').then(() => profiler!.post('Profiler.start'));
  } else if (message.type === 'profile-stop' && profiler) {
    void profiler.post('Profiler.stop').then(({ profile }) => {
      writeFileSync(message.file, JSON.stringify(profile));
      profiler!.disconnect();
      profiler = null;
      return reply({ type: 'profiled' });
    });
  }
});
// The parent went away without saying stop: clean up all the same
process.on('disconnect', () => void stop());
