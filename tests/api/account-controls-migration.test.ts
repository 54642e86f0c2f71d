/**
 * The account-controls migration on a database that already has sessions: a session signed in
 * before it gets its account in `session.user_id` (read from the stored session data, where
 * passport keeps the account id), so changing a password or disabling the account ends it too;
 * a visitor's session and unreadable data stay null. Runs on SQLite, and on PostgreSQL in the
 * api-postgres project.
 */
import { afterAll, beforeAll, expect, test } from 'vitest';
import { SessionEntity } from '../../api/entities/session.entity';
import { AccountControls1764800300000 } from '../../api/migrations/1764800300000-account-controls';
import { buildApiApp, type TestApi } from '../helpers/api-app';

let api: TestApi;

beforeAll(async () => {
  api = await buildApiApp({ accounts: ['designer'] });
});

afterAll(async () => {
  await api?.close();
});

test('when the migration runs over sessions written before it, then each signed-in session names its account and the others name none', async () => {
  // Arrange: three sessions as the old store wrote them (no account column), then back to the schema before the migration
  const expiresAtMs = Date.now() + 3_600_000;
  await api.dataSource.getRepository(SessionEntity).insert([
    { id: 'signed-in-before', expiresAtMs, data: JSON.stringify({ cookie: { path: '/' }, passport: { user: api.users.designer.id } }), userId: null },
    { id: 'visitor-before', expiresAtMs, data: JSON.stringify({ cookie: { path: '/' }, visitorSince: 1 }), userId: null },
    { id: 'unreadable-before', expiresAtMs, data: '{not json', userId: null },
  ]);
  const migration = new AccountControls1764800300000();
  const runner = api.dataSource.createQueryRunner();
  try {
    await migration.down(runner);

    // Act
    await migration.up(runner);
  } finally {
    await runner.release();
  }

  // Assert
  const rows = await api.dataSource.getRepository(SessionEntity).find({ order: { id: 'ASC' } });
  const byId = Object.fromEntries(rows.map((r) => [r.id, r.userId]));
  expect(byId).toMatchObject({ 'signed-in-before': api.users.designer.id, 'visitor-before': null, 'unreadable-before': null });
});
