/**
 * `npm run bench`, part: the one search (not a test: nothing here passes or fails). On SQLite, in
 * a temp dir, the waiting list's team (tests/bench/helpers/team-records.ts: 10,000 proposals over
 * 12 projects and 1,200 specs), each spec's versions given a whole document (the API tests'
 * invented spec, its minimum CMRR 60 to 99 dB by spec), then the whole index built as the
 * migration builds it. Then the medians of GET /api/search as the navigation asks (every kind's
 * first 5) and as the results page pages one kind (20), for a designer who belongs to every
 * project and for the administrator, over HTTP on one connection and as the service call alone,
 * beside the ≤ 50 ms target. The queries run from one rare word to words every record holds.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadRuleSet } from '../../rules/index';
import { createApp } from '../../api/app';
import { openDatabase } from '../../api/data-source';
import { search } from '../../api/services/search.service';
import { rebuildSearchIndex } from '../../api/services/search-index.service';
import type { SearchKind } from '#shared/api/search';
import { specPayload } from '../helpers/api-app';
import { httpTiming, ms, row, verdict } from './helpers/http-timing';
import { seedTeamRecords } from './helpers/team-records';

const PROPOSALS = 10_000;
const PROJECTS = 12;
const SPECS = 1_200;
const TARGET_MS = 50;
const PASSWORD = 'bench-password-0815';
/** As the navigation's box asks (every kind's first few) and as the results page asks for one kind. */
const BOX_PAGE = 5;
const PAGE_SIZE = 20;

/** Queries and what they find among the seeded records. */
const QUERIES: { q: string; what: string; kind: SearchKind }[] = [
  { q: 'Bench spec 617', what: 'one spec title (and its proposals)', kind: 'spec' },
  { q: '#4321', what: 'one proposal number (as a prefix: 4321x too)', kind: 'proposal' },
  { q: '87 dB', what: 'a field value: a thirtieth of the specs', kind: 'spec' },
  { q: 'awaiting review', what: 'a state: 500 proposals', kind: 'proposal' },
  { q: 'approved', what: 'a state: 6,500 proposals', kind: 'proposal' },
  { q: 'bench', what: 'a word of every record (11,200 and more)', kind: 'proposal' },
];

const totalStart = performance.now();
const dir = mkdtempSync(join(tmpdir(), 'longtail-search-bench-'));
const dataSource = await openDatabase(join(dir, 'bench.sqlite'));
const ruleSet = await loadRuleSet();
const { admin, people, seedSeconds } = await seedTeamRecords(dataSource, { proposals: PROPOSALS, projects: PROJECTS, specs: SPECS, revisedEvery: 5, password: PASSWORD });

// Whole spec documents (the seeding writes empty ones), one minimum CMRR per spec, then the index.
const indexed = performance.now();
await dataSource.query(`UPDATE spec_version SET payload = json_set(?, '$.cmrr.minDb', 60 + spec_id % 40, '$.title', title)`, [JSON.stringify(specPayload())]);
await dataSource.transaction((manager) => rebuildSearchIndex(manager));
await dataSource.query('ANALYZE');
const indexSeconds = (performance.now() - indexed) / 1000;
const [{ n: entries }] = await dataSource.query('SELECT count(*) AS n FROM search_entry');

const app = createApp({ dataSource, sessionSecret: 'bench-session-secret-0123456789abcdef', ruleSet, log: () => undefined });
const timing = await httpTiming(app);

console.log(`Longtail search benchmark — SQLite (better-sqlite3, FTS5), Node ${process.version}`);
console.log(`${PROPOSALS.toLocaleString('en')} proposals in ${PROJECTS} projects over ${SPECS.toLocaleString('en')} specs (seeded by SQL in ${seedSeconds.toFixed(1)} s); ${Number(entries).toLocaleString('en')} index entries built in ${indexSeconds.toFixed(1)} s`);
console.log(`1-minute load average ${loadavg()[0].toFixed(1)} at the start on 2 shared cores (the figures grow with it)`);
console.log(`medians of ${timing.runs} sequential requests on one connection (HTTP) and of the service call alone\n`);

const worst: number[] = [];
for (const [who, person] of [
  ['designer in every project', people.designer],
  ['administrator (sees everything)', admin],
] as const) {
  const session = await timing.signIn(person, PASSWORD);
  console.log(`${person.displayName} (${who})`);
  for (const { q, what, kind } of QUERIES) {
    const box = await timing.latency(`/api/search?${new URLSearchParams({ q, pageSize: String(BOX_PAGE) })}`, session, () => search(dataSource, person, { q, page: 1, pageSize: BOX_PAGE }));
    const counts = box.body.counts as Record<SearchKind, number>;
    row(`  "${q}": every kind, first ${BOX_PAGE} (HTTP / service)`, `${ms(box.http)} / ${ms(box.service)}`, verdict(box.http, TARGET_MS));
    console.log(`      ${what}; found: ${Object.entries(counts).map(([k, n]) => `${k} ${n.toLocaleString('en')}`).join(', ')}`);
    const page = await timing.latency(`/api/search?${new URLSearchParams({ q, kind, page: '2', pageSize: String(PAGE_SIZE) })}`, session, () =>
      search(dataSource, person, { q, kind, page: 2, pageSize: PAGE_SIZE }),
    );
    row(`  "${q}": ${kind}s, page 2 of ${PAGE_SIZE} (HTTP / service)`, `${ms(page.http)} / ${ms(page.service)}`, verdict(page.http, TARGET_MS));
    worst.push(box.http, page.http);
  }
}
row('slowest search request (HTTP median)', ms(Math.max(...worst)), verdict(Math.max(...worst), TARGET_MS));

console.log(`\ntotal ${((performance.now() - totalStart) / 1000).toFixed(0)} s; 1-minute load average ${loadavg()[0].toFixed(1)} at the end`);
await timing.close();
app.closeApp();
await app.enginePool.release();
await dataSource.destroy();
rmSync(dir, { recursive: true, force: true });
