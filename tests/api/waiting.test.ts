/**
 * What waits for a person (GET /api/waiting/counts, GET /api/waiting?kind=): per role, what
 * appears (their projects' items in the state their role acts on, oldest first, with who put each
 * there) and what does not (other projects' items, items already handled, their own decision to
 * review, specs whose latest version is ranked).
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { addMember } from '../../api/services/projects.service';
import { createSpec } from '../../api/services/specs.service';
import { createUser } from '../../api/services/users.service';
import { decide, review, withdraw } from '../../api/services/proposals.service';
import { updateSpec } from '../../api/services/specs.service';
import type { WaitingItem } from '#shared/api/waiting';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
const clients = {} as Record<'admin' | 'requirements' | 'designer' | 'reviewer' | 'designer2', ApiClient>;

/** Projects: two the usual accounts work in, one they do not belong to (only designer2 and reviewer2 do). */
const projects = {} as Record<'north' | 'south' | 'elsewhere', number>;
/** Proposals by the state they are left in. */
const proposals = {} as Record<'ranked' | 'rankedLater' | 'decided' | 'returned' | 'approved' | 'withdrawn' | 'elsewhereRanked' | 'elsewhereDecided' | 'ownDecision', number>;
/** Specs: one never ranked, one ranked on its latest version, one ranked on version 1 then revised, one in the other project. */
const specs = {} as Record<'unranked' | 'ranked' | 'revised' | 'elsewhere', number>;

const payload = (title: string) => ({ ...specPayload(), title });

beforeAll(async () => {
  api = await buildApiApp();
  projects.north = (await api.createProject(undefined, 'Quillon north bench')).id;
  projects.south = (await api.createProject(undefined, 'Quillon south bench')).id;
  projects.elsewhere = (await api.createProject(['designer2', 'reviewer2'], 'Quillon elsewhere')).id;
  const northSpec = await api.createSpec(projects.north, { payload: payload('Quillon north — thermopile pair') });
  const southSpec = await api.createSpec(projects.south, { payload: payload('Quillon south — thermopile pair') });
  const { users, dataSource, ruleSet } = api;
  // The other project's own systems engineer writes its specs: one ranked below, one never.
  const elsewhereAuthor = await createUser(dataSource, null, { email: 'elsewhere-author@tests.longtail.test', displayName: 'Elsewhere author', role: 'member', password: 'tern-lantern-0417-quay' });
  await addMember(dataSource, users.admin, projects.elsewhere, elsewhereAuthor.id, 'requirements');
  const elsewhereSpec = await createSpec(dataSource, elsewhereAuthor, projects.elsewhere, { title: 'Quillon elsewhere — thermopile pair', payload: payload('Quillon elsewhere — thermopile pair') });
  const elsewhereUnranked = await createSpec(dataSource, elsewhereAuthor, projects.elsewhere, { title: 'Quillon elsewhere — spare channel', payload: payload('Quillon elsewhere — spare channel') });
  // Oldest first: the order the lists must keep.
  proposals.ranked = (await api.createProposal(northSpec.id)).id;
  proposals.decided = (await api.createProposal(northSpec.id)).id;
  proposals.returned = (await api.createProposal(southSpec.id)).id;
  proposals.approved = (await api.createProposal(southSpec.id)).id;
  proposals.withdrawn = (await api.createProposal(southSpec.id)).id;
  proposals.ownDecision = (await api.createProposal(southSpec.id)).id;
  proposals.rankedLater = (await api.createProposal(southSpec.id)).id;
  proposals.elsewhereRanked = (await api.createProposal(elsewhereSpec.id, 'designer2')).id;
  proposals.elsewhereDecided = (await api.createProposal(elsewhereSpec.id, 'designer2')).id;
  await decide(dataSource, users.designer, proposals.decided, { kind: 'accept' }, ruleSet);
  await decide(dataSource, users.designer, proposals.returned, { kind: 'accept' }, ruleSet);
  await review(dataSource, users.reviewer, proposals.returned, { verdict: 'return', comment: 'Check the rails at −40 °C first.' });
  await decide(dataSource, users.designer, proposals.approved, { kind: 'accept' }, ruleSet);
  await review(dataSource, users.reviewer, proposals.approved, { verdict: 'approve', comment: 'Fine.' });
  await withdraw(dataSource, users.designer, proposals.withdrawn, { reason: 'Asked for twice.' });
  await decide(dataSource, users.designer2, proposals.elsewhereDecided, { kind: 'accept' }, ruleSet);
  // designer2 decides in the south project, then becomes a reviewer there: the decision waits for the other reviewers, never for them.
  await decide(dataSource, users.designer2, proposals.ownDecision, { kind: 'accept' }, ruleSet);
  await addMember(dataSource, users.admin, projects.south, users.designer2.id, 'reviewer');

  specs.unranked = (await api.createSpec(projects.north, { payload: payload('Quillon north — spare channel') })).id;
  specs.ranked = northSpec.id;
  specs.revised = southSpec.id;
  await updateSpec(dataSource, users.requirements, southSpec.id, { title: 'Quillon south — thermopile pair', payload: { ...payload('Quillon south — thermopile pair'), outputSwingVpp: 2 }, note: 'Less swing.' });
  specs.elsewhere = elsewhereUnranked.id;
  for (const key of ['admin', 'requirements', 'designer', 'reviewer', 'designer2'] as const) clients[key] = await api.agentFor(key);
}, 120_000);

afterAll(() => api?.close());

async function page(client: ApiClient, kind: string, query = ''): Promise<{ items: WaitingItem[]; total: number; page: number; pageSize: number }> {
  const response = await client.get(`/api/waiting?kind=${kind}${query}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body;
}

describe('GET /api/waiting?kind=decide (designers)', () => {
  test('when the designer asks, then the rankings of their projects that wait for a decision come oldest first, with who asked for each', async () => {
    const { items, total } = await page(clients.designer, 'decide');
    expect(items.map((i) => i.proposalId)).toEqual([proposals.ranked, proposals.rankedLater]);
    expect(total).toBe(2);
    expect(items[0]).toMatchObject({ kind: 'decide', project: { id: projects.north, name: 'Quillon north bench' }, spec: { title: 'Quillon north — thermopile pair', version: 1 }, by: { id: api.users.designer.id, displayName: 'Test designer' } });
    expect(Date.parse(items[0].since)).toBeLessThanOrEqual(Date.parse(items[1].since));
  });

  test('when proposals are decided, approved, withdrawn or in a project the designer is not in, then they are not listed', async () => {
    const listed = (await page(clients.designer, 'decide')).items.map((i) => i.proposalId);
    for (const handled of [proposals.decided, proposals.returned, proposals.approved, proposals.withdrawn, proposals.elsewhereRanked]) expect(listed).not.toContain(handled);
  });

  test('when a second page of one is asked for, then it holds the next item and the same total', async () => {
    const second = await page(clients.designer, 'decide', '&page=2&pageSize=1');
    expect(second).toMatchObject({ total: 2, page: 2, pageSize: 1 });
    expect(second.items.map((i) => i.proposalId)).toEqual([proposals.rankedLater]);
  });
});

describe('GET /api/waiting?kind=rework (designers)', () => {
  test('when a reviewer sent a decision back, then it waits for the project’s designers, with the reviewer who sent it and whether the decision was theirs', async () => {
    const designer = await page(clients.designer, 'rework');
    expect(designer.items).toHaveLength(1);
    expect(designer.items[0]).toMatchObject({ proposalId: proposals.returned, by: { id: api.users.reviewer.id }, yours: true });
    const other = await page(await api.agentFor('designer2'), 'rework');
    expect(other.items).toEqual([]);
  });
});

describe('GET /api/waiting?kind=review (reviewers)', () => {
  test('when the reviewer asks, then the decisions of their projects waiting for review come with who decided, the other project’s not', async () => {
    const { items } = await page(clients.reviewer, 'review');
    expect(items.map((i) => i.proposalId)).toEqual([proposals.decided, proposals.ownDecision]);
    expect(items[0].by).toEqual({ id: api.users.designer.id, displayName: 'Test designer' });
    expect(items[1].by?.id).toBe(api.users.designer2.id);
  });

  test('when a reviewer made the decision themselves (before their role changed), then it does not wait for them', async () => {
    const { items, total } = await page(clients.designer2, 'review');
    expect(items.map((i) => i.proposalId)).not.toContain(proposals.ownDecision);
    // designer2 reviews nowhere else: the north project has them as a designer, and the other project's decision is theirs as a designer.
    expect(total).toBe(0);
  });
});

describe('GET /api/waiting?kind=rank (systems engineers)', () => {
  test('when the systems engineer asks, then the specs whose latest version has no ranking come, the revised one at its new version', async () => {
    const { items } = await page(clients.requirements, 'rank');
    expect(items.map((i) => [i.spec.id, i.spec.version, i.proposalId])).toEqual([
      [specs.unranked, 1, null],
      [specs.revised, 2, null],
    ]);
    expect(items[1].by).toEqual({ id: api.users.requirements.id, displayName: 'Test requirements' });
    expect(items.map((i) => i.spec.id)).not.toContain(specs.ranked);
    expect(items.map((i) => i.spec.id)).not.toContain(specs.elsewhere);
  });
});

describe('GET /api/waiting/counts', () => {
  test('when each person asks, then the counts are their lists’ totals and the kinds are those their roles wait on', async () => {
    const expectations: [keyof typeof clients, Record<string, number>, string[]][] = [
      ['designer', { decide: 2, rework: 1, review: 0, rank: 0 }, ['decide', 'rework']],
      ['reviewer', { decide: 0, rework: 0, review: 2, rank: 0 }, ['review']],
      ['requirements', { decide: 0, rework: 0, review: 0, rank: 2 }, ['rank']],
      // designer2 designs in north and elsewhere (elsewhereRanked waits there), reviews in south.
      ['designer2', { decide: 2, rework: 0, review: 0, rank: 0 }, ['decide', 'rework', 'review']],
      // The administrator belongs to no project: nothing waits by role.
      ['admin', { decide: 0, rework: 0, review: 0, rank: 0 }, []],
    ];
    for (const [who, counts, kinds] of expectations) {
      const response = await clients[who].get('/api/waiting/counts').expect(200);
      expect(response.body, who).toEqual({ counts, kinds });
    }
  });

  test('when a designer decides, then the counts move from theirs to the reviewers’', async () => {
    const before = (await clients.reviewer.get('/api/waiting/counts').expect(200)).body.counts.review;
    await clients.designer.post(`/api/proposals/${proposals.rankedLater}/decision`).send({ kind: 'accept' }).expect(201);
    expect((await clients.designer.get('/api/waiting/counts').expect(200)).body.counts.decide).toBe(1);
    expect((await clients.reviewer.get('/api/waiting/counts').expect(200)).body.counts.review).toBe(before + 1);
  });
});

describe('refusals', () => {
  test('when nobody is signed in, then 401', async () => {
    const anonymous = await api.anonymous();
    expect((await anonymous.get('/api/waiting/counts')).status).toBe(401);
    expect((await anonymous.get('/api/waiting?kind=decide')).status).toBe(401);
  });

  test.each([
    ['', '?kind'],
    ['?kind=everything', '?kind'],
    ['?kind=decide&pageSize=101', '?pageSize'],
    ['?kind=decide&page=0', '?page'],
    ['?kind=decide&order=newest', '?'],
  ])('when the query is %s, then 400 naming %s', async (query, path) => {
    const response = await clients.designer.get(`/api/waiting${query}`);
    expect(response.status).toBe(400);
    expect(response.body.details.map((d: { path: string }) => d.path).join(' ')).toContain(path);
  });
});
