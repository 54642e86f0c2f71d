/**
 * The personal API token migration on a database from before it (SQLite here, PostgreSQL in the
 * api-postgres project): opening it as on an upgrade adds the empty `api_token` table and leaves
 * the accounts as they were; a token row then refuses a second row with the same hash (the hash is
 * how a request finds its token) and goes with its account; reverting drops the table only.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource, openDatabase } from '../../api/data-source';
import { ApiTokenEntity } from '../../api/entities/api-token.entity';
import { MIGRATIONS } from '../../api/migrations/index';
import { PersonalApiTokens1796200000000 } from '../../api/migrations/1796200000000-personal-api-tokens';
import { freshDatabase, type TestDatabase } from '../helpers/test-database';

const AT = '2026-12-01T09:00:00.000Z';
const HASH = 'a'.repeat(64);

let database: TestDatabase;
let upgraded: DataSource;

beforeAll(async () => {
  database = await freshDatabase({ reopenable: true });
  const old = createDataSource(database.location);
  old.setOptions({ migrations: MIGRATIONS.slice(0, MIGRATIONS.indexOf(PersonalApiTokens1796200000000)), entities: [] });
  await old.initialize();
  await old.runMigrations();
  await old.createQueryBuilder().insert().into('user_account').values({ email: 'wenna@upgrade.test', display_name: 'Wenna Tresize', role: 'member', password_hash: 'x', created_at: AT }).execute();
  await old.destroy();
  upgraded = await openDatabase(database.location);
});

afterAll(async () => {
  if (upgraded?.isInitialized) await upgraded.destroy();
  await database?.drop();
});

const insertToken = (userId: number, hash: string) =>
  upgraded.getRepository(ApiTokenEntity).insert({ userId, name: 'CI', tokenHash: hash, tokenStart: 'ltk_abcdef', createdAt: AT, lastUsedAt: null, revokedAt: null });

describe('when a database from before personal API tokens is opened', () => {
  test('then the token table is there, empty, and the accounts are unchanged', async () => {
    expect(Number((await upgraded.query('SELECT count(*) AS n FROM api_token'))[0].n)).toBe(0);
    expect(await upgraded.query('SELECT email, display_name FROM user_account')).toEqual([{ email: 'wenna@upgrade.test', display_name: 'Wenna Tresize' }]);
  });

  test('then two tokens cannot share a hash, and a token goes with its account', async () => {
    await insertToken(1, HASH);
    await expect(insertToken(1, HASH)).rejects.toThrow();
    const [row] = await upgraded.query('SELECT last_used_at, revoked_at FROM api_token');
    expect(row).toEqual({ last_used_at: null, revoked_at: null });
    await upgraded.query('DELETE FROM user_account');
    expect(Number((await upgraded.query('SELECT count(*) AS n FROM api_token'))[0].n)).toBe(0);
  });

  test('then reverting the migration drops the token table and nothing else', async () => {
    // The migrations after it first (the newest is undone first), then this one
    for (let n = MIGRATIONS.length - MIGRATIONS.indexOf(PersonalApiTokens1796200000000); n > 0; n -= 1) await upgraded.undoLastMigration();
    const runner = upgraded.createQueryRunner();
    try {
      expect(await runner.hasTable('api_token')).toBe(false);
      expect(await runner.hasTable('user_account')).toBe(true);
    } finally {
      await runner.release();
    }
  });
});
