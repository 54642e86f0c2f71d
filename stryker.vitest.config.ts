import { defineConfig } from 'vitest/config';

// The vitest setup Stryker runs (stryker.config.mjs): plain Node tests only, none of the main
// config's projects (the browser project builds dist/web, the API projects open databases). The
// test files come from LONGTAIL_MUTATION_TESTS (comma-separated globs), which scripts/mutation.mjs
// sets to the tests that cover the folders being mutated; without it, every unit and reference
// test that covers a mutated folder.
const fromEnvironment = process.env.LONGTAIL_MUTATION_TESTS?.split(',').filter(Boolean);

export default defineConfig({
  test: {
    environment: 'node',
    testTimeout: 60000,
    include: fromEnvironment ?? [
      'tests/unit/units/**/*.test.ts',
      'tests/unit/schema/**/*.test.ts',
      'tests/unit/import/spec-file.test.ts',
      'tests/unit/rules/**/*.test.ts',
      'tests/unit/engine/**/*.test.ts',
      'tests/reference/**/*.test.ts',
    ],
    env: { LONGTAIL_TEST_BACKEND: 'sqlite' },
    // A test file that cannot load counts as a failed test (see the reporter's note)
    reporters: ['default', './tests/helpers/load-failure-reporter.ts'],
  },
});
