/**
 * `npm run bench`, part: what waits for a person, and a project's activity (not a test: nothing
 * here passes or fails). On SQLite, in a temp dir: 10,000 proposals over 12 projects and 1,200
 * specs, in the states a team leaves them (most approved, some waiting for a decision, a review
 * or a new decision, some closed), with their decisions, reviews and audit events, and a fifth of
 * the specs revised since their last ranking. Then the medians of the waiting list's requests
 * (the counts the navigation asks for, and each kind's first page as the home page asks for it)
 * for a designer, a reviewer and a systems engineer who each hold their role in every project,
 * over HTTP on one connection and as the service call alone, beside the ≤ 50 ms target; and the
 * activity page of one project, unfiltered, by person and by kind.
 *
 * Seeding is plain SQL (recursive CTEs in one transaction, no engine: the lists never read a
 * ranking, so every proposal refers to one small stand-in row), a second or two.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import http from 'node:http';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadRuleSet } from '../../rules/index';
import { createApp } from '../../api/app';
import { openDatabase } from '../../api/data-source';
import { listActivity } from '../../api/services/activity.service';
import { addMember, createProject } from '../../api/services/projects.service';
import { createUser, type PublicUser } from '../../api/services/users.service';
import { listWaiting, waitingCounts } from '../../api/services/waiting.service';
import { WAITING_KINDS, type WaitingKind } from '#shared/workflow/waiting';
import type { ProjectRole } from '#shared/workflow/roles';

const PROPOSALS = 10_000;
const PROJECTS = 12;
const SPECS = 1_200;
/** One spec in REVISED_EVERY has a version 2 written after its rankings (its latest version waits to be ranked). */
const REVISED_EVERY = 5;
const PAGE_SIZE = 20;
const RUNS = 40;
const TARGET_MS = 50;
const PASSWORD = 'bench-password-0815';

const COPIES = 'WITH RECURSIVE copy(n) AS (SELECT 1 UNION ALL SELECT n + 1 FROM copy WHERE n < ?)';
/** An ISO timestamp n seconds into the year, as the server writes them (they sort as text). */
const STAMP = (n: string) => `strftime('%Y-%m-%dT%H:%M:%fZ', '2026-01-01', '+' || (${n}) || ' seconds')`;
/**
 * Proposal n's state, by n mod 20: 2 waiting for a decision, 1 for a review, 1 sent back, 2
 * closed as superseded, 1 withdrawn, 13 approved.
 */
const STATUS = `CASE WHEN copy.n % 20 < 2 THEN 'ranked' WHEN copy.n % 20 = 2 THEN 'decided' WHEN copy.n % 20 = 3 THEN 'returned' WHEN copy.n % 20 < 6 THEN 'superseded' WHEN copy.n % 20 = 6 THEN 'withdrawn' ELSE 'approved' END`;

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
};
const ms = (value: number) => `${value.toFixed(2)} ms`;
const row = (name: string, value: string, note = '') => console.log(`${name.padEnd(58)} ${value.padStart(20)}   ${note}`);

const totalStart = performance.now();
const dir = mkdtempSync(join(tmpdir(), 'longtail-waiting-bench-'));
const dataSource = await openDatabase(join(dir, 'bench.sqlite'));
const ruleSet = await loadRuleSet();

// --- People and projects, through the services --------------------------------------------------
const account = (key: string) => createUser(dataSource, null, { email: `${key}@bench.longtail.test`, displayName: `Bench ${key}`, role: key === 'admin' ? 'admin' : 'member', password: PASSWORD });
const admin = await account('admin');
const people: Record<ProjectRole, PublicUser> = { requirements: await account('requirements'), designer: await account('designer'), reviewer: await account('reviewer') };
const projectIds: number[] = [];
for (let i = 1; i <= PROJECTS; i += 1) {
  const project = await createProject(dataSource, admin.id, { name: `Bench project ${i}` });
  for (const role of ['requirements', 'designer', 'reviewer'] as const) await addMember(dataSource, admin, project.id, people[role].id, role);
  projectIds.push(project.id);
}

// --- The records, by SQL -------------------------------------------------------------------------
const seeded = performance.now();
const firstProject = projectIds[0];
const { requirements: author, designer, reviewer } = people;
await dataSource.transaction(async (manager) => {
  // Spec s (1-based) in project (s mod PROJECTS); version 1 at second s.
  await manager.query(
    `${COPIES} INSERT INTO spec (project_id, title, latest_version, created_by_id, created_at, updated_at)
     SELECT ? + copy.n % ?, 'Bench spec ' || copy.n, 1, ?, ${STAMP('copy.n')}, ${STAMP('copy.n')} FROM copy`,
    [SPECS, firstProject, PROJECTS, author.id],
  );
  await manager.query(
    `INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at) SELECT id, 1, title, '{}', created_by_id, created_at FROM spec`,
  );
  await manager.query(`INSERT INTO ranking (content_hash, result, created_at) VALUES ('bench-waiting-stand-in', '{}', ${STAMP('0')})`);
  // Proposal n ranks version 1 of spec (n mod SPECS) + 1, asked for by the designer at second SPECS + n, last changed 30 s later.
  await manager.query(
    `${COPIES} INSERT INTO proposal (project_id, spec_id, spec_version_id, engine_version, ruleset_version, ranking_id, recommended_topology, status, created_by_id, created_at, updated_at)
     SELECT spec.project_id, spec.id, spec_version.id, 'bench', 'bench', (SELECT id FROM ranking), 'wilson', ${STATUS}, ?, ${STAMP(`${SPECS} + copy.n`)}, ${STAMP(`${SPECS} + copy.n + CASE WHEN copy.n % 20 < 2 THEN 0 ELSE 30 END`)}
     FROM copy JOIN spec ON spec.id = (SELECT min(id) FROM spec) + copy.n % ? JOIN spec_version ON spec_version.spec_id = spec.id AND spec_version.version = 1`,
    [PROPOSALS, designer.id, SPECS],
  );
  // Every proposal that got past a decision has one, by the designer; those a reviewer saw have one review.
  await manager.query(
    `INSERT INTO decision (proposal_id, kind, topology, design, evaluation, reason, decided_by_id, created_at, engine_version, ruleset_version)
     SELECT id, 'accept', 'wilson', '{}', NULL, NULL, ?, updated_at, 'bench', 'bench' FROM proposal WHERE status IN ('decided', 'returned', 'approved')`,
    [designer.id],
  );
  await manager.query(
    `INSERT INTO review (proposal_id, decision_id, verdict, comment, reviewer_id, created_at, verification_job_id, stale_verification_accepted)
     SELECT p.id, d.id, CASE p.status WHEN 'approved' THEN 'approve' ELSE 'return' END, NULL, ?, p.updated_at, NULL, 0 FROM proposal p JOIN decision d ON d.proposal_id = p.id WHERE p.status IN ('returned', 'approved')`,
    [reviewer.id],
  );
  // One spec in REVISED_EVERY gets a version 2 after its rankings: it waits to be ranked.
  await manager.query(
    `INSERT INTO spec_version (spec_id, version, title, payload, created_by_id, created_at) SELECT id, 2, title, '{}', created_by_id, ${STAMP(`${SPECS + PROPOSALS} + id`)} FROM spec WHERE id % ? = 0`,
    [REVISED_EVERY],
  );
  await manager.query(`UPDATE spec SET latest_version = 2, updated_at = ${STAMP(`${SPECS + PROPOSALS} + id`)} WHERE id % ? = 0`, [REVISED_EVERY]);
  // The audit trail: each spec version, each ranking, each decision and review.
  await manager.query(
    `INSERT INTO audit_event (at, actor_id, action, entity_type, entity_id, project_id, proposal_id, before_id, after_id, details)
     SELECT v.created_at, v.created_by_id, CASE v.version WHEN 1 THEN 'spec.created' ELSE 'spec.version-created' END, 'spec', s.id, s.project_id, NULL, NULL, v.id, '{"version":' || v.version || '}' FROM spec_version v JOIN spec s ON s.id = v.spec_id
     UNION ALL SELECT created_at, created_by_id, 'proposal.ranked', 'proposal', id, project_id, id, NULL, id, '{"status":"ranked"}' FROM proposal
     UNION ALL SELECT d.created_at, d.decided_by_id, 'proposal.decided', 'decision', d.id, p.project_id, p.id, NULL, d.id, '{"kind":"accept","topology":"wilson"}' FROM decision d JOIN proposal p ON p.id = d.proposal_id
     UNION ALL SELECT r.created_at, r.reviewer_id, CASE r.verdict WHEN 'approve' THEN 'proposal.approved' ELSE 'proposal.returned' END, 'review', r.id, p.project_id, p.id, r.decision_id, r.id, '{}' FROM review r JOIN proposal p ON p.id = r.proposal_id
     ORDER BY 1`,
  );
});
await dataSource.query('ANALYZE');
const seedSeconds = (performance.now() - seeded) / 1000;
const [{ n: storedProposals }] = await dataSource.query('SELECT count(*) AS n FROM proposal');
const [{ n: events }] = await dataSource.query('SELECT count(*) AS n FROM audit_event');

// --- Over HTTP, signed in, one connection (keep-alive), sequential requests ----------------------
const app = createApp({ dataSource, sessionSecret: 'bench-session-secret-0123456789abcdef', ruleSet, log: () => undefined });
const server = http.createServer(app);
await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
const base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });

interface Answer {
  status: number;
  body: string;
  cookies: string[];
}
function send(method: 'GET' | 'POST', path: string, headers: Record<string, string>, json?: unknown): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const request = http.request(`${base}${path}`, { method, agent, headers: json === undefined ? headers : { ...headers, 'content-type': 'application/json' } }, (response) => {
      let body = '';
      response.setEncoding('utf8');
      response.on('data', (chunk: string) => (body += chunk));
      response.on('end', () => resolve({ status: response.statusCode ?? 0, body, cookies: (response.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]) }));
    });
    request.on('error', reject);
    request.end(json === undefined ? undefined : JSON.stringify(json));
  });
}
async function signIn(user: PublicUser): Promise<Record<string, string>> {
  const csrf = await send('GET', '/api/auth/csrf', {});
  const login = await send('POST', '/api/auth/login', { 'x-csrf-token': (JSON.parse(csrf.body) as { token: string }).token, cookie: csrf.cookies.join('; ') }, { email: user.email, password: PASSWORD });
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${login.body}`);
  return { cookie: login.cookies.join('; ') };
}

/** Median of RUNS sequential requests after a warm-up, and of the service call alone. */
async function latency(path: string, session: Record<string, string>, service: () => Promise<unknown>) {
  const check = await send('GET', path, session);
  if (check.status !== 200) throw new Error(`${path}: ${check.status} ${check.body}`);
  for (let i = 0; i < 5; i += 1) await send('GET', path, session);
  const httpMs: number[] = [];
  const serviceMs: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    let started = performance.now();
    await send('GET', path, session);
    httpMs.push(performance.now() - started);
    started = performance.now();
    await service();
    serviceMs.push(performance.now() - started);
  }
  return { http: median(httpMs), service: median(serviceMs), body: JSON.parse(check.body) as Record<string, unknown> };
}
const verdict = (value: number) => (value <= TARGET_MS ? `target ≤ ${TARGET_MS} ms: met` : `target ≤ ${TARGET_MS} ms: NOT MET`);

console.log(`Longtail waiting-list and activity benchmark — SQLite (better-sqlite3), Node ${process.version}`);
console.log(`${Number(storedProposals).toLocaleString('en')} proposals in ${PROJECTS} projects over ${SPECS.toLocaleString('en')} specs, ${Number(events).toLocaleString('en')} audit events (seeded by SQL in ${seedSeconds.toFixed(1)} s)`);
console.log(`1-minute load average ${loadavg()[0].toFixed(1)} at the start on 2 shared cores (the figures grow with it)`);
console.log(`medians of ${RUNS} sequential requests on one connection (HTTP) and of the service call alone; ${PAGE_SIZE} a page\n`);

const worst: number[] = [];
for (const role of ['designer', 'reviewer', 'requirements'] as const) {
  const person = people[role];
  const session = await signIn(person);
  const counts = await latency('/api/waiting/counts', session, () => waitingCounts(dataSource, person));
  const waiting = counts.body.counts as Record<WaitingKind, number>;
  console.log(`${person.displayName} (${role} in all ${PROJECTS} projects): ${WAITING_KINDS.map((kind) => `${kind} ${waiting[kind]}`).join(', ')}`);
  row('  counts (navigation) (HTTP / service)', `${ms(counts.http)} / ${ms(counts.service)}`, verdict(counts.http));
  worst.push(counts.http);
  for (const kind of counts.body.kinds as WaitingKind[]) {
    const page = await latency(`/api/waiting?kind=${kind}&page=1&pageSize=${PAGE_SIZE}`, session, () => listWaiting(dataSource, person, { kind, page: 1, pageSize: PAGE_SIZE }));
    row(`  list "${kind}", first page (HTTP / service)`, `${ms(page.http)} / ${ms(page.service)}`, verdict(page.http));
    worst.push(page.http);
  }
}
row('slowest waiting-list request (HTTP median)', ms(Math.max(...worst)), verdict(Math.max(...worst)));

console.log(`\nActivity of one project, first page of ${PAGE_SIZE} (the events the filter keeps beside each)`);
const session = await signIn(designer);
const activityOf = (query: string, filter: { actor?: number; kind?: 'decisions' }) =>
  latency(`/api/projects/${firstProject}/activity?pageSize=${PAGE_SIZE}${query}`, session, () => listActivity(dataSource, designer, firstProject, { page: 1, pageSize: PAGE_SIZE, ...filter }));
for (const [name, query, filter] of [
  ['unfiltered', '', {}],
  ['one person (the reviewer)', `&actor=${reviewer.id}`, { actor: reviewer.id }],
  ['one kind (decisions)', '&kind=decisions', { kind: 'decisions' as const }],
] as const) {
  const page = await activityOf(query, filter);
  row(`  ${name} (HTTP / service)`, `${ms(page.http)} / ${ms(page.service)}`, `${Number(page.body.total).toLocaleString('en')} events`);
}

console.log(`\ntotal ${((performance.now() - totalStart) / 1000).toFixed(0)} s; 1-minute load average ${loadavg()[0].toFixed(1)} at the end`);
agent.destroy();
server.closeAllConnections();
await new Promise((resolve) => server.close(resolve));
app.closeApp();
await app.enginePool.release();
await dataSource.destroy();
rmSync(dir, { recursive: true, force: true });
