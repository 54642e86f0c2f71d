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
 * Seeding: tests/bench/helpers/team-records.ts (plain SQL, a second or two); timing:
 * tests/bench/helpers/http-timing.ts.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadRuleSet } from '../../rules/index';
import { createApp } from '../../api/app';
import { openDatabase } from '../../api/data-source';
import { listActivity } from '../../api/services/activity.service';
import { listWaiting, waitingCounts } from '../../api/services/waiting.service';
import { WAITING_KINDS, type WaitingKind } from '#shared/workflow/waiting';
import { httpTiming, ms, row, verdict as against } from './helpers/http-timing';
import { seedTeamRecords } from './helpers/team-records';

const PROPOSALS = 10_000;
const PROJECTS = 12;
const SPECS = 1_200;
/** One spec in REVISED_EVERY has a version 2 written after its rankings (its latest version waits to be ranked). */
const REVISED_EVERY = 5;
const PAGE_SIZE = 20;
const TARGET_MS = 50;
const PASSWORD = 'bench-password-0815';

const totalStart = performance.now();
const dir = mkdtempSync(join(tmpdir(), 'longtail-waiting-bench-'));
const dataSource = await openDatabase(join(dir, 'bench.sqlite'));
const ruleSet = await loadRuleSet();
const { people, projectIds, seedSeconds } = await seedTeamRecords(dataSource, { proposals: PROPOSALS, projects: PROJECTS, specs: SPECS, revisedEvery: REVISED_EVERY, password: PASSWORD });
const firstProject = projectIds[0];
const { designer, reviewer } = people;
const [{ n: storedProposals }] = await dataSource.query('SELECT count(*) AS n FROM proposal');
const [{ n: events }] = await dataSource.query('SELECT count(*) AS n FROM audit_event');

// --- Over HTTP, signed in, one connection (keep-alive), sequential requests ----------------------
const app = createApp({ dataSource, sessionSecret: 'bench-session-secret-0123456789abcdef', ruleSet, log: () => undefined });
const timing = await httpTiming(app);
const latency = timing.latency;
const signIn = (user: (typeof people)[keyof typeof people]) => timing.signIn(user, PASSWORD);
const verdict = (value: number) => against(value, TARGET_MS);

console.log(`Longtail waiting-list and activity benchmark — SQLite (better-sqlite3), Node ${process.version}`);
console.log(`${Number(storedProposals).toLocaleString('en')} proposals in ${PROJECTS} projects over ${SPECS.toLocaleString('en')} specs, ${Number(events).toLocaleString('en')} audit events (seeded by SQL in ${seedSeconds.toFixed(1)} s)`);
console.log(`1-minute load average ${loadavg()[0].toFixed(1)} at the start on 2 shared cores (the figures grow with it)`);
console.log(`medians of ${timing.runs} sequential requests on one connection (HTTP) and of the service call alone; ${PAGE_SIZE} a page\n`);

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
await timing.close();
app.closeApp();
await app.enginePool.release();
await dataSource.destroy();
rmSync(dir, { recursive: true, force: true });
