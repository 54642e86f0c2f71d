/**
 * Personal API tokens: made on the profile (shown once, only the SHA-256 stored, as FIPS 180-4
 * digests it through node:crypto), used as `Authorization: Bearer` (RFC 6750) with the owner's
 * roles and projects and no CSRF token, every use in the audit trail, revoked for good.
 */
import { createHash } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { ApiTokenEntity } from '../../api/entities/api-token.entity';
import { AuditEventEntity } from '../../api/entities/audit-event.entity';
import { TOKENS_PER_HOUR } from '../../api/services/api-tokens.service';
import { buildApiApp, specPayload, type ApiClient, type TestApi } from '../helpers/api-app';

let api: TestApi;
let project: { id: number };
let otherProject: { id: number };
let spec: { id: number };
let requirements: ApiClient;
let designer: ApiClient;

beforeAll(async () => {
  api = await buildApiApp();
  project = await api.createProject(['requirements', 'designer', 'reviewer']);
  otherProject = await api.createProject(['designer2'], 'Sallow tide gauge', { designer2: 'requirements' });
  spec = await api.createSpec(project.id);
  requirements = await api.agentFor('requirements');
  designer = await api.agentFor('designer');
});

afterAll(async () => {
  await api?.close();
});

const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

async function newToken(client: ApiClient, name: string): Promise<{ id: number; token: string }> {
  const response = await client.post('/api/auth/tokens').send({ name });
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body as { id: number; token: string };
}

const uses = (tokenId: number) => api.dataSource.getRepository(AuditEventEntity).find({ where: { action: 'api-token.used', entityType: 'api-token', entityId: tokenId }, order: { id: 'ASC' } });

describe('when a person makes a token on their profile', () => {
  test('then the answer shows it once, the list never does, and only its SHA-256 is stored', async () => {
    const made = await requirements.post('/api/auth/tokens').send({ name: 'CI on the bench rig' });
    const list = await requirements.get('/api/auth/tokens');
    const row = await api.dataSource.getRepository(ApiTokenEntity).findOneByOrFail({ id: made.body.id });

    expect(made.status).toBe(201);
    expect(made.body.token).toMatch(/^ltk_[A-Za-z0-9_-]{43}$/);
    expect(made.body).toMatchObject({ name: 'CI on the bench rig', start: made.body.token.slice(0, 10), lastUsedAt: null, revokedAt: null });
    expect(made.headers['cache-control']).toBe('no-store');
    expect(list.body.items).toEqual([expect.objectContaining({ id: made.body.id, name: 'CI on the bench rig', start: made.body.token.slice(0, 10) })]);
    expect(JSON.stringify(list.body)).not.toContain(made.body.token);
    expect(row.tokenHash).toBe(createHash('sha256').update(made.body.token).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(made.body.token.slice(10));
    const created = await api.dataSource.getRepository(AuditEventEntity).findOneByOrFail({ action: 'api-token.created', entityId: made.body.id });
    expect(created.actorId).toBe(api.users.requirements.id);
  });

  test('then a blank or over-long name, or an unknown field, is refused with nothing made', async () => {
    const before = await api.dataSource.getRepository(ApiTokenEntity).count();
    for (const body of [{ name: '   ' }, { name: 'x'.repeat(121) }, { name: 'CI', scope: 'all' }, {}]) {
      const response = await designer.post('/api/auth/tokens').send(body);
      expect(response.status, JSON.stringify(body)).toBe(400);
    }
    expect(await api.dataSource.getRepository(ApiTokenEntity).count()).toBe(before);
  });
});

describe('when a script sends the token as a bearer token', () => {
  test('then it acts as its owner, writes need no CSRF token, and the same write from a session without one is refused', async () => {
    const { token } = await newToken(requirements, 'spec upload');

    const me = await request(api.app).get('/api/auth/me').set(bearer(token));
    const written = await request(api.app).post(`/api/projects/${project.id}/specs`).set(bearer(token)).send({ title: 'Quillon sensor head — from CI', payload: specPayload() });
    const sessionWithoutCsrf = await requirements.agent.post(`/api/projects/${project.id}/specs`).send({ title: 'Quillon sensor head — no token', payload: specPayload() });

    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ id: api.users.requirements.id, projectRoles: [{ projectId: project.id, role: 'requirements' }] });
    expect(written.status, JSON.stringify(written.body)).toBe(201);
    expect(written.body).toMatchObject({ projectId: project.id, latestVersion: 1 });
    expect(sessionWithoutCsrf.status).toBe(403);
    expect(sessionWithoutCsrf.body.code).toBe('csrf-failed');
  });

  test('then it is held to its owner’s projects and role: another project is 404, a write the role may not do is 403', async () => {
    const { token } = await newToken(designer, 'designer script');

    const other = await request(api.app).get(`/api/projects/${otherProject.id}/specs`).set(bearer(token));
    const specWrite = await request(api.app).post(`/api/projects/${project.id}/specs`).set(bearer(token)).send({ title: 'Not a designer’s to write', payload: specPayload() });
    const users = await request(api.app).get('/api/users').set(bearer(token));
    const ranked = await request(api.app).post(`/api/specs/${spec.id}/proposals`).set(bearer(token));

    expect(other.status).toBe(404);
    expect(specWrite.status).toBe(403);
    expect(users.status).toBe(403);
    expect(ranked.status).toBe(201);
  });

  test('then every use is one audit event naming the method and path, and the token’s last use is kept', async () => {
    const { id, token } = await newToken(designer, 'counted');

    for (const url of ['/api/auth/me', `/api/projects/${project.id}`, `/api/specs/${spec.id}`]) await request(api.app).get(url).set(bearer(token)).expect(200);
    await request(api.app).get(`/api/projects/${otherProject.id}`).set(bearer(token)).expect(404);

    const events = await uses(id);
    expect(events.map((event) => [event.actorId, event.details])).toEqual([
      [api.users.designer.id, { method: 'GET', path: '/api/auth/me' }],
      [api.users.designer.id, { method: 'GET', path: `/api/projects/${project.id}` }],
      [api.users.designer.id, { method: 'GET', path: `/api/specs/${spec.id}` }],
      [api.users.designer.id, { method: 'GET', path: `/api/projects/${otherProject.id}` }],
    ]);
    const row = await api.dataSource.getRepository(ApiTokenEntity).findOneByOrFail({ id });
    expect(row.lastUsedAt).toEqual(expect.any(String));
  });

  test('then a token cannot list, make or revoke tokens (a session is needed)', async () => {
    const { id, token } = await newToken(designer, 'no minting');

    const list = await request(api.app).get('/api/auth/tokens').set(bearer(token));
    const make = await request(api.app).post('/api/auth/tokens').set(bearer(token)).send({ name: 'minted' });
    const revoke = await request(api.app).delete(`/api/auth/tokens/${id}`).set(bearer(token));

    for (const response of [list, make, revoke]) {
      expect(response.status).toBe(403);
      expect(response.body.code).toBe('session-required');
    }
  });
});

describe('when a token is not valid', () => {
  test('then an unknown, malformed or revoked token answers 401 token-invalid, never the session’s person', async () => {
    const { id, token } = await newToken(designer, 'to revoke');
    const revoked = await designer.delete(`/api/auth/tokens/${id}`);
    const answers = await Promise.all([
      designer.agent.get('/api/auth/me').set(bearer(token)),
      designer.agent.get('/api/auth/me').set(bearer(`ltk_${'A'.repeat(43)}`)),
      designer.agent.get('/api/auth/me').set('Authorization', 'Basic ZGVzaWduZXI6eA=='),
      designer.agent.get('/api/auth/me').set(bearer(token.slice(0, -1))),
    ]);

    expect(revoked.status).toBe(200);
    expect(revoked.body.revokedAt).toEqual(expect.any(String));
    for (const response of answers) {
      expect(response.status).toBe(401);
      expect(response.body.code).toBe('token-invalid');
    }
    expect(await uses(id)).toEqual([]);
  });

  test('then someone else’s token cannot be revoked (404) and stays usable', async () => {
    const { id, token } = await newToken(requirements, 'not the designer’s');
    const response = await designer.delete(`/api/auth/tokens/${id}`);
    expect(response.status).toBe(404);
    await request(api.app).get('/api/auth/me').set(bearer(token)).expect(200);
  });

  test('then a disabled account’s token stops working', async () => {
    const reviewer = await api.agentFor('reviewer');
    const { token } = await newToken(reviewer, 'reviewer script');
    const admin = await api.agentFor('admin');
    await admin.patch(`/api/users/${api.users.reviewer.id}`).send({ disabled: true }).expect(200);
    const refused = await request(api.app).get('/api/auth/me').set(bearer(token));
    await admin.patch(`/api/users/${api.users.reviewer.id}`).send({ disabled: false }).expect(200);
    const again = await request(api.app).get('/api/auth/me').set(bearer(token));

    expect(refused.status).toBe(401);
    expect(again.status).toBe(200);
  });
});

describe('when a person makes many tokens', () => {
  test(`then the ${TOKENS_PER_HOUR + 1}th within the hour is refused with 429 and Retry-After`, async () => {
    const admin = await api.agentFor('admin');
    for (let i = 0; i < TOKENS_PER_HOUR; i += 1) await newToken(admin, `batch ${i + 1}`);
    const refused = await admin.post('/api/auth/tokens').send({ name: 'one too many' });

    expect(refused.status).toBe(429);
    expect(refused.body.code).toBe('too-many-tokens');
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(3000);
  });
});
