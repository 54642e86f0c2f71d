/**
 * The notice preferences migration on a database from before it (SQLite here, PostgreSQL in the
 * api-postgres project): every account gets an empty list of kinds turned off, a person who had
 * e-mail off keeps it off (the master switch keeps its meaning), the app reads the new column,
 * and reverting drops the column only. Rows pointing at the accounts (an audit event, a project
 * membership) are there throughout: the accounts' table must not be rebuilt under them.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource, openDatabase } from '../../api/data-source';
import { UserEntity } from '../../api/entities/user.entity';
import { MIGRATIONS } from '../../api/migrations/index';
import { NoticePreferences1796400000000 } from '../../api/migrations/1796400000000-notice-preferences';
import { findSessionUser, updatePreferences } from '../../api/services/users.service';
import { freshDatabase, type TestDatabase } from '../helpers/test-database';

const AT = '2026-12-01T09:00:00.000Z';

let database: TestDatabase;
let upgraded: DataSource;

beforeAll(async () => {
  database = await freshDatabase({ reopenable: true });
  const old = createDataSource(database.location);
  old.setOptions({ migrations: MIGRATIONS.slice(0, MIGRATIONS.indexOf(NoticePreferences1796400000000)), entities: [] });
  await old.initialize();
  await old.runMigrations();
  const account = (email: string, notify: boolean) => ({ email, display_name: email.split('@')[0], role: 'member', password_hash: 'x', created_at: AT, notify });
  for (const row of [account('wenna@upgrade.test', true), account('corin@upgrade.test', false)]) await old.createQueryBuilder().insert().into('user_account').values(row).execute();
  const [{ id: corinId }] = await old.query(`SELECT id FROM user_account WHERE email = 'corin@upgrade.test'`);
  await old.createQueryBuilder().insert().into('audit_event').values({ at: AT, actor_id: corinId, action: 'user.created', entity_type: 'user', entity_id: corinId, details: '{}' }).execute();
  await old.destroy();
  upgraded = await openDatabase(database.location);
});

afterAll(async () => {
  if (upgraded?.isInitialized) await upgraded.destroy();
  await database?.drop();
});

describe('when a database from before notice preferences is opened', () => {
  test('then every account has no kind turned off and the master switch as it was', async () => {
    const rows: { email: string; notices_off: string }[] = await upgraded.query('SELECT email, notices_off FROM user_account ORDER BY email');
    expect(rows).toEqual([
      { email: 'corin@upgrade.test', notices_off: '[]' },
      { email: 'wenna@upgrade.test', notices_off: '[]' },
    ]);
    const people = await upgraded.getRepository(UserEntity).find({ order: { email: 'ASC' } });
    expect(people.map((p) => [p.email, Boolean(p.notify), p.noticesOff])).toEqual([
      ['corin@upgrade.test', false, []],
      ['wenna@upgrade.test', true, []],
    ]);
  });

  test('then a kind turned off is stored as a list and read back by the signed-in person’s lookup', async () => {
    const wenna = await upgraded.getRepository(UserEntity).findOneByOrFail({ email: 'wenna@upgrade.test' });
    await updatePreferences(upgraded, wenna.id, { noticesOff: ['spec.new-version'] });
    expect((await upgraded.query(`SELECT notices_off FROM user_account WHERE email = 'wenna@upgrade.test'`))[0].notices_off).toBe('["spec.new-version"]');
    expect((await findSessionUser(upgraded, wenna.id))?.noticesOff).toEqual(['spec.new-version']);
  });

  test('then reverting the migration drops the column and keeps the accounts', async () => {
    // The migrations after it first (the newest is undone first), then this one
    for (let n = MIGRATIONS.length - MIGRATIONS.indexOf(NoticePreferences1796400000000); n > 0; n -= 1) await upgraded.undoLastMigration();
    const runner = upgraded.createQueryRunner();
    try {
      expect(await runner.hasColumn('user_account', 'notices_off')).toBe(false);
      expect(await runner.hasColumn('user_account', 'notify')).toBe(true);
    } finally {
      await runner.release();
    }
    expect(Number((await upgraded.query('SELECT count(*) AS n FROM user_account'))[0].n)).toBe(2);
    expect(Number((await upgraded.query('SELECT count(*) AS n FROM audit_event'))[0].n)).toBeGreaterThanOrEqual(2);
  });
});
