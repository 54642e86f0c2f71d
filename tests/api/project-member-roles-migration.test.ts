/**
 * The migration to roles per project, on a database written before it (SQLite here, PostgreSQL in
 * the api-postgres project): the schema up to the previous migration, rows as the old code wrote
 * them (accounts with one global role, memberships without a role), then the server opened as on
 * an upgrade. Each membership must carry the role its person held; every account that is not an
 * administrator becomes a member; and the people can then act by those roles over HTTP.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { DataSource } from 'typeorm';
import { createApp } from '../../api/app';
import { createDataSource, migrate, openDatabase } from '../../api/data-source';
import { hashPassword } from '../../api/auth/password';
import { MIGRATIONS } from '../../api/migrations/index';
import { ProjectMemberRoles1764800400000 } from '../../api/migrations/1764800400000-project-member-roles';
import { loadRuleSet } from '../../rules/index';
import { VerificationQueue } from '../../api/verification/verification-queue';
import { freshDatabase, TEST_BACKEND, type TestDatabase } from '../helpers/test-database';

const PASSWORD = 'heron-quay-0311-slate';
const AT = '2026-11-02T09:00:00.000Z';
/** The accounts as the old code stored them: e-mail → the one global role. */
const OLD_ACCOUNTS = {
  'ada@upgrade.test': 'admin',
  'rex@upgrade.test': 'requirements',
  'dee@upgrade.test': 'designer',
  'rue@upgrade.test': 'reviewer',
} as const;

let database: TestDatabase;
let upgraded: DataSource;
const ids: Record<string, number> = {};
let projectIds: { north: number; south: number };

/** Inserts a row as the old code would have, and answers its id (found again by a column that is unique here). */
async function insert(dataSource: DataSource, table: string, values: Record<string, unknown>, key: string): Promise<number> {
  await dataSource.createQueryBuilder().insert().into(table).values(values).execute();
  const row = await dataSource.createQueryBuilder().select('t.id', 'id').from(table, 't').where(`t.${key} = :value`, { value: values[key] }).getRawOne<{ id: number }>();
  return Number(row!.id);
}

beforeAll(async () => {
  database = await freshDatabase({ reopenable: true });
  // The schema as it was before roles per project: every migration before this one.
  const before = MIGRATIONS.slice(0, MIGRATIONS.indexOf(ProjectMemberRoles1764800400000));
  expect(before.length).toBeGreaterThan(0);
  const old = createDataSource(database.location);
  // No entities: the rows are written by their column names, as the old schema has them.
  old.setOptions({ migrations: before, entities: [] });
  await old.initialize();
  await migrate(old);
  const hash = await hashPassword(PASSWORD);
  for (const [email, role] of Object.entries(OLD_ACCOUNTS)) {
    ids[email] = await insert(old, 'user_account', { email, display_name: email.split('@')[0], role, password_hash: hash, created_at: AT }, 'email');
  }
  const project = (name: string) => insert(old, 'project', { name, description: '', created_by_id: ids['ada@upgrade.test'], created_at: AT }, 'name');
  projectIds = { north: await project('Northgate bridge amplifier'), south: await project('Southmere line receiver') };
  // The designer and the reviewer in both projects, the author in the first, the admin a member of the second.
  const member = (projectId: number, email: string) => old.createQueryBuilder().insert().into('project_member').values({ project_id: projectId, user_id: ids[email], created_at: AT }).execute();
  for (const email of ['rex@upgrade.test', 'dee@upgrade.test', 'rue@upgrade.test']) await member(projectIds.north, email);
  for (const email of ['dee@upgrade.test', 'rue@upgrade.test', 'ada@upgrade.test']) await member(projectIds.south, email);
  await old.destroy();

  // The upgrade: the server opens the database and runs what is pending.
  upgraded = await openDatabase(database.location);
});

afterAll(async () => {
  if (upgraded?.isInitialized) await upgraded.destroy();
  await database?.drop();
});

const memberships = async () =>
  (
    await upgraded
      .createQueryBuilder()
      .select(['m.project_id AS project_id', 'm.user_id AS user_id', 'm.role AS role'])
      .from('project_member', 'm')
      .getRawMany<{ project_id: number; user_id: number; role: string | null }>()
  )
    .map((m) => ({ projectId: Number(m.project_id), userId: Number(m.user_id), role: m.role }))
    .sort((a, b) => a.projectId - b.projectId || a.userId - b.userId);

describe(`when a database with memberships from before roles per project is opened (${TEST_BACKEND})`, () => {
  test('then each membership carries the role its person held, and an administrator’s membership none', async () => {
    const { north, south } = projectIds;
    const expected = [
      { projectId: north, userId: ids['rex@upgrade.test'], role: 'requirements' },
      { projectId: north, userId: ids['dee@upgrade.test'], role: 'designer' },
      { projectId: north, userId: ids['rue@upgrade.test'], role: 'reviewer' },
      { projectId: south, userId: ids['ada@upgrade.test'], role: null },
      { projectId: south, userId: ids['dee@upgrade.test'], role: 'designer' },
      { projectId: south, userId: ids['rue@upgrade.test'], role: 'reviewer' },
    ].sort((a, b) => a.projectId - b.projectId || a.userId - b.userId);

    expect(await memberships()).toEqual(expected);
  });

  test('then the administrator keeps the global role and everybody else is a member', async () => {
    const rows = await upgraded.createQueryBuilder().select(['u.email AS email', 'u.role AS role']).from('user_account', 'u').orderBy('u.email').getRawMany<{ email: string; role: string }>();

    expect(Object.fromEntries(rows.map((r) => [r.email, r.role]))).toEqual({
      'ada@upgrade.test': 'admin',
      'dee@upgrade.test': 'member',
      'rex@upgrade.test': 'member',
      'rue@upgrade.test': 'member',
    });
  });

  test('then the migrated people act by those roles: the author writes a spec, the reviewer may not', async () => {
    const ruleSet = await loadRuleSet();
    const verification = new VerificationQueue(upgraded, { log: () => {} });
    const app = createApp({ dataSource: upgraded, sessionSecret: 'x'.repeat(40), ruleSet, log: () => {}, verification });
    try {
      const signIn = async (email: string) => {
        const agent = request.agent(app);
        const token = (await agent.get('/api/auth/csrf').expect(200)).body.token as string;
        const login = await agent.post('/api/auth/login').set('X-CSRF-Token', token).send({ email, password: PASSWORD }).expect(200);
        // The token changes at sign-in: the answer carries the new session's.
        return { agent, token: login.body.csrfToken as string };
      };
      const spec = { title: 'Northgate rev A — bridge input pair', payload: { supply: { positiveV: 9, negativeV: -9 }, gain: { target: 20 }, cmrr: { minDb: 70 } } };
      const author = await signIn('rex@upgrade.test');
      const reviewer = await signIn('rue@upgrade.test');

      const written = await author.agent.post(`/api/projects/${projectIds.north}/specs`).set('X-CSRF-Token', author.token).send(spec);
      const refused = await reviewer.agent.post(`/api/projects/${projectIds.north}/specs`).set('X-CSRF-Token', reviewer.token).send(spec);
      const me = await reviewer.agent.get('/api/auth/me');

      expect(written.status, JSON.stringify(written.body)).toBe(201);
      expect(refused.status).toBe(403);
      expect(me.body.user.role).toBe('member');
      expect(me.body.user.projectRoles).toEqual([
        { projectId: projectIds.north, role: 'reviewer' },
        { projectId: projectIds.south, role: 'reviewer' },
      ]);
    } finally {
      app.closeApp();
      await verification.close();
    }
  });
});
