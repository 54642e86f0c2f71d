/**
 * Vitest globalSetup of the browser tests (the `e2e` project in vitest.config.ts): builds the
 * browser app into dist/web once per run, so the tests always drive the current sources. It
 * always builds (about 2 to 4 s) rather than comparing timestamps. The tests themselves build
 * nothing: tests/e2e/helpers/server.ts only checks that dist/web/index.html is there.
 */
import { spawnSync } from 'node:child_process';
import { repoRoot } from './helpers/paths';

export function setup(): void {
  const started = performance.now();
  const result = spawnSync('npx', ['vite', 'build'], { cwd: repoRoot, encoding: 'utf8', env: { ...process.env, NODE_ENV: 'production' } });
  if (result.status !== 0) {
    throw new Error(`e2e global setup: \`npx vite build\` failed (exit ${result.status ?? result.signal}):\n${result.stdout}\n${result.stderr}`);
  }
  console.log(`e2e global setup: built the browser app into dist/web in ${((performance.now() - started) / 1000).toFixed(1)} s`);
}
