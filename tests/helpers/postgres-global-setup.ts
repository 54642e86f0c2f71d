/**
 * Vitest globalSetup of the `api-postgres` project (vitest.config.ts): checks once that the
 * server of LONGTAIL_TEST_DATABASE_URL answers (one clear failure instead of one per file), and
 * afterwards drops any `longtail_test_*` database a crashed or interrupted test file left behind
 * (each file drops its own in `close()`).
 */
import { DataSource } from 'typeorm';
import { dropDatabase } from './test-database';

async function withServer<T>(run: (server: DataSource) => Promise<T>): Promise<T> {
  const url = process.env.LONGTAIL_TEST_DATABASE_URL;
  if (!url) throw new Error('api-postgres: LONGTAIL_TEST_DATABASE_URL is not set');
  const server = new DataSource({ type: 'postgres', url, poolSize: 1, applicationName: 'longtail-tests', connectTimeoutMS: 10_000 });
  try {
    await server.initialize();
  } catch (error) {
    throw new Error(`api-postgres: cannot connect to LONGTAIL_TEST_DATABASE_URL (run scripts/start-test-postgres.sh): ${error instanceof Error ? error.message : String(error)}`);
  }
  try {
    return await run(server);
  } finally {
    await server.destroy();
  }
}

export async function setup(): Promise<() => Promise<void>> {
  const [row]: { server_version: string }[] = await withServer((server) => server.query('SHOW server_version'));
  console.log(`api-postgres: PostgreSQL ${row.server_version}`);
  return async () => {
    const left: { datname: string }[] = await withServer((server) => server.query("SELECT datname FROM pg_database WHERE datname LIKE 'longtail\\_test\\_%'"));
    for (const { datname } of left) await dropDatabase(datname);
  };
}
