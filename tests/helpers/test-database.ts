/**
 * The database back end of the API tests. The `unit` project runs them on SQLite (in memory, or a
 * file in a temporary folder when a test reopens it); the `api-postgres` project (present when
 * LONGTAIL_TEST_DATABASE_URL is set, see vitest.config.ts) sets LONGTAIL_TEST_BACKEND=postgres,
 * and every fresh database is then `CREATE DATABASE longtail_test_<random>` on that server, made
 * through a maintenance connection to the URL's own database and dropped again afterwards, so
 * test files stay isolated and can run in parallel.
 */
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DataSource } from 'typeorm';

export type TestBackend = 'sqlite' | 'postgres';

/** The back end this test process runs on. */
export const TEST_BACKEND: TestBackend = process.env.LONGTAIL_TEST_BACKEND === 'postgres' ? 'postgres' : 'sqlite';

export interface TestDatabase {
  backend: TestBackend;
  /** What openDatabase takes: a SQLite path (or ":memory:") or a PostgreSQL URL. */
  location: string;
  /** Removes the database (its file, or DROP DATABASE). Safe to call twice. */
  drop(): Promise<void>;
}

function serverUrl(): string {
  const url = process.env.LONGTAIL_TEST_DATABASE_URL;
  if (!url) throw new Error('LONGTAIL_TEST_BACKEND=postgres needs LONGTAIL_TEST_DATABASE_URL (scripts/start-test-postgres.sh prints one).');
  return url;
}

/** Runs statements on the server's maintenance database (CREATE/DROP DATABASE run outside a transaction). */
async function onServer(statements: string[]): Promise<void> {
  const maintenance = new DataSource({ type: 'postgres', url: serverUrl(), poolSize: 1, applicationName: 'longtail-tests' });
  await maintenance.initialize();
  try {
    for (const statement of statements) await maintenance.query(statement);
  } finally {
    await maintenance.destroy();
  }
}

/**
 * DROP DATABASE, which waits out an autovacuum worker by itself; when a connection is still open
 * (a test that did not close one), WITH (FORCE) ends it (the role has pg_signal_backend, given by
 * scripts/start-test-postgres.sh).
 */
export async function dropDatabase(name: string): Promise<void> {
  try {
    await onServer([`DROP DATABASE IF EXISTS "${name}"`]);
  } catch {
    await onServer([`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`]);
  }
}

/**
 * A new, empty database on the test back end. SQLite: in memory, unless `reopenable` (a test
 * opens it twice), then a file in a new temporary folder.
 */
export async function freshDatabase(options: { reopenable?: boolean } = {}): Promise<TestDatabase> {
  if (TEST_BACKEND === 'sqlite') {
    if (!options.reopenable) return { backend: 'sqlite', location: ':memory:', drop: async () => undefined };
    const dir = mkdtempSync(join(tmpdir(), 'longtail-test-db-'));
    return { backend: 'sqlite', location: join(dir, 'longtail.sqlite'), drop: async () => rmSync(dir, { recursive: true, force: true }) };
  }
  const name = `longtail_test_${randomBytes(6).toString('hex')}`;
  await onServer([`CREATE DATABASE "${name}"`]);
  const url = new URL(serverUrl());
  url.pathname = `/${name}`;
  let dropped = false;
  return {
    backend: 'postgres',
    location: url.toString(),
    async drop() {
      if (dropped) return;
      dropped = true;
      await dropDatabase(name);
    },
  };
}
