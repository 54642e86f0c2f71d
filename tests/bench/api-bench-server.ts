/**
 * The server half of the API benchmark, forked by api.bench.ts so that the load generator does
 * not share the server's thread: a fresh SQLite file in a temp dir; a listed project holding
 * 10,000 stored proposals (the engine run once through the service, then 9,999 copies of its
 * row in one INSERT); a second project whose spec takes the new proposals, so the listed one
 * keeps exactly 10,000; the real app on 127.0.0.1 on an ephemeral port. Says `ready` over IPC;
 * `stop` answers `stopped` with the count of server errors logged, closes everything and
 * removes the temp dir.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadRuleSet } from '../../rules/index';
import { createApp } from '../../api/app';
import { openDatabase } from '../../api/data-source';
import { addMember, createProject } from '../../api/services/projects.service';
import { createProposal } from '../../api/services/proposals.service';
import { createSpec } from '../../api/services/specs.service';
import { createUser } from '../../api/services/users.service';

const STORED_PROPOSALS = 10_000;
/** The demo spec every benchmarked proposal ranks (six topologies, 2,000 Monte Carlo draws). */
const BENCH_SPEC_FILE = 'studio-line-receiver.json';
const PASSWORD = 'bench-password-0815';

export interface BenchServerReady {
  type: 'ready';
  port: number;
  /** The project holding the stored proposals (listed). */
  listedProjectId: number;
  /** The spec new proposals are asked for (in another project). */
  specId: number;
  specTitle: string;
  designerEmail: string;
  password: string;
  storedProposals: number;
  seedMs: number;
}

export interface BenchServerStopped {
  type: 'stopped';
  serverErrors: number;
}

const PROPOSAL_COLUMNS = 'project_id, spec_id, spec_version_id, engine_version, ruleset_version, result, recommended_topology, status, created_by_id, created_at, updated_at';

const dir = mkdtempSync(join(tmpdir(), 'longtail-api-bench-'));
const dataSource = await openDatabase(join(dir, 'bench.sqlite'));
const ruleSet = await loadRuleSet();

const account = (role: 'admin' | 'requirements' | 'designer') =>
  createUser(dataSource, null, { email: `${role}@bench.longtail.test`, displayName: `Bench ${role}`, role, password: PASSWORD });
const admin = await account('admin');
const author = await account('requirements');
const designer = await account('designer');
const specPath = join(fileURLToPath(new URL('.', import.meta.url)), '..', '..', 'api', 'demo', 'specs', BENCH_SPEC_FILE);
const payload = JSON.parse(readFileSync(specPath, 'utf8')) as { title: string };

/** A project with the author and the designer as members, and the demo spec in it. */
async function projectWithSpec(name: string) {
  const project = await createProject(dataSource, admin.id, { name });
  await addMember(dataSource, admin, project.id, author.id);
  await addMember(dataSource, admin, project.id, designer.id);
  const spec = await createSpec(dataSource, author, project.id, { title: payload.title, payload });
  return { project, spec };
}
const listed = await projectWithSpec('API benchmark: stored proposals');
const asked = await projectWithSpec('API benchmark: new proposals');

const seedStart = performance.now();
const first = await createProposal(dataSource, designer, listed.spec.id, ruleSet);
await dataSource.transaction((manager) =>
  manager.query(
    `WITH RECURSIVE copy(n) AS (SELECT 1 UNION ALL SELECT n + 1 FROM copy WHERE n < ?)
     INSERT INTO proposal (${PROPOSAL_COLUMNS}) SELECT ${PROPOSAL_COLUMNS} FROM proposal, copy WHERE proposal.id = ?`,
    [STORED_PROPOSALS - 1, first.id],
  ),
);
// Start from a checkpointed file, as a server that has been running a while would
await dataSource.query('PRAGMA wal_checkpoint(TRUNCATE)');
const seedMs = performance.now() - seedStart;
const [{ n: storedProposals }] = await dataSource.query('SELECT count(*) AS n FROM proposal WHERE project_id = ?', [listed.project.id]);

let serverErrors = 0;
const app = createApp({ dataSource, sessionSecret: 'bench-session-secret-0123456789abcdef', ruleSet, log: () => (serverErrors += 1) });
const server = http.createServer(app);
server.listen(0, '127.0.0.1', () => {
  const address = server.address() as { port: number };
  const ready: BenchServerReady = {
    type: 'ready',
    port: address.port,
    listedProjectId: listed.project.id,
    specId: asked.spec.id,
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
  const stopped: BenchServerStopped = { type: 'stopped', serverErrors };
  await new Promise((resolve) => process.send?.(stopped, undefined, undefined, resolve));
  server.closeAllConnections();
  await new Promise((resolve) => server.close(resolve));
  app.closeApp();
  await dataSource.destroy();
  rmSync(dir, { recursive: true, force: true });
  process.exit(0);
}
process.on('message', (message) => {
  if (message === 'stop') void stop();
});
// The parent went away without saying stop: clean up all the same
process.on('disconnect', () => void stop());
