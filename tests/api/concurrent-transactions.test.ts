/**
 * Transactions that overlap in time (two requests writing at once) each commit or roll back on
 * their own. On SQLite the data source has one connection, which TypeORM would otherwise share:
 * a second transaction begun while the first is open became a savepoint inside it, so one commit
 * released the other's savepoint ("no such savepoint") or a rollback took the other's writes
 * with it. On PostgreSQL each transaction has its own pooled connection. Both back ends here.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { DataSource, EntityManager } from 'typeorm';
import { openDatabase } from '../../api/data-source';
import { freshDatabase, type TestDatabase } from '../helpers/test-database';

let database: TestDatabase;
let dataSource: DataSource;

beforeAll(async () => {
  database = await freshDatabase();
  dataSource = await openDatabase(database.location);
});

afterAll(async () => {
  await dataSource?.destroy();
  await database?.drop();
});

const NOW = '2026-01-01T00:00:00.000Z';
const param = (n: number) => (dataSource.options.type === 'postgres' ? `$${n}` : '?');

/** A transaction writing `rows` accounts one statement at a time (each statement a turn of its own for the other transaction). */
async function writeAccounts(prefix: string, rows: number, fail = false): Promise<void> {
  await dataSource.transaction(async (manager: EntityManager) => {
    for (let i = 0; i < rows; i += 1) {
      await manager.query(`INSERT INTO user_account (email, display_name, role, password_hash, created_at) VALUES (${param(1)}, ${param(2)}, 'member', 'x', ${param(3)})`, [
        `${prefix}-${i}@tests.longtail.test`,
        `${prefix} ${i}`,
        NOW,
      ]);
    }
    if (fail) throw new Error(`${prefix} gives up`);
  });
}

const count = async (prefix: string) => Number((await dataSource.query(`SELECT count(*) AS n FROM user_account WHERE email LIKE ${param(1)}`, [`${prefix}-%`]))[0].n);

describe('transactions at the same time', () => {
  test('when two transactions write at once, then both commit every row', async () => {
    await Promise.all([writeAccounts('north', 12), writeAccounts('south', 7)]);
    expect([await count('north'), await count('south')]).toEqual([12, 7]);
  });

  test('when one of two overlapping transactions fails, then only its own rows are rolled back', async () => {
    const outcomes = await Promise.allSettled([writeAccounts('east', 9), writeAccounts('west', 5, true)]);
    expect(outcomes.map((o) => o.status)).toEqual(['fulfilled', 'rejected']);
    expect([await count('east'), await count('west')]).toEqual([9, 0]);
  });

  test('when a transaction begins another inside itself, then the inner one runs within it, as before', async () => {
    await dataSource.transaction(async (outer) => {
      await outer.query(`INSERT INTO user_account (email, display_name, role, password_hash, created_at) VALUES (${param(1)}, 'Inner', 'member', 'x', ${param(2)})`, ['inner-0@tests.longtail.test', NOW]);
      await dataSource.transaction(async (inner) => {
        await inner.query(`INSERT INTO user_account (email, display_name, role, password_hash, created_at) VALUES (${param(1)}, 'Inner', 'member', 'x', ${param(2)})`, ['inner-1@tests.longtail.test', NOW]);
      });
    });
    expect(await count('inner')).toBe(2);
  });
});
