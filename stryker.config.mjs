// StrykerJS settings for `npm run mutation` (scripts/mutation.mjs sets the environment below).
// LONGTAIL_MUTATION_TARGET: the folder or file being mutated (one run per target, so each keeps
// its own incremental file and report under reports/mutation/<slug>/, out of git).
const target = process.env.LONGTAIL_MUTATION_TARGET ?? 'shared/units';
const slug = process.env.LONGTAIL_MUTATION_SLUG ?? target.replace(/[^a-z0-9]+/gi, '-');
const isFile = /\.ts$/.test(target);
const out = `reports/mutation/${slug}`;

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: 'vitest',
  vitest: { configFile: 'stryker.vitest.config.ts' },
  plugins: ['@stryker-mutator/vitest-runner'],
  // LONGTAIL_MUTATION_RANGES: the static mutants' places (file:line:column-line:column, comma-
  // separated) for the isolated pass; otherwise the whole target
  mutate: process.env.LONGTAIL_MUTATION_RANGES
    ? process.env.LONGTAIL_MUTATION_RANGES.split(',')
    : isFile
      ? [target]
      : [`${target}/**/*.ts`, `!${target}/**/*.d.ts`],
  // The shared-module runs (stryker.vitest.config.ts) cannot reload a module for a static mutant:
  // they leave them to the isolated pass
  ignoreStatic: process.env.LONGTAIL_MUTATION_ISOLATE !== '1',
  coverageAnalysis: 'perTest',
  // vitest compiles with esbuild, which never type-checks: no `// @ts-nocheck` is needed, and
  // adding it changed the sandbox's generated files that a schema test compares with their source
  disableTypeChecks: false,
  concurrency: 2,
  // Stryker waits 1.5 × the covering tests' own time plus this: a mutant that hangs a Newton loop
  // (the LU solver, the operating point) is scored a timeout 5 s late. The tests run in one
  // module graph (stryker.vitest.config.ts), so their own time is all a run takes.
  timeoutMS: 5000,
  incremental: true,
  incrementalFile: `${out}/incremental.json`,
  reporters: ['clear-text', 'progress', 'html', 'json'],
  htmlReporter: { fileName: `${out}/index.html` },
  jsonReporter: { fileName: `${out}/mutation.json` },
  clearTextReporter: { allowColor: false, logTests: false },
  tempDirName: `tmp/stryker-${slug}`,
  cleanTempDir: true,
  ignorePatterns: ['dist', 'reports', 'coverage', 'data', 'tmp', 'test-results', 'screenshots', '*.sqlite'],
  thresholds: { high: 85, low: 75, break: null },
};
