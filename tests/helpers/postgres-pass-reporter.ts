/**
 * A vitest reporter (vitest.config.ts, beside the default one) that ends every run touching the
 * API suite with one line saying whether that suite also ran on PostgreSQL, so that a run
 * without LONGTAIL_TEST_DATABASE_URL does not pass for a complete one. The URL's password is
 * never printed.
 */
import type { Reporter, TestModule, Vitest } from 'vitest/node';

const POSTGRES_PROJECT = 'api-postgres';

/** The URL with its password (if any) replaced by ***; text that is not a URL is not shown at all. */
export function maskDatabaseUrl(text: string): string {
  let url: URL;
  try {
    url = new URL(text.trim());
  } catch {
    return '(set, not a URL: not shown)';
  }
  if (url.password !== '') url.password = '***';
  return url.toString();
}

/** The line for a run: null when no API test file ran in either project. */
export function postgresPassLine(projectsOfApiFiles: readonly string[], databaseUrl: string | undefined): string | null {
  if (projectsOfApiFiles.length === 0) return null;
  const onPostgres = projectsOfApiFiles.filter((project) => project === POSTGRES_PROJECT).length;
  const url = databaseUrl?.trim();
  if (onPostgres > 0) return `PostgreSQL pass: on (LONGTAIL_TEST_DATABASE_URL=${maskDatabaseUrl(url ?? '')}), ${onPostgres} API test file${onPostgres === 1 ? '' : 's'}`;
  if (url) return `PostgreSQL pass: off — LONGTAIL_TEST_DATABASE_URL is set (${maskDatabaseUrl(url)}) but the ${POSTGRES_PROJECT} project was not selected`;
  return 'PostgreSQL pass: off — set LONGTAIL_TEST_DATABASE_URL (scripts/start-test-postgres.sh) to run the API suite on PostgreSQL too';
}

export default class PostgresPassReporter implements Reporter {
  private vitest: Vitest | undefined;

  onInit(vitest: Vitest): void {
    this.vitest = vitest;
  }

  onTestRunEnd(testModules: ReadonlyArray<TestModule>): void {
    const projects = testModules.filter((module) => /[\\/]tests[\\/]api[\\/]/.test(module.moduleId)).map((module) => module.project.name);
    const line = postgresPassLine(projects, process.env.LONGTAIL_TEST_DATABASE_URL);
    if (line !== null) this.vitest?.logger.log(line);
  }
}
