/**
 * Screenshots of every step into test-results/screenshots/<NN>-<step>.png (kept after the run,
 * ignored by git). The folder is emptied of old PNGs when a run starts, so its list is this run's.
 */
import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import { join, relative } from 'node:path';
import type { Page } from 'playwright-core';
import { repoRoot, screenshotDir } from './paths';

/** How long one full-page capture may take, ms. */
const SCREENSHOT_TIMEOUT_MS = 60_000;

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
      // a full-page capture of a long page on a loaded 2-core machine can take well over the
      // default 20 s; a screenshot is evidence, not a speed check, so it gets a minute
      await page.screenshot({ path: file, fullPage: true, animations: 'disabled', timeout: SCREENSHOT_TIMEOUT_MS });
      const shown = relative(repoRoot, file);
      taken.push(shown);
      return shown;
    },
  };
}
