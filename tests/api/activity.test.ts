/**
 * A project's activity (GET /api/projects/:id/activity) and its CSV export (…/activity.csv): the
 * audit events of the project's specs and proposals, newest first on the page and oldest first in
 * the file, filtered by person and by kind, paged; the project's other events (members, device
 * library) and other projects' events left out; user text in the file kept as data.
 */
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { uploadDeviceModels } from '../../api/services/devices.service';
import { decide, review } from '../../api/services/proposals.service';
import { updateSpec } from '../../api/services/specs.service';
import type { ActivityEvent } from '#shared/api/activity';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let admin: ApiClient;
let designer: ApiClient;
let reviewer: ApiClient;
const projects = {} as Record<'north' | 'elsewhere' | 'bulk', number>;
let specId = 0;
let hostileSpecId = 0;
let proposalId = 0;
let secondProposalId = 0;

/** A reason and a comment a spreadsheet would run as formulas if written as they are. */
const REASON = '+cmd|" /C calc"!A0 — the Wilson mirror keeps more headroom at −40 °C';
const COMMENT = '=HYPERLINK("http://example.test","rails")\nCheck the rails first.';
const HOSTILE_TITLE = '@SUM(1,2) — Quillon north spare';
/** Events written straight into the bulk project: more than the export's batch of 500, twice over. */
const BULK_EVENTS = 1_203;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['admin', 'requirements', 'designer', 'reviewer', 'designer2'] });
  const { users, dataSource, ruleSet } = api;
  projects.north = (await api.createProject(['requirements', 'designer', 'reviewer'], 'Quillon north bench')).id;
  projects.elsewhere = (await api.createProject(['designer2'], 'Quillon elsewhere')).id;
  projects.bulk = (await api.createProject(['requirements', 'designer'], 'Quillon bulk')).id;
  // North, in this order: spec v1, ranking, v2 (closes the first ranking), ranking, a choice with a reason, a send-back; then a library upload (not activity).
  const spec = await api.createSpec(projects.north);
  specId = spec.id;
  proposalId = (await api.createProposal(spec.id)).id;
  await updateSpec(dataSource, users.requirements, spec.id, { title: 'Quillon sensor head — thermopile input pair', payload: { ...specPayload(), outputSwingVpp: 2 }, note: 'Less swing.' });
  secondProposalId = (await api.createProposal(spec.id)).id;
  await decide(dataSource, users.designer, secondProposalId, { kind: 'choose', topology: 'wilson', reason: REASON }, ruleSet);
  await review(dataSource, users.reviewer, secondProposalId, { verdict: 'return', comment: COMMENT });
  hostileSpecId = (await api.createSpec(projects.north, { title: HOSTILE_TITLE, payload: { ...specPayload(), title: HOSTILE_TITLE } })).id;
  await uploadDeviceModels(dataSource, users.designer, projects.north, { bytes: Buffer.from('.model FH-ACT NPN (IS=6f BF=140 VAF=70)\n'), originalName: 'act.lib' });
  // Elsewhere: an event nobody in north may see, written by no one (as the migration that closed older rankings wrote its events).
  await dataSource.getRepository(AuditEventEntity).save({ at: new Date().toISOString(), actorId: null, action: 'proposal.ranked', entityType: 'proposal', entityId: 999, projectId: projects.elsewhere, proposalId: 999, beforeId: null, afterId: 999, details: {} });
  // Bulk: one spec, then many versions' events written straight into the trail.
  const bulkSpec = await api.createSpec(projects.bulk, { title: 'Quillon bulk channel', payload: { ...specPayload(), title: 'Quillon bulk channel' } });
  const at = new Date().toISOString();
  await dataSource.getRepository(AuditEventEntity).save(
    Array.from({ length: BULK_EVENTS }, (_, i) => ({ at, actorId: users.requirements.id, action: 'spec.version-created', entityType: 'spec', entityId: bulkSpec.id, projectId: projects.bulk, proposalId: null, beforeId: null, afterId: null, details: { version: i + 2 } })),
    { chunk: 200 },
  );
  admin = await api.agentFor('admin');
  designer = await api.agentFor('designer');
  reviewer = await api.agentFor('reviewer');
}, 120_000);

afterAll(() => api?.close());

async function activity(client: ApiClient, projectId: number, query = ''): Promise<{ items: ActivityEvent[]; total: number; page: number; pageSize: number }> {
  const response = await client.get(`/api/projects/${projectId}/activity${query}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body;
}

/** North's spec and proposal events, newest first, as the arrangement wrote them. */
const NORTH_ACTIONS = [
  'spec.created', // the hostile-title spec
  'proposal.returned',
  'proposal.decided',
  'proposal.superseded', // the first ranking, closed by the second
  'proposal.ranked',
  'spec.version-created',
  'proposal.ranked',
  'spec.created',
];

describe('GET /api/projects/:id/activity', () => {
  test('when a member reads it, then the events of the project’s specs and proposals come newest first, without member, library or other projects’ events', async () => {
    const { items, total } = await activity(designer, projects.north);
    expect(items.map((e) => e.action)).toEqual(NORTH_ACTIONS);
    expect(total).toBe(NORTH_ACTIONS.length);
    expect(items.every((e) => e.projectId === projects.north)).toBe(true);
  });

  test('when events are listed, then each names its actor and its spec, and a decision or review carries its reason or comment', async () => {
    const { items } = await activity(designer, projects.north);
    const decided = items.find((e) => e.action === 'proposal.decided')!;
    expect(decided).toMatchObject({ actor: { id: api.users.designer.id, displayName: 'Test designer' }, spec: { id: specId }, proposalId: secondProposalId, records: { decision: { kind: 'choose', topology: 'wilson', reason: REASON } } });
    expect(items.find((e) => e.action === 'proposal.returned')!.records.review).toEqual({ comment: COMMENT });
    expect(items[0]).toMatchObject({ action: 'spec.created', spec: { id: hostileSpecId, title: HOSTILE_TITLE }, actor: { id: api.users.requirements.id } });
    // The first ranking was closed by the designer's asking for the second.
    expect(items.find((e) => e.action === 'proposal.superseded')).toMatchObject({ actor: { id: api.users.designer.id }, proposalId });
  });

  test('when filtered by person, then only that person’s events come, with the matching total', async () => {
    const { items, total } = await activity(designer, projects.north, `?actor=${api.users.designer.id}`);
    expect(items.map((e) => e.action)).toEqual(['proposal.decided', 'proposal.superseded', 'proposal.ranked', 'proposal.ranked']);
    expect(total).toBe(4);
    expect(items.every((e) => e.actor?.id === api.users.designer.id)).toBe(true);
  });

  test.each([
    ['specs', ['spec.created', 'spec.version-created', 'spec.created']],
    ['rankings', ['proposal.superseded', 'proposal.ranked', 'proposal.ranked']],
    ['decisions', ['proposal.decided']],
    ['reviews', ['proposal.returned']],
    ['spice', []],
  ])('when filtered by the kind %s, then only its events come', async (kind, actions) => {
    const { items, total } = await activity(reviewer, projects.north, `?kind=${kind}`);
    expect(items.map((e) => e.action)).toEqual(actions);
    expect(total).toBe(actions.length);
  });

  test('when filtered by person and kind together, then both hold', async () => {
    const { items } = await activity(reviewer, projects.north, `?kind=rankings&actor=${api.users.reviewer.id}`);
    expect(items).toEqual([]);
    expect((await activity(reviewer, projects.north, `?kind=reviews&actor=${api.users.reviewer.id}`)).items.map((e) => e.action)).toEqual(['proposal.returned']);
  });

  test('when paged, then page 2 of 3 holds the fourth to sixth events and the total stays', async () => {
    const second = await activity(designer, projects.north, '?page=2&pageSize=3');
    expect(second).toMatchObject({ total: NORTH_ACTIONS.length, page: 2, pageSize: 3 });
    expect(second.items.map((e) => e.action)).toEqual(NORTH_ACTIONS.slice(3, 6));
  });

  test('when someone outside the project asks, then 404; the administrator reads every project', async () => {
    expect((await designer.get(`/api/projects/${projects.elsewhere}/activity`)).status).toBe(404);
    expect((await admin.get(`/api/projects/${projects.elsewhere}/activity`).expect(200)).body.items).toMatchObject([{ action: 'proposal.ranked', actorId: null, actor: null }]);
    expect(readCsv((await admin.get(`/api/projects/${projects.elsewhere}/activity.csv`).expect(200)).text)).toMatchObject([{ action: 'proposal.ranked', person: 'the system', person_id: '' }]);
    expect((await (await api.anonymous()).get(`/api/projects/${projects.north}/activity`)).status).toBe(401);
  });

  test.each([
    ['?kind=everything', '?kind'],
    ['?actor=someone', '?actor'],
    ['?actor=0', '?actor'],
    ['?pageSize=101', '?pageSize'],
    ['?since=2026-01-01', '?'],
  ])('when the query is %s, then 400 naming %s', async (query, path) => {
    const response = await designer.get(`/api/projects/${projects.north}/activity${query}`);
    expect(response.status).toBe(400);
    expect(response.body.details.map((d: { path: string }) => d.path).join(' ')).toContain(path);
  });
});

/** The file read by papaparse (RFC 4180), header first. */
function readCsv(text: string): Record<string, string>[] {
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

describe('GET /api/projects/:id/activity.csv', () => {
  test('when downloaded, then one row per event, oldest first, as an attachment with the page’s events in the app’s words', async () => {
    const response = await designer.get(`/api/projects/${projects.north}/activity.csv`).expect(200).expect('content-type', /text\/csv/).expect('content-disposition', /^attachment; filename="?longtail-activity-project-\d+\.csv"?$/);
    const rows = readCsv(response.text);
    expect(rows.map((r) => r.action)).toEqual([...NORTH_ACTIONS].reverse());
    const page = (await activity(designer, projects.north)).items;
    expect(rows.map((r) => Number(r.event_id))).toEqual(page.map((e) => e.id).reverse());
    const decided = rows.find((r) => r.action === 'proposal.decided')!;
    expect(decided).toMatchObject({ person: 'Test designer', kind: 'Decisions', spec_id: String(specId), proposal_id: String(secondProposalId), what: 'decided: chose another ranked option (Wilson mirror)' });
    expect(Date.parse(decided.at_utc)).not.toBeNaN();
    expect(JSON.parse(decided.details_json)).toMatchObject({ kind: 'choose', topology: 'wilson', from: 'ranked', to: 'decided' });
    expect(rows.find((r) => r.action === 'proposal.superseded')!.person).toBe('Test designer');
  });

  test('when user text starts like a formula, then its cell starts with an apostrophe and stays on one line', async () => {
    const rows = readCsv((await designer.get(`/api/projects/${projects.north}/activity.csv`).expect(200)).text);
    const hostile = rows.find((r) => r.spec_id === String(hostileSpecId))!;
    expect(hostile.spec_title).toBe(`'${HOSTILE_TITLE}`);
    // The quoted reason starts with its label, so it is not a formula; the person and titles are one line each.
    expect(rows.find((r) => r.action === 'proposal.decided')!.quoted).toBe(`Reason: ${REASON}`);
    const returned = rows.find((r) => r.action === 'proposal.returned')!;
    expect(returned.quoted).toBe(`Comment: ${COMMENT.replace('\n', ' ')}`);
    for (const row of rows) for (const cell of Object.values(row)) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
  });

  test('when filtered by kind and person, then the file holds the same events as the page', async () => {
    const rows = readCsv((await reviewer.get(`/api/projects/${projects.north}/activity.csv?kind=reviews&actor=${api.users.reviewer.id}`).expect(200)).text);
    expect(rows.map((r) => r.action)).toEqual(['proposal.returned']);
    expect(readCsv((await reviewer.get(`/api/projects/${projects.north}/activity.csv?kind=bench`).expect(200)).text)).toEqual([]);
  });

  test('when the project holds more events than one batch of the export, then every event comes once, in order', async () => {
    const rows = readCsv((await designer.get(`/api/projects/${projects.bulk}/activity.csv`).expect(200)).text);
    expect(rows).toHaveLength(BULK_EVENTS + 1);
    const ids = rows.map((r) => Number(r.event_id));
    expect(ids.every((id, i) => i === 0 || id > ids[i - 1])).toBe(true);
    expect(rows.at(-1)!.what).toBe(`wrote version ${BULK_EVENTS + 1} of the spec`);
  });

  test('when someone outside the project asks, or nobody is signed in, then 404 or 401 and no file', async () => {
    const outside = await designer.get(`/api/projects/${projects.elsewhere}/activity.csv`);
    expect(outside.status).toBe(404);
    expect(outside.headers['content-disposition']).toBeUndefined();
    expect((await (await api.anonymous()).get(`/api/projects/${projects.north}/activity.csv`)).status).toBe(401);
    expect((await designer.get(`/api/projects/${projects.north}/activity.csv?page=2`)).status).toBe(400);
  });
});
