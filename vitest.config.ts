import react from '@vitejs/plugin-react';
import { configDefaults, defineConfig } from 'vitest/config';
import { DEBIAN_NGSPICE_PROJECT, DEBIAN_NGSPICE_REFERENCE_FILES, debianNgspiceInstalled } from './tests/helpers/debian-ngspice-project.ts';

// Two projects: everything but the browser tests, and the browser tests (tests/e2e), whose
// globalSetup builds dist/web first. A project's globalSetup runs only when one of its files is
// queued, so `npx vitest run tests/unit` builds nothing.
// A third, `api-postgres`, exists only when LONGTAIL_TEST_DATABASE_URL names a PostgreSQL server
// (scripts/start-test-postgres.sh prints one; .ci/run sets it): the API suite again, each test
// file on its own new database there (tests/helpers/test-database.ts). Without the variable,
// `npm test` runs the API suite on SQLite alone, and says so: a run that includes API test files
// ends with one "PostgreSQL pass: on/off" line (tests/helpers/postgres-pass-reporter.ts).
const postgresUrl = process.env.LONGTAIL_TEST_DATABASE_URL?.trim();
const postgresProjects = postgresUrl
  ? [
      {
        extends: true,
        test: {
          name: 'api-postgres',
          include: ['tests/api/**/*.test.ts'],
          env: { LONGTAIL_TEST_BACKEND: 'postgres', LONGTAIL_TEST_DATABASE_URL: postgresUrl },
          globalSetup: ['tests/helpers/postgres-global-setup.ts'],
        },
      },
    ]
  : [];
// A fourth, `reference-debian-ngspice`, exists only when Debian's ngspice is installed
// (/usr/bin/ngspice; .ci/run installs it): the reference files again, their ngspice
// being that program instead of the registry's WebAssembly build (LONGTAIL_TEST_SPICE,
// tests/helpers/spice.ts). A run that includes those files ends with one "Debian ngspice pass:
// on/off" line (tests/helpers/debian-ngspice-pass-reporter.ts). The project's name, its files and
// the check live in tests/helpers/debian-ngspice-project.ts.
const debianNgspiceProjects = debianNgspiceInstalled()
  ? [
      {
        extends: true,
        test: {
          name: DEBIAN_NGSPICE_PROJECT,
          include: [...DEBIAN_NGSPICE_REFERENCE_FILES],
          env: { LONGTAIL_TEST_SPICE: 'debian' },
          globalSetup: ['tests/helpers/debian-ngspice-global-setup.ts'],
        },
      },
    ]
  : [];

export default defineConfig({
  plugins: [react()],
  test: {
    environment: 'node',
    testTimeout: 60000,
    reporters: ['default', './tests/helpers/postgres-pass-reporter.ts', './tests/helpers/debian-ngspice-pass-reporter.ts'],
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'], exclude: [...configDefaults.exclude, 'tests/e2e/**'], env: { LONGTAIL_TEST_BACKEND: 'sqlite' } },
      },
      {
        extends: true,
        test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], globalSetup: ['tests/e2e/global-setup.ts'], testTimeout: 240_000, hookTimeout: 120_000 },
      },
      ...postgresProjects,
      ...debianNgspiceProjects,
    ],
  },
});
