/**
 * Screenshots of every step into test-results/screenshots/<NN>-<step>.png (kept after the run,
 * ignored by git). The folder is emptied of old PNGs when a run starts, so its list is this run's.
 */
import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import { join, relative } from 'node:path';
import type { Page } from 'playwright-core';
import { repoRoot, screenshotDir } from './paths';

export interface Screenshots {
  /** Takes a full-page screenshot named after the step; returns its path relative to the repository. */
  take(page: Page, step: string): Promise<string>;
  readonly taken: string[];
}

export function screenshots(dir = screenshotDir): Screenshots {
  mkdirSync(dir, { recursive: true });
  for (const file of readdirSync(dir)) if (file.endsWith('.png')) rmSync(join(dir, file));
  const taken: string[] = [];
  return {
    taken,
    async take(page, step) {
      const slug = step.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');
      const file = join(dir, `${String(taken.length + 1).padStart(2, '0')}-${slug}.png`);
      await page.screenshot({ path: file, fullPage: true, animations: 'disabled' });
      const shown = relative(repoRoot, file);
      taken.push(shown);
      return shown;
    },
  };
}
