/**
 * The one search (GET /api/search): what it finds (projects by name, specs by title and by any
 * field value with its unit, proposals by number, state and tail, people by name), only among
 * what the person may see (another project's records and people never appear, whatever the
 * query); the index following every write (a spec's new version, a proposal's state, an account
 * renamed); hostile queries read as words (FTS5 and tsquery operators, quotes, SQL fragments,
 * very long text), and stored text handed back as text; the migration's backfill indexing what
 * the write paths index. On SQLite, and on PostgreSQL in the api-postgres project.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { SearchAnswer, SearchHit, SearchKind } from '#shared/api/search';
import { topologyName } from '#shared/engine/topologies';
import { SearchIndex1796100000000 } from '../../api/migrations/1796100000000-search-index';
import { addMember } from '../../api/services/projects.service';
import { decide, review } from '../../api/services/proposals.service';
import { createSpec, updateSpec } from '../../api/services/specs.service';
import { createUser, type PublicUser } from '../../api/services/users.service';
import { buildApiApp, csrfClient, signInAs, specPayload, TEST_PASSWORD, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
const clients = {} as Record<'admin' | 'designer' | 'designer2' | 'outsider' | 'loner', ApiClient>;
const projects = {} as Record<'own' | 'other' | 'markup', number>;
const specs = {} as Record<'a' | 'b' | 'other', number>;
const proposals = {} as Record<'ranked' | 'decided' | 'other', number>;
const people = {} as Record<'outsider' | 'loner', PublicUser>;
let recommended = '';

/** The invented test spec with a title and some fields changed. */
const payload = (title: string, changes: Record<string, unknown> = {}) => ({ ...specPayload(), title, ...changes });
const cmrr = (minDb: number) => ({ cmrr: { minDb, atFrequencyHz: 400, marginDb: 3, minYieldPercent: 95 } });

beforeAll(async () => {
  api = await buildApiApp();
  const { dataSource, users, ruleSet } = api;
  projects.own = (await api.createProject(undefined, 'Ostrander bridge bench')).id;
  projects.other = (await api.createProject(['designer2', 'reviewer2'], 'Harrowgate covert line')).id;
  people.outsider = await createUser(dataSource, null, { email: 'wendeline@tests.longtail.test', displayName: 'Wendeline Qorvath', role: 'member', password: TEST_PASSWORD });
  await addMember(dataSource, users.admin, projects.other, people.outsider.id, 'requirements');
  people.loner = await createUser(dataSource, null, { email: 'loner@tests.longtail.test', displayName: 'Ludovic Amberline', role: 'member', password: TEST_PASSWORD });

  specs.a = (await api.createSpec(projects.own, { payload: payload('Ostrander rev A — load cell pair', { ...cmrr(71), sourceResistanceOhm: 4700 }) })).id;
  specs.b = (await api.createSpec(projects.own, { payload: payload('Ostrander rev B — spare channel', cmrr(74)) })).id;
  const otherTitle = 'Harrowgate rev C — covert receiver';
  specs.other = (await createSpec(dataSource, people.outsider, projects.other, { title: otherTitle, payload: payload(otherTitle, cmrr(71)) })).id;

  const ranked = await api.createProposal(specs.a);
  proposals.ranked = ranked.id;
  recommended = String(ranked.result.recommended);
  proposals.decided = (await api.createProposal(specs.a)).id;
  await decide(dataSource, users.designer, proposals.decided, { kind: 'accept' }, ruleSet);
  proposals.other = (await api.createProposal(specs.other, 'designer2')).id;

  for (const key of ['admin', 'designer', 'designer2'] as const) clients[key] = await api.agentFor(key);
  for (const key of ['outsider', 'loner'] as const) {
    clients[key] = await csrfClient(api.app);
    expect((await signInAs(clients[key], people[key].email, TEST_PASSWORD)).status).toBe(200);
  }
}, 120_000);

afterAll(() => api?.close());

async function searchAs(client: ApiClient, q: string, extra: Record<string, string> = {}): Promise<SearchAnswer> {
  const response = await client.get(`/api/search?${new URLSearchParams({ q, ...extra })}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body;
}

const plain = (pieces: { text: string }[] | null) => (pieces ?? []).map((p) => p.text).join('');
const marked = (pieces: { text: string; marked: boolean }[] | null) => (pieces ?? []).filter((p) => p.marked).map((p) => p.text);
const hits = (answer: SearchAnswer, kind: SearchKind): SearchHit[] => answer.groups.find((g) => g.kind === kind)?.items ?? [];
const ids = (answer: SearchAnswer, kind: SearchKind) => hits(answer, kind).map((hit) => hit.id);
/** Every record of the other project (and its only member), by kind: what the designer must never see. */
const others = (): Record<SearchKind, number[]> => ({ project: [projects.other], spec: [specs.other], proposal: [proposals.other], person: [people.outsider.id] });
function expectNothingElsewhere(answer: SearchAnswer): void {
  for (const group of answer.groups) {
    expect(group.items.map((hit) => hit.id)).not.toEqual(expect.arrayContaining(others()[group.kind].slice(0, 1)));
    expect(group.items.every((hit) => hit.project?.id !== projects.other)).toBe(true);
  }
}

describe('GET /api/search: asking', () => {
  test('when nobody is signed in, then 401', async () => {
    expect((await (await api.anonymous()).get('/api/search?q=ostrander')).status).toBe(401);
  });

  test.each([
    ['no q', '', '?q'],
    ['an empty q', '?q=', '?q'],
    ['a q of 10,000 characters', `?q=${'a'.repeat(10_000)}`, '?q'],
    ['a q of 201 characters', `?q=${'b'.repeat(201)}`, '?q'],
    ['q twice', '?q=a&q=b', '?q'],
    ['an unknown kind', '?q=ostrander&kind=widget', '?kind'],
    ['101 a page', '?q=ostrander&pageSize=101', '?pageSize'],
    ['page 0', '?q=ostrander&page=0', '?page'],
    ['an unknown field', '?q=ostrander&sort=newest', '?'],
  ])('when the query has %s, then 400 naming the field', async (_what, query, path) => {
    const response = await clients.designer.get(`/api/search${query}`);
    expect(response.status).toBe(400);
    expect(response.body.details.map((d: { path: string }) => d.path).join(' ')).toContain(path);
  });
});

describe('GET /api/search: what it finds', () => {
  test('when a designer searches a project word, then its project, both specs and both proposals come grouped with their counts', async () => {
    const answer = await searchAs(clients.designer, 'Ostrander');
    expect(answer.words).toEqual(['ostrander']);
    expect(answer.counts).toEqual({ project: 1, spec: 2, proposal: 2, person: 0 });
    expect(answer.groups.map((g) => g.kind)).toEqual(['project', 'spec', 'proposal']);
    expect(ids(answer, 'project')).toEqual([projects.own]);
    expect(ids(answer, 'spec').sort()).toEqual([specs.a, specs.b].sort());
    expect(ids(answer, 'proposal').sort()).toEqual([proposals.ranked, proposals.decided].sort());
    expect(hits(answer, 'spec')[0].project).toEqual({ id: projects.own, name: 'Ostrander bridge bench' });
    expect(marked(hits(answer, 'project')[0].title)).toEqual(['Ostrander']);
  });

  test('when the last word is still being typed, then it finds the words it starts; once a blank follows it, only the whole word', async () => {
    expect((await searchAs(clients.designer, 'ostran')).counts.spec).toBe(2);
    expect((await searchAs(clients.designer, 'ostran ')).counts.spec).toBe(0);
    expect((await searchAs(clients.designer, 'OSTRANDER spare')).groups.flatMap((g) => g.items.map((h) => `${h.kind}:${h.id}`))).toEqual([`spec:${specs.b}`]);
  });

  test('when a designer searches "71 dB", then the spec whose minimum CMRR is 71 dB is found, its field and value marked; the 74 dB spec is not', async () => {
    const answer = await searchAs(clients.designer, '71 dB');
    expect(answer.counts).toEqual({ project: 0, spec: 1, proposal: 0, person: 0 });
    const [hit] = hits(answer, 'spec');
    expect(hit.id).toBe(specs.a);
    expect(plain(hit.excerpt)).toBe('Minimum CMRR: 71 dB');
    expect(marked(hit.excerpt)).toEqual(['71 dB']);
  });

  test('when a quantity is written with its prefix and unit symbol ("4.7 kΩ", "4.7 kΩ" with the ohm sign), then the spec with a 4,700 Ω source resistance is found', async () => {
    for (const q of ['4.7 kΩ', '4.7 k\u2126', 'source resistance 4.7']) expect(ids(await searchAs(clients.designer, q), 'spec'), q).toEqual([specs.a]);
    // 4.7 is one number: not any 4 and any 7.
    expect((await searchAs(clients.designer, '4 7 kΩ')).counts.spec).toBe(0);
  });

  test('when a designer searches a proposal number, then that proposal comes first, titled with its number and spec', async () => {
    const answer = await searchAs(clients.designer, `#${proposals.decided}`);
    const [first] = hits(answer, 'proposal');
    expect(first.id).toBe(proposals.decided);
    expect(plain(first.title)).toBe(`#${proposals.decided} Ostrander rev A — load cell pair`);
    expect(first.state).toBe('decided');
  });

  test('when a designer searches a state in the app’s words or the recommended tail’s name, then the proposals in it are found', async () => {
    const waiting = await searchAs(clients.designer, 'awaiting review');
    expect(ids(waiting, 'proposal')).toEqual([proposals.decided]);
    expect(plain(hits(waiting, 'proposal')[0].excerpt)).toBe('State: Awaiting review (decided)');
    expect(ids(await searchAs(clients.designer, 'awaiting decision'), 'proposal')).toEqual([proposals.ranked]);
    const byTail = await searchAs(clients.designer, topologyName(recommended));
    expect(ids(byTail, 'proposal').sort()).toEqual([proposals.ranked, proposals.decided].sort());
  });

  test('when the designer searches people, then those who share a project are found with it, and they find themselves', async () => {
    const answer = await searchAs(clients.designer, 'test reviewer2');
    expect(ids(answer, 'person')).toEqual([api.users.reviewer2.id]);
    expect(hits(answer, 'person')[0].project).toEqual({ id: projects.own, name: 'Ostrander bridge bench' });
    expect(ids(await searchAs(clients.designer, 'test designer'), 'person').sort()).toEqual([api.users.designer.id, api.users.designer2.id].sort());
    expect(ids(await searchAs(clients.loner, 'Amberline'), 'person')).toEqual([people.loner.id]);
  });

  test('when one kind is paged, then its pages hold different hits and every kind keeps its count', async () => {
    const first = await searchAs(clients.designer, 'ostrander', { kind: 'proposal', pageSize: '1', page: '1' });
    const second = await searchAs(clients.designer, 'ostrander', { kind: 'proposal', pageSize: '1', page: '2' });
    const past = await searchAs(clients.designer, 'ostrander', { kind: 'proposal', pageSize: '1', page: '3' });
    expect(first.counts).toEqual({ project: 1, spec: 2, proposal: 2, person: 0 });
    expect(first.groups).toHaveLength(1);
    expect(first.groups[0]).toMatchObject({ kind: 'proposal', total: 2, page: 1, pageSize: 1 });
    expect([...ids(first, 'proposal'), ...ids(second, 'proposal')].sort()).toEqual([proposals.ranked, proposals.decided].sort());
    expect(ids(past, 'proposal')).toEqual([]);
  });
});

describe('GET /api/search: only what the person may see', () => {
  test.each(['Harrowgate', 'covert receiver', 'Qorvath', 'wendeline', '71 dB', 'harrowgate ostrander'])('when the designer searches %s, then nothing of the project they do not belong to appears', async (q) => {
    const answer = await searchAs(clients.designer, q);
    expectNothingElsewhere(answer);
    if (q !== '71 dB') expect(answer.counts).toEqual({ project: 0, spec: 0, proposal: 0, person: 0 });
  });

  test('when the designer searches the other project’s proposal number, then it is not among the hits', async () => {
    expect(ids(await searchAs(clients.designer, `#${proposals.other}`), 'proposal')).not.toContain(proposals.other);
  });

  test('when a member of the other project searches, then they find its records and not the first project’s', async () => {
    const answer = await searchAs(clients.designer2, 'Harrowgate');
    expect(answer.counts).toEqual({ project: 1, spec: 1, proposal: 1, person: 0 });
    expect(ids(await searchAs(clients.outsider, 'ostrander'), 'spec')).toEqual([]);
    expect(ids(await searchAs(clients.outsider, 'test designer'), 'person')).toEqual([api.users.designer2.id]);
  });

  test('when the administrator searches, then every project’s records and everybody are found', async () => {
    expect((await searchAs(clients.admin, '71 dB')).counts.spec).toBe(2);
    expect((await searchAs(clients.admin, 'Harrowgate')).counts).toEqual({ project: 1, spec: 1, proposal: 1, person: 0 });
    expect(ids(await searchAs(clients.admin, 'Amberline'), 'person')).toEqual([people.loner.id]);
  });
});

describe('GET /api/search: hostile queries are words', () => {
  /** [query, whether it holds the word "ostrander" and nothing that is not in the own project's records] */
  const HOSTILE: [string, 'finds' | 'nothing'][] = [
    ['NEAR(ostrander harrowgate)', 'nothing'],
    ['ostrander OR harrowgate', 'nothing'],
    ['title_words:harrowgate', 'nothing'],
    ['{title_words body_words}: harrowgate', 'nothing'],
    ['^harrowgate', 'nothing'],
    ['-ostrander', 'finds'],
    ['ostrander*', 'finds'],
    ['"ostrander', 'finds'],
    ['ostrander"*"', 'finds'],
    ["'harrowgate':* | 'ostrander'", 'nothing'],
    ['!harrowgate & ostrander <-> bench', 'nothing'],
    ["'; DROP TABLE spec; --", 'nothing'],
    ["ostrander') OR ('1'='1", 'nothing'],
    ["%' OR 1=1 --", 'nothing'],
    ['\\ostrander\\', 'finds'],
    ['ostrander\u0000', 'finds'],
    ['\u202Eostrander\u202C', 'finds'],
    ['ostrander 🦩', 'finds'],
    ['*', 'nothing'],
    ['""', 'nothing'],
    [':*', 'nothing'],
    ['a'.repeat(200), 'nothing'],
    [`${'ostrander '.repeat(19)}ostrander`, 'finds'],
    ['ostrander AND NOT harrowgate', 'nothing'],
  ];

  test.each(HOSTILE.map(([q, outcome]) => [q.length > 60 ? `${q.slice(0, 40)}… (${q.length} characters)` : q, q, outcome] as const))('when the designer searches %s, then 200 and only what the words find', async (_title, q, outcome) => {
    const before = await api.dataSource.query('SELECT (SELECT count(*) FROM spec) AS specs, (SELECT count(*) FROM search_entry) AS entries');
    const answer = await searchAs(clients.designer, q);
    expectNothingElsewhere(answer);
    if (outcome === 'finds') expect(ids(answer, 'spec').sort()).toEqual([specs.a, specs.b].sort());
    else expect(answer.groups.flatMap((g) => g.items)).toEqual([]);
    expect(await api.dataSource.query('SELECT (SELECT count(*) FROM spec) AS specs, (SELECT count(*) FROM search_entry) AS entries')).toEqual(before);
  });

  test('when a stored name holds markup characters, then the hit hands it back as the same text in pieces, the matched words marked', async () => {
    const name = '<b>Ostrander</b> & "test" <script>alert(1)</script>';
    const project = await api.createProject(['designer'], name);
    const answer = await searchAs(clients.designer, 'script alert');
    const [hit] = hits(answer, 'project');
    expect(hit.id).toBe(project.id);
    expect(plain(hit.title)).toBe(name);
    expect(marked(hit.title)).toEqual(['script', 'alert', 'script']);
  });
});

describe('GET /api/search: the index follows every write', () => {
  test('when a spec gets a new version with another value and title, then the new ones find it and the old ones no longer do', async () => {
    const { dataSource, users } = api;
    await updateSpec(dataSource, users.requirements, specs.a, { title: 'Ostrander rev A2 — load cell pair', payload: payload('Ostrander rev A2 — load cell pair', cmrr(68)), note: 'Tighter rejection for the long cable.' });
    expect(ids(await searchAs(clients.designer, '68 dB'), 'spec')).toEqual([specs.a]);
    expect((await searchAs(clients.designer, '71 dB')).counts.spec).toBe(0);
    expect(ids(await searchAs(clients.designer, 'A2'), 'spec')).toEqual([specs.a]);
    const byNote = hits(await searchAs(clients.designer, 'long cable'), 'spec');
    expect(plain(byNote[0].excerpt)).toBe('Note: Tighter rejection for the long cable.');
  });

  test('when a decision is sent back, then the proposal is found by its new state and not by the old one', async () => {
    await review(api.dataSource, api.users.reviewer, proposals.decided, { verdict: 'return', comment: 'Show the cold corner.' });
    expect(ids(await searchAs(clients.designer, 'returned to designer'), 'proposal')).toEqual([proposals.decided]);
    expect(ids(await searchAs(clients.designer, 'awaiting review'), 'proposal')).toEqual([]);
    expect(hits(await searchAs(clients.designer, `#${proposals.decided}`), 'proposal')[0].state).toBe('returned');
  });

  test('when an administrator renames an account, then the new name finds the person and the old one does not', async () => {
    const response = await clients.admin.patch(`/api/users/${people.outsider.id}`).send({ displayName: 'Wendeline Quist' });
    expect(response.status).toBe(200);
    expect(ids(await searchAs(clients.admin, 'Quist'), 'person')).toEqual([people.outsider.id]);
    expect((await searchAs(clients.admin, 'Qorvath')).counts.person).toBe(0);
  });

  test('when a new project is made, then it is found by its name and description', async () => {
    const response = await clients.admin.post('/api/projects').send({ name: 'Pellwick hydrophone', description: 'Towed array front end.' });
    expect(response.status).toBe(201);
    const answer = await searchAs(clients.admin, 'towed array');
    expect(ids(answer, 'project')).toEqual([response.body.id]);
    expect(plain(hits(answer, 'project')[0].excerpt)).toBe('Towed array front end.');
  });
});

describe('the search-index migration', () => {
  test('when the index is dropped and made again from the stored records, then every search answers exactly as the write paths left it', async () => {
    const queries = ['ostrander', '68 dB', 'returned to designer', 'test', 'Harrowgate', 'Quist', 'script', '4.7 kΩ'];
    const answers = async () => Promise.all(queries.flatMap((q) => [searchAs(clients.designer, q), searchAs(clients.admin, q)]));
    const before = await answers();
    const runner = api.dataSource.createQueryRunner();
    try {
      const migration = new SearchIndex1796100000000();
      await migration.down(runner);
      await migration.up(runner);
    } finally {
      await runner.release();
    }
    expect(await answers()).toEqual(before);
  });
});
