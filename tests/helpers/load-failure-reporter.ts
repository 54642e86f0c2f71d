import type { RunnerTestCase, RunnerTestFile } from 'vitest';
import type { Reporter, Vitest } from 'vitest/node';

/**
 * For mutation runs only (stryker.vitest.config.ts): a test file that fails to load is reported
 * as one failed test. Stryker's vitest runner (9.6.1) scores a mutant from the tests vitest
 * collected; a mutant that makes a module throw on import (an emptied table entry read at load
 * time) leaves every test file without tests, and would count as survived although the suite
 * does catch it (stryker-mutator/stryker-js#6150, open).
 */
export default class LoadFailureReporter implements Reporter {
  private vitest: Vitest | undefined;

  onInit(vitest: Vitest): void {
    this.vitest = vitest;
  }

  onTestRunEnd(): void {
    for (const file of this.vitest?.state.getFiles() ?? []) reportLoadFailure(file);
  }
}

/** Adds a failed "loads" test to a file that failed before declaring any test. */
export function reportLoadFailure(file: RunnerTestFile): void {
  if (file.result?.state !== 'fail' || file.tasks.length > 0) return;
  // Only the fields the runner reads (name, file, suite, mode, result); vitest builds a test's
  // context itself, and nothing reads it after the run.
  const loads = {
    type: 'test',
    id: `${file.id}-loads`,
    name: 'the test file loads',
    mode: 'run',
    meta: {},
    file,
    suite: file,
    timeout: 0,
    annotations: [],
    artifacts: [],
    result: { state: 'fail', errors: file.result.errors ?? [] },
  } as unknown as RunnerTestCase;
  file.tasks.push(loads);
}
