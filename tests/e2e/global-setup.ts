/**
 * Vitest globalSetup of the browser tests (the `e2e` project in vitest.config.ts): does what
 * `npm run build` does once per run — the browser app into dist/web, the compiled server into
 * dist/server — so the tests always drive the current sources. It always builds (a few seconds)
 * rather than comparing timestamps. The tests themselves build nothing:
 * tests/e2e/helpers/server.ts only checks that dist/web/index.html is there, and the production
 * install test packs what is in dist/.
 */
import { spawnSync } from 'node:child_process';
import { repoRoot } from './helpers/paths';

export function setup(): void {
  const started = performance.now();
  const result = spawnSync('npx', ['vite', 'build'], { cwd: repoRoot, encoding: 'utf8', env: { ...process.env, NODE_ENV: 'production' } });
  if (result.status !== 0) {
    throw new Error(`e2e global setup: \`npx vite build\` failed (exit ${result.status ?? result.signal}):\n${result.stdout}\n${result.stderr}`);
  }
  const server = spawnSync(process.execPath, ['scripts/build-server.mjs'], { cwd: repoRoot, encoding: 'utf8' });
  if (server.status !== 0) {
    throw new Error(`e2e global setup: \`node scripts/build-server.mjs\` failed (exit ${server.status ?? server.signal}):\n${server.stdout}\n${server.stderr}`);
  }
  console.log(`e2e global setup: built the browser app into dist/web and the server into dist/server in ${((performance.now() - started) / 1000).toFixed(1)} s`);
}
