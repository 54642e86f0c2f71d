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
    // One module graph for every test file of a run (LONGTAIL_MUTATION_ISOLATE=1: a fresh one per
    // file). Re-importing the engine for each covering file was most of a mutant's time (a run of
    // the engine's unit tests takes 6 s shared, 17 s isolated). A mutant in code run when a module
    // loads ("static") needs the fresh graph, so the shared runs ignore static mutants and the
    // isolated pass of scripts/mutation.mjs tests exactly those.
    isolate: process.env.LONGTAIL_MUTATION_ISOLATE === '1',
    // A test file that cannot load counts as a failed test (see the reporter's note)
    reporters: ['default', './tests/helpers/load-failure-reporter.ts'],
  },
});
