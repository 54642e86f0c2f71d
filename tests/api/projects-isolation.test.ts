/**
 * Projects keep to themselves: a record of another project answers exactly what a record that
 * does not exist answers (404, same body), the admin reads everything, roles bound the writes,
 * and nobody reviews their own decision, even after an admin makes them the project's reviewer.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { addMember } from '../../api/services/projects.service';
import { decide } from '../../api/services/proposals.service';
import { updateSpec } from '../../api/services/specs.service';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

/** An id no record has (the in-memory database holds a handful of rows). */
const MISSING_ID = 987654;

let api: TestApi;
/** Quillon: requirements, designer, reviewer. Sallow: the second designer and reviewer. */
let quillon: { id: number };
let sallow: { id: number };
let sallowSpec: { id: number };
let sallowProposal: { id: number };
let quillonProposal: { id: number };
let admin: ApiClient;
let requirements: ApiClient;
let designer: ApiClient;
let reviewer: ApiClient;
let designer2: ApiClient;
let reviewer2: ApiClient;

beforeAll(async () => {
  api = await buildApiApp();
  quillon = await api.createProject(['requirements', 'designer', 'reviewer'], 'Quillon sensor head');
  // The second reviewer writes Sallow's spec as its systems engineer, then becomes its reviewer.
  sallow = await api.createProject(['designer2', 'reviewer2'], 'Sallow tide gauge', { reviewer2: 'requirements' });
  const quillonSpec = await api.createSpec(quillon.id);
  sallowSpec = await api.createSpec(sallow.id, { by: 'reviewer2', title: 'Sallow tide gauge — pressure bridge pair' });
  await updateSpec(api.dataSource, api.users.reviewer2, sallowSpec.id, { title: 'Sallow tide gauge — pressure bridge pair', payload: { ...specPayload(), powerBudgetW: 0.028 } });
  await addMember(api.dataSource, api.users.admin, sallow.id, api.users.reviewer2.id, 'reviewer');
  [quillonProposal, sallowProposal] = await Promise.all([api.createProposal(quillonSpec.id, 'designer'), api.createProposal(sallowSpec.id, 'designer2')]);
  [admin, requirements, designer, reviewer, designer2, reviewer2] = await Promise.all(
    (['admin', 'requirements', 'designer', 'reviewer', 'designer2', 'reviewer2'] as const).map((key) => api.agentFor(key)),
  );
});

afterAll(async () => {
  await api?.close();
});

/** Reads by id, each with the record of the other project and an id nobody has. */
const READS: { what: string; url: (ids: { project: number; spec: number; proposal: number }) => string }[] = [
  { what: 'project', url: (ids) => `/api/projects/${ids.project}` },
  { what: 'members', url: (ids) => `/api/projects/${ids.project}/members` },
  { what: 'spec list', url: (ids) => `/api/projects/${ids.project}/specs` },
  { what: 'proposal list', url: (ids) => `/api/projects/${ids.project}/proposals` },
  { what: 'spec', url: (ids) => `/api/specs/${ids.spec}` },
  { what: 'versions', url: (ids) => `/api/specs/${ids.spec}/versions` },
  { what: 'diff', url: (ids) => `/api/specs/${ids.spec}/diff?from=1&to=2` },
  { what: 'proposal', url: (ids) => `/api/proposals/${ids.proposal}` },
  { what: 'audit', url: (ids) => `/api/proposals/${ids.proposal}/audit` },
];
const sallowIds = () => ({ project: sallow.id, spec: sallowSpec.id, proposal: sallowProposal.id });
const missingIds = { project: MISSING_ID, spec: MISSING_ID, proposal: MISSING_ID };
const MEMBERS_OF_QUILLON = ['requirements', 'designer', 'reviewer'] as const;
const clientOf = (key: (typeof MEMBERS_OF_QUILLON)[number]) => ({ requirements, designer, reviewer })[key];

describe('when a member of one project asks for a record of another project by id', () => {
  const cases = MEMBERS_OF_QUILLON.flatMap((who) => READS.map((read) => [`${who} reads another project's ${read.what}`, who, read] as const));

  test.each(cases)('when %s, then the answer is 404, the same as for an id that does not exist', async (_title, who, read) => {
    // Act
    const other = await clientOf(who).get(read.url(sallowIds()));
    const missing = await clientOf(who).get(read.url(missingIds));

    // Assert
    expect(other.status).toBe(404);
    expect(other.body.code).toMatch(/-not-found$/);
    expect(other.body).toEqual(missing.body);
    expect(missing.status).toBe(404);
  });

  test('when they list projects, then the other project is not in the list', async () => {
    const response = await designer.get('/api/projects');

    expect(response.status).toBe(200);
    expect(response.body.items.map((p: { id: number }) => p.id)).toEqual([quillon.id]);
  });
});

describe('when a member writes to a record of another project, then the answer is 404 and nothing changes', () => {
  const WRITES: [string, () => Promise<{ status: number; body: { code: string } }>][] = [
    ['requirements edits its spec', async () => requirements.put(`/api/specs/${sallowSpec.id}`).send({ title: 'Taken over', payload: specPayload() })],
    ['requirements adds a spec to it', async () => requirements.post(`/api/projects/${sallow.id}/specs`).send({ title: 'Planted', payload: specPayload() })],
    ['designer asks for a proposal on its spec', async () => designer.post(`/api/specs/${sallowSpec.id}/proposals`)],
    ['designer decides its proposal', async () => designer.post(`/api/proposals/${sallowProposal.id}/decision`).send({ kind: 'accept' })],
    ['reviewer reviews its proposal', async () => reviewer.post(`/api/proposals/${sallowProposal.id}/review`).send({ verdict: 'approve' })],
  ];

  test.each(WRITES)('when %s, then 404', async (_title, act) => {
    // Arrange
    const before = await admin.get(`/api/proposals/${sallowProposal.id}/audit`);
    const specsBefore = await admin.get(`/api/projects/${sallow.id}/specs`);

    // Act
    const response = await act();

    // Assert
    expect(response.status).toBe(404);
    expect(response.body.code).toMatch(/-not-found$/);
    expect((await admin.get(`/api/proposals/${sallowProposal.id}/audit`)).body).toEqual(before.body);
    expect((await admin.get(`/api/projects/${sallow.id}/specs`)).body).toEqual(specsBefore.body);
    expect((await admin.get(`/api/specs/${sallowSpec.id}/versions`)).body.items).toHaveLength(2);
  });
});

describe('when the admin asks for any project’s records, then every one answers 200', () => {
  test.each(READS.map((read) => [read.what, read] as const))('when the admin reads the %s of a project they are not a member of, then 200', async (_what, read) => {
    const response = await admin.get(read.url(sallowIds()));

    expect(response.status).toBe(200);
  });

  test('when the admin lists projects, then both are listed', async () => {
    const response = await admin.get('/api/projects');

    expect(response.body.items.map((p: { id: number }) => p.id)).toEqual([quillon.id, sallow.id]);
  });

  test('when the admin asks for an id that does not exist, then 404', async () => {
    const response = await admin.get(`/api/proposals/${MISSING_ID}`);

    expect(response.status).toBe(404);
    expect(response.body.code).toBe('proposal-not-found');
  });
});

describe('when the admin names a record that does not exist, then 404', () => {
  test.each([
    ['PATCH /api/users/:id', 'user-not-found', () => admin.patch(`/api/users/${MISSING_ID}`).send({ displayName: 'Ghost' })],
    ['POST /api/projects/:id/members', 'project-not-found', () => admin.post(`/api/projects/${MISSING_ID}/members`).send({ userId: api.users.designer.id, role: 'designer' })],
    ['DELETE /api/projects/:id/members/:userId (no such project)', 'project-not-found', () => admin.delete(`/api/projects/${MISSING_ID}/members/${api.users.designer.id}`)],
    ['DELETE /api/projects/:id/members/:userId (not a member)', 'member-not-found', () => admin.delete(`/api/projects/${sallow.id}/members/${api.users.designer.id}`)],
    ['GET /api/specs/:id/diff (no such version)', 'spec-version-not-found', () => admin.get(`/api/specs/${sallowSpec.id}/diff?from=1&to=9`)],
  ])('when %s, then 404 %s', async (_title, code, send) => {
    const response = await send();

    expect(response.status).toBe(404);
    expect(response.body.code).toBe(code);
  });
});

describe('when a role steps outside its part of the workflow in its own project, then 403', () => {
  test('when a reviewer edits a spec, then 403 and the spec keeps its version', async () => {
    const spec = (await reviewer.get(`/api/projects/${quillon.id}/specs`)).body.items[0];

    const response = await reviewer.put(`/api/specs/${spec.id}`).send({ title: 'Reviewer edit', payload: specPayload() });

    expect(response.status).toBe(403);
    expect(response.body.code).toBe('forbidden');
    expect((await reviewer.get(`/api/specs/${spec.id}`)).body.latestVersion).toBe(1);
  });

  test('when a reviewer decides, then 403 and the proposal stays ranked', async () => {
    const response = await reviewer.post(`/api/proposals/${quillonProposal.id}/decision`).send({ kind: 'accept' });

    expect(response.status).toBe(403);
    expect(response.body.code).toBe('forbidden');
    expect((await reviewer.get(`/api/proposals/${quillonProposal.id}`)).body.status).toBe('ranked');
  });

  test('when a requirements author reviews a decided proposal, then 403 and it stays decided', async () => {
    // Arrange
    await designer.post(`/api/proposals/${quillonProposal.id}/decision`).send({ kind: 'accept' }).expect(201);

    // Act
    const response = await requirements.post(`/api/proposals/${quillonProposal.id}/review`).send({ verdict: 'approve' });

    // Assert
    expect(response.status).toBe(403);
    expect(response.body.code).toBe('forbidden');
    expect((await requirements.get(`/api/proposals/${quillonProposal.id}`)).body.status).toBe('decided');
  });
});

describe('when a designer who decided is made a reviewer and reviews that decision', () => {
  test('when they approve their own decision, then 403 own-decision and another reviewer can still approve', async () => {
    // Arrange: the second designer decides, then the admin makes them the project's reviewer.
    await decide(api.dataSource, api.users.designer2, sallowProposal.id, { kind: 'accept' }, api.ruleSet);
    const patched = await admin.post(`/api/projects/${sallow.id}/members`).send({ userId: api.users.designer2.id, role: 'reviewer' });
    expect(patched.status).toBe(201);
    expect(patched.body.role).toBe('reviewer');
    const auditBefore = (await admin.get(`/api/proposals/${sallowProposal.id}/audit`)).body.items;

    // Act
    const own = await designer2.post(`/api/proposals/${sallowProposal.id}/review`).send({ verdict: 'approve' });
    const ownReturn = await designer2.post(`/api/proposals/${sallowProposal.id}/review`).send({ verdict: 'return', comment: 'Sending my own work back.' });

    // Assert
    expect(own.status).toBe(403);
    expect(own.body.code).toBe('own-decision');
    expect(ownReturn.status).toBe(403);
    expect(ownReturn.body.code).toBe('own-decision');
    const after = await admin.get(`/api/proposals/${sallowProposal.id}`);
    expect(after.body.status).toBe('decided');
    expect(after.body.reviews).toEqual([]);
    expect((await admin.get(`/api/proposals/${sallowProposal.id}/audit`)).body.items).toEqual(auditBefore);
    const other = await reviewer2.post(`/api/proposals/${sallowProposal.id}/review`).send({ verdict: 'approve' });
    expect(other.status).toBe(201);
    expect(other.body.status).toBe('approved');
  });
});

describe('when a member is removed from a project', () => {
  test('when they ask for its records afterwards, then 404', async () => {
    // Arrange
    expect((await reviewer.get(`/api/projects/${quillon.id}`)).status).toBe(200);

    // Act
    const removed = await admin.delete(`/api/projects/${quillon.id}/members/${api.users.reviewer.id}`);

    // Assert
    expect(removed.status).toBe(204);
    expect((await reviewer.get(`/api/projects/${quillon.id}`)).status).toBe(404);
    expect((await reviewer.get(`/api/proposals/${quillonProposal.id}`)).status).toBe(404);
    expect((await reviewer.get('/api/projects')).body.items).toEqual([]);
  });
});
