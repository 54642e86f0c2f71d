/**
 * `npm run bench`, part: storage (not a test: nothing here passes or fails). On SQLite, in a temp
 * dir: the database size per 10,000 proposals and the proposal list's latency (first page, and
 * the last page by number and by cursor) at 10,000 and at 200,000 proposals, over HTTP on one
 * connection and as the service call alone. Beside it, the layout before distinct rankings: a
 * database of the previous schema with proposals each holding their own copy of the ranking,
 * measured in the same run, and the time its migration takes.
 *
 * The rows: the engine runs once through the service (the demo studio spec: six topologies,
 * Monte Carlo), then bulk copies by SQL. Proposals share rankings as they do in use: a spec
 * version is ranked once and its ranking is carried by every proposal of it, SHARED_BY proposals
 * per distinct ranking here, each distinct ranking with its own spec version (the copies differ
 * in their summary text, so none is deduplicated away; their keys are labels, not hashes).
 */
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import http from 'node:http';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DataSource } from 'typeorm';
import { loadRuleSet } from '../../rules/index';
import { createApp } from '../../api/app';
import { createDataSource, openDatabase } from '../../api/data-source';
import { MIGRATIONS } from '../../api/migrations/index';
import { DistinctRankings1764900000000 } from '../../api/migrations/1764900000000-distinct-rankings';
import { addMember, createProject } from '../../api/services/projects.service';
import { createProposal, listProposals } from '../../api/services/proposals.service';
import { createSpec } from '../../api/services/specs.service';
import { createUser } from '../../api/services/users.service';

const SIZES = [10_000, 200_000];
/** Proposals per distinct ranking (several people ranking one spec version, re-rankings, batch imports). */
const SHARED_BY = Number(process.env.LONGTAIL_BENCH_SHARED_BY ?? 10);
const PAGE_SIZE = 20;
const RUNS = 40;
/** Proposals of the layout before distinct rankings (each ~88 kB): enough for a per-row figure. */
const OLD_LAYOUT_PROPOSALS = 2_000;
const PASSWORD = 'bench-password-0815';
const BENCH_SPEC_FILE = 'studio-line-receiver.json';
/** The figures for the layout before (200,000 proposals, OFFSET paging, one connection). */
const BEFORE = { bytesPer10k: 17.6e9 / 20, firstPageMs: 15.6, deepPageMs: 44 };

const COPIES = 'WITH RECURSIVE copy(n) AS (SELECT CAST(? AS INTEGER) UNION ALL SELECT n + 1 FROM copy WHERE n < ?)';
/** An ISO timestamp n seconds after the first proposal, as the server writes them (they sort as text). */
const STAMP = (n: string) => `strftime('%Y-%m-%dT%H:%M:%fZ', '2026-01-01', '+' || ${n} || ' seconds')`;
const STATUS = `CASE copy.n % 5 WHEN 0 THEN 'ranked' WHEN 1 THEN 'decided' WHEN 2 THEN 'approved' WHEN 3 THEN 'returned' ELSE 'withdrawn' END`;

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
};
const mb = (bytes: number) => `${(bytes / 1e6).toFixed(1)} MB`;
const ms = (value: number) => `${value.toFixed(2)} ms`;
const row = (name: string, value: string, before = '') => console.log(`${name.padEnd(62)} ${value.padStart(14)}   ${before}`);

const totalStart = performance.now();
const dir = mkdtempSync(join(tmpdir(), 'longtail-storage-bench-'));
const file = join(dir, 'bench.sqlite');
const specPath = join(fileURLToPath(new URL('.', import.meta.url)), '..', '..', 'api', 'demo', 'specs', BENCH_SPEC_FILE);
const payload = JSON.parse(readFileSync(specPath, 'utf8')) as { title: string };

/** The file's size with the write-ahead log folded in. */
async function fileBytes(dataSource: DataSource, path: string): Promise<number> {
  await dataSource.query('PRAGMA wal_checkpoint(TRUNCATE)');
  return statSync(path).size;
}

// --- The layout before: every proposal row with its own copy of the ranking -------------------
async function oldLayout(resultText: string, template: Record<string, unknown>) {
  const path = join(dir, 'before.sqlite');
  const old = createDataSource(path);
  old.setOptions({ migrations: MIGRATIONS.slice(0, MIGRATIONS.indexOf(DistinctRankings1764900000000)), entities: [] });
  await old.initialize();
  await old.runMigrations();
  const empty = await fileBytes(old, path);
  await old.query(`INSERT INTO user_account (email, display_name, role, password_hash, created_at) VALUES ('old@bench.longtail.test', 'Old', 'member', 'x', '2026-01-01T00:00:00.000Z')`);
  await old.query(`INSERT INTO project (name, description, created_by_id, created_at) VALUES ('Before', '', 1, '2026-01-01T00:00:00.000Z')`);
  await old.query(`INSERT INTO spec (project_id, title, latest_version, created_by_id, created_at, updated_at) VALUES (1, 'Before', 1, 1, '2026-01-01T00:00:00.000Z', '2026-01-01T00:00:00.000Z')`);
  await old.query(`INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at) VALUES (1, 1, 'Before', ?, 1, '2026-01-01T00:00:00.000Z')`, [JSON.stringify(payload)]);
  await old.transaction(async (manager) => {
    await manager.query(
      `${COPIES} INSERT INTO proposal (project_id, spec_id, spec_version_id, engine_version, ruleset_version, recommended_topology, status, created_by_id, created_at, updated_at, result)
       SELECT 1, 1, 1, ?, ?, ?, ${STATUS}, 1, ${STAMP('copy.n')}, ${STAMP('copy.n')}, ? FROM copy`,
      [1, OLD_LAYOUT_PROPOSALS, template.engine_version, template.ruleset_version, template.recommended_topology, resultText],
    );
  });
  const bytes = (await fileBytes(old, path)) - empty;
  await old.destroy();
  // The upgrade: the server opens the old file and moves the rankings.
  const started = performance.now();
  const upgraded = await openDatabase(path);
  const migrationMs = performance.now() - started;
  const [{ n: rankings }] = await upgraded.query('SELECT count(*) AS n FROM ranking');
  await upgraded.destroy();
  rmSync(path, { force: true });
  return { bytesPerProposal: bytes / OLD_LAYOUT_PROPOSALS, migrationMs, rankings: Number(rankings) };
}

// --- Today's layout ----------------------------------------------------------------------------
const dataSource = await openDatabase(file);
const emptyBytes = await fileBytes(dataSource, file);
const ruleSet = await loadRuleSet();
const account = (role: 'admin' | 'requirements' | 'designer') =>
  createUser(dataSource, null, { email: `${role}@bench.longtail.test`, displayName: `Bench ${role}`, role: role === 'admin' ? 'admin' : 'member', password: PASSWORD });
const admin = await account('admin');
const author = await account('requirements');
const designer = await account('designer');
const project = await createProject(dataSource, admin.id, { name: 'Storage benchmark' });
await addMember(dataSource, admin, project.id, author.id, 'requirements');
await addMember(dataSource, admin, project.id, designer.id, 'designer');
const spec = await createSpec(dataSource, author, project.id, { title: payload.title, payload });
const first = await createProposal(dataSource, designer, spec.id, ruleSet);
const [template] = await dataSource.query('SELECT * FROM proposal WHERE id = ?', [first.id]);
const [ranking] = await dataSource.query('SELECT id, length(CAST(result AS BLOB)) AS bytes, result FROM ranking WHERE id = ?', [template.ranking_id]);
const [version] = await dataSource.query('SELECT id FROM spec_version WHERE id = ?', [template.spec_version_id]);

/** Grows the project to `total` proposals (the first one included), one new ranking and spec version every SHARED_BY. */
async function growTo(from: number, total: number) {
  const groups = (n: number) => Math.ceil(n / SHARED_BY);
  await dataSource.transaction(async (manager) => {
    if (groups(total) > groups(from)) {
      await manager.query(
        `${COPIES} INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at) SELECT spec_id, copy.n + 1, title, payload, created_by_id, created_at FROM spec_version, copy WHERE spec_version.id = ?`,
        [groups(from), groups(total) - 1, version.id],
      );
      await manager.query(
        `${COPIES} INSERT INTO ranking (content_hash, result, created_at) SELECT printf('bench-copy-%053d', copy.n), replace(result, '"summary":"', '"summary":"[copy ' || copy.n || '] '), created_at FROM ranking, copy WHERE ranking.id = ?`,
        [groups(from), groups(total) - 1, ranking.id],
      );
    }
    // Proposal n (1-based; 1 is the engine's) carries ranking and spec version group (n - 1) / SHARED_BY.
    await manager.query(
      `${COPIES} INSERT INTO proposal (project_id, spec_id, spec_version_id, engine_version, ruleset_version, ranking_id, recommended_topology, status, created_by_id, created_at, updated_at)
       SELECT project_id, spec_id, CAST(? AS INTEGER) + (copy.n - 1) / CAST(? AS INTEGER), engine_version, ruleset_version, CAST(? AS INTEGER) + (copy.n - 1) / CAST(? AS INTEGER), recommended_topology, ${STATUS}, created_by_id, ${STAMP('copy.n')}, ${STAMP('copy.n')}
       FROM proposal, copy WHERE proposal.id = ?`,
      [from + 1, total, version.id, SHARED_BY, ranking.id, SHARED_BY, first.id],
    );
  });
}

const old = await oldLayout(ranking.result as string, template);
const oldPer10k = old.bytesPerProposal * 10_000;

// Signed in over HTTP, one connection (keep-alive), sequential requests.
const app = createApp({ dataSource, sessionSecret: 'bench-session-secret-0123456789abcdef', ruleSet, log: () => undefined });
const server = http.createServer(app);
await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
const base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
/** One keep-alive connection per measured page (renewed: growing the database idles it past the server's keep-alive). */
let agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
function get(path: string, headers: Record<string, string> = {}): Promise<{ status: number; body: string; cookies: string[] }> {
  return new Promise((resolve, reject) => {
    http
      .get(`${base}${path}`, { agent, headers }, (response) => {
        let body = '';
        response.setEncoding('utf8');
        response.on('data', (chunk: string) => (body += chunk));
        response.on('end', () => resolve({ status: response.statusCode ?? 0, body, cookies: (response.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]) }));
      })
      .on('error', reject);
  });
}
function post(path: string, json: unknown, headers: Record<string, string>): Promise<{ status: number; body: string; cookies: string[] }> {
  return new Promise((resolve, reject) => {
    const request = http.request(`${base}${path}`, { method: 'POST', agent, headers: { ...headers, 'content-type': 'application/json' } }, (response) => {
      let body = '';
      response.setEncoding('utf8');
      response.on('data', (chunk: string) => (body += chunk));
      response.on('end', () => resolve({ status: response.statusCode ?? 0, body, cookies: (response.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]) }));
    });
    request.on('error', reject);
    request.end(JSON.stringify(json));
  });
}
const csrf = await get('/api/auth/csrf');
const login = await post('/api/auth/login', { email: designer.email, password: PASSWORD }, { 'x-csrf-token': (JSON.parse(csrf.body) as { token: string }).token, cookie: csrf.cookies.join('; ') });
if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${login.body}`);
const session = { cookie: login.cookies.join('; ') };

/** Median of RUNS sequential requests (after a warm-up), and the same page through the service alone. */
async function latency(query: string, serviceQuery: Parameters<typeof listProposals>[3]) {
  agent.destroy();
  agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
  const path = `/api/projects/${project.id}/proposals?${query}`;
  const check = await get(path, session);
  if (check.status !== 200) throw new Error(`${path}: ${check.status} ${check.body}`);
  const items = (JSON.parse(check.body) as { items: unknown[] }).items.length;
  const httpMs: number[] = [];
  const serviceMs: number[] = [];
  for (let i = 0; i < 5; i += 1) await get(path, session);
  for (let i = 0; i < RUNS; i += 1) {
    let started = performance.now();
    await get(path, session);
    httpMs.push(performance.now() - started);
    started = performance.now();
    await listProposals(dataSource, designer, project.id, serviceQuery);
    serviceMs.push(performance.now() - started);
  }
  return { http: median(httpMs), service: median(serviceMs), items };
}

console.log(`Longtail storage benchmark — SQLite (better-sqlite3), Node ${process.version}`);
console.log(`one ranking of "${payload.title}": ${(ranking.bytes / 1000).toFixed(1)} kB of JSON; ${SHARED_BY} proposals per distinct ranking (LONGTAIL_BENCH_SHARED_BY)`);
console.log(`1-minute load average ${loadavg()[0].toFixed(1)} at the start on 2 shared cores (the figures grow with it)`);
console.log(`list: ${PAGE_SIZE} a page; medians of ${RUNS} sequential requests on one connection (HTTP) and of the service call alone\n`);


let stored = 1;
for (const size of SIZES) {
  const grown = performance.now();
  await growTo(stored, size);
  stored = size;
  const bytes = (await fileBytes(dataSource, file)) - emptyBytes;
  const [{ n: rankings }] = await dataSource.query('SELECT count(*) AS n FROM ranking');
  const lastPage = Math.ceil(size / PAGE_SIZE);
  const [before] = await dataSource.query('SELECT created_at, id FROM proposal WHERE project_id = ? ORDER BY created_at DESC, id DESC LIMIT 1 OFFSET ?', [project.id, (lastPage - 1) * PAGE_SIZE - 1]);
  const cursor = `${before.created_at}~${before.id}`;
  const firstPage = await latency(`page=1&pageSize=${PAGE_SIZE}`, { page: 1, pageSize: PAGE_SIZE });
  const deepNumber = await latency(`page=${lastPage}&pageSize=${PAGE_SIZE}`, { page: lastPage, pageSize: PAGE_SIZE });
  const deepCursor = await latency(`cursor=${encodeURIComponent(cursor)}&pageSize=${PAGE_SIZE}`, { page: 1, pageSize: PAGE_SIZE, cursor });
  console.log(`${size.toLocaleString('en')} proposals, ${Number(rankings).toLocaleString('en')} distinct rankings (written in ${((performance.now() - grown) / 1000).toFixed(1)} s)`);
  row('  database size', mb(bytes), `before: ${mb(old.bytesPerProposal * size)} (measured layout before)`);
  row('  database size per 10,000 proposals', mb((bytes / size) * 10_000), `before: ${mb(oldPer10k)} measured, ${mb(BEFORE.bytesPer10k)} in the issue`);
  row('  list, first page (HTTP / service)', `${ms(firstPage.http)} / ${ms(firstPage.service)}`, size === 200_000 ? `before: ${ms(BEFORE.firstPageMs)} (HTTP)` : '');
  row(`  list, page ${lastPage.toLocaleString('en')} by number (HTTP / service)`, `${ms(deepNumber.http)} / ${ms(deepNumber.service)}`, size === 200_000 ? `before: ${ms(BEFORE.deepPageMs)} (HTTP, page 10,000)` : '');
  row(`  list, same page by cursor (HTTP / service)`, `${ms(deepCursor.http)} / ${ms(deepCursor.service)}`, `${deepCursor.items} rows`);
  const counts: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const started = performance.now();
    await dataSource.query('SELECT count(*) AS n FROM proposal WHERE project_id = ?', [project.id]);
    counts.push(performance.now() - started);
  }
  row('  of which the total (a count over the list index)', ms(median(counts)), 'in every page above');
  console.log('');
}
row('layout before: bytes per proposal (measured)', `${(old.bytesPerProposal / 1000).toFixed(1)} kB`, `${OLD_LAYOUT_PROPOSALS.toLocaleString('en')} rows of the previous schema`);
row('layout before: its migration (open as on an upgrade)', `${(old.migrationMs / 1000).toFixed(2)} s`, `${OLD_LAYOUT_PROPOSALS.toLocaleString('en')} proposals → ${old.rankings} ranking(s)`);
console.log(`\ntotal ${((performance.now() - totalStart) / 1000).toFixed(0)} s; 1-minute load average ${loadavg()[0].toFixed(1)} at the end`);

agent.destroy();
server.closeAllConnections();
await new Promise((resolve) => server.close(resolve));
app.closeApp();
await dataSource.destroy();
rmSync(dir, { recursive: true, force: true });
