/**
 * Roles per project: one person holds a different role in each project, and every check reads the
 * role of the project the record belongs to. The second designer account ("the lead" here) designs
 * in Quillon and reviews in Sallow: allowed to decide in Quillon, refused a decision in Sallow,
 * allowed to review there; the ready-for-decision e-mail of Sallow goes to Sallow's designer and
 * not to the lead, the decided e-mail to the lead. The administrator sets the role per membership.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { MailOutboxEntity } from '../../api/entities/mail-outbox.entity';
import { buildApiApp, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let quillon: { id: number };
let sallow: { id: number };
let quillonSpec: { id: number };
let sallowSpec: { id: number };
let admin: ApiClient;
let lead: ApiClient;

beforeAll(async () => {
  api = await buildApiApp();
  // The lead (the designer2 account) designs in Quillon and reviews in Sallow; the first designer designs in Sallow.
  quillon = await api.createProject(['requirements', 'designer2', 'reviewer'], 'Quillon sensor head');
  sallow = await api.createProject(['requirements', 'designer', 'designer2'], 'Sallow tide gauge', { designer2: 'reviewer' });
  quillonSpec = await api.createSpec(quillon.id);
  sallowSpec = await api.createSpec(sallow.id, { title: 'Sallow tide gauge — pressure bridge pair' });
  [admin, lead] = await Promise.all([api.agentFor('admin'), api.agentFor('designer2')]);
});

afterAll(async () => {
  await api?.close();
});

describe('when one person designs in one project and reviews in another', () => {
  test('when they remove or replace a library card in the project where they review, then 403 and the card stays; in the project where they design, 204', async () => {
    const requirements = await api.agentFor('requirements');
    const upload = (projectId: number, name: string) =>
      requirements.post(`/api/projects/${projectId}/devices`).attach('file', Buffer.from(`.model ${name} NPN (IS=4f BF=200 VAF=90)\n`, 'utf8'), 'bin.lib').expect(201);
    const inSallow = (await upload(sallow.id, 'FH-S1')).body.items[0];
    const inQuillon = (await upload(quillon.id, 'FH-Q1')).body.items[0];

    const removed = await lead.delete(`/api/projects/${sallow.id}/devices/${inSallow.id}`);
    const replaced = await lead.put(`/api/projects/${sallow.id}/devices/${inSallow.id}`).attach('file', Buffer.from('.model FH-S1 NPN (IS=5f BF=180 VAF=90)\n', 'utf8'), 'bin.lib');
    const library = await lead.get(`/api/projects/${sallow.id}/devices`);
    const ownRemoval = await lead.delete(`/api/projects/${quillon.id}/devices/${inQuillon.id}`);

    expect(removed.status).toBe(403);
    expect(replaced.status).toBe(403);
    expect(library.body.items.map((card: { name: string }) => card.name)).toContain('FH-S1');
    expect(ownRemoval.status).toBe(204);
  });

  test('when they decide in the project where they design, then 201', async () => {
    const proposal = await api.createProposal(quillonSpec.id, 'requirements');

    const response = await lead.post(`/api/proposals/${proposal.id}/decision`).send({ kind: 'accept' });

    expect(response.status, JSON.stringify(response.body)).toBe(201);
    expect(response.body.status).toBe('decided');
  });

  test('when they decide in the project where they review, then 403 naming their role there, and the proposal stays ranked', async () => {
    const proposal = await api.createProposal(sallowSpec.id, 'requirements');

    const response = await lead.post(`/api/proposals/${proposal.id}/decision`).send({ kind: 'accept' });

    expect(response.status).toBe(403);
    expect(response.body.code).toBe('forbidden');
    expect(response.body.error).toMatch(/Reviewer/);
    expect((await lead.get(`/api/proposals/${proposal.id}`)).body.status).toBe('ranked');
  });

  test('when they check their own values in the project where they review, then 403', async () => {
    const proposal = await api.createProposal(sallowSpec.id, 'requirements');
    const design = proposal.result.options.find((o) => o.design)!.design;

    const response = await lead.post(`/api/proposals/${proposal.id}/evaluation`).send({ design });

    expect(response.status).toBe(403);
  });

  test('when they review in the project where they review, then 201; and in the project where they design, 403', async () => {
    const inSallow = await api.createProposal(sallowSpec.id, 'requirements');
    await api.agentFor('designer').then((d) => d.post(`/api/proposals/${inSallow.id}/decision`).send({ kind: 'accept' }).expect(201));
    const inQuillon = await api.createProposal(quillonSpec.id, 'requirements');
    await lead.post(`/api/proposals/${inQuillon.id}/decision`).send({ kind: 'accept' }).expect(201);
    const reviewer = await api.agentFor('reviewer');

    const approved = await lead.post(`/api/proposals/${inSallow.id}/review`).send({ verdict: 'approve' });
    const refused = await lead.post(`/api/proposals/${inQuillon.id}/review`).send({ verdict: 'approve' });

    expect(approved.status, JSON.stringify(approved.body)).toBe(201);
    expect(approved.body.status).toBe('approved');
    expect(refused.status).toBe(403);
    expect(refused.body.code).toBe('forbidden');
    // Quillon's own reviewer still can.
    expect((await reviewer.post(`/api/proposals/${inQuillon.id}/review`).send({ verdict: 'approve' })).status).toBe(201);
  });

  test('when they ask who they are, then each project comes with the role they hold there', async () => {
    const me = await lead.get('/api/auth/me');

    expect(me.body.user.role).toBe('member');
    expect(me.body.user.projectRoles).toEqual([
      { projectId: quillon.id, role: 'designer' },
      { projectId: sallow.id, role: 'reviewer' },
    ]);
  });

  test('when they change a preference, then the answer is the whole person with the role held in each project (the browser replaces its copy with it)', async () => {
    const changed = await lead.patch('/api/auth/me').send({ notify: true });

    expect(changed.status).toBe(200);
    expect(changed.body.user.projectRoles).toEqual([
      { projectId: quillon.id, role: 'designer' },
      { projectId: sallow.id, role: 'reviewer' },
    ]);
  });

  test('when a proposal of the project where they review is ranked and then decided, then the e-mails follow their role there', async () => {
    const outbox = api.dataSource.getRepository(MailOutboxEntity);
    const proposal = await api.createProposal(sallowSpec.id, 'requirements');
    const ready = await outbox.findBy({ proposalId: proposal.id, kind: 'proposal.ready' });
    await api.agentFor('designer').then((d) => d.post(`/api/proposals/${proposal.id}/decision`).send({ kind: 'accept' }).expect(201));
    const decided = await outbox.findBy({ proposalId: proposal.id, kind: 'proposal.decided' });

    expect(ready.map((m) => m.userId)).toEqual([api.users.designer.id]);
    expect(decided.map((m) => m.userId)).toEqual([api.users.designer2.id]);
    expect(decided[0].body).toMatch(/you review in the project "Sallow tide gauge"/);
  });
});

describe('when the administrator sets the role of a membership', () => {
  test('when the lead becomes Sallow’s designer, then they may decide there, the member list and audit trail say so', async () => {
    const proposal = await api.createProposal(sallowSpec.id, 'requirements');

    const changed = await admin.post(`/api/projects/${sallow.id}/members`).send({ userId: api.users.designer2.id, role: 'designer' });
    const decided = await lead.post(`/api/proposals/${proposal.id}/decision`).send({ kind: 'accept' });
    const members = await admin.get(`/api/projects/${sallow.id}/members`);
    const events = await api.dataSource.getRepository(AuditEventEntity).findBy({ action: 'project.member-role-changed', projectId: sallow.id });

    expect(changed.status).toBe(201);
    expect(changed.body.role).toBe('designer');
    expect(decided.status, JSON.stringify(decided.body)).toBe(201);
    expect(members.body.items.find((m: { id: number }) => m.id === api.users.designer2.id).projectRole).toBe('designer');
    expect(events.map((e) => e.details)).toEqual([{ userId: api.users.designer2.id, before: 'reviewer', after: 'designer' }]);
  });

  test('when the same role is sent again, then nothing changes and no event is written', async () => {
    const count = () => api.dataSource.getRepository(AuditEventEntity).countBy({ projectId: sallow.id });
    const before = await count();

    const again = await admin.post(`/api/projects/${sallow.id}/members`).send({ userId: api.users.designer2.id, role: 'designer' });

    expect(again.status).toBe(201);
    expect(await count()).toBe(before);
  });

  test('when an account is made with a project role as its global role, then 400: roles are given per project', async () => {
    const response = await admin.post('/api/users').send({ email: 'wren@tests.longtail.test', displayName: 'Wren', role: 'designer', password: 'moss-granary-5521' });

    expect(response.status).toBe(400);
    expect(response.body.details.map((d: { path: string }) => d.path)).toContain('/role');
  });
});
