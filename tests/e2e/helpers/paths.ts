/** Where things are, from the repository root (this file lives in tests/e2e/helpers/). */
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '..', '..', '..');
/** The production build the server serves (vite.config.ts: build.outDir). */
export const webDist = join(repoRoot, 'dist', 'web');
/** Kept after the run (ignored by git): screenshots of every step. */
export const screenshotDir = join(repoRoot, 'test-results', 'screenshots');
