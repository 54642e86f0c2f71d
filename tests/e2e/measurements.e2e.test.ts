/**
 * Bench measurements in the browser, in headless Chromium against the real app (built into
 * dist/web by the e2e globalSetup, served in-process on a fresh SQLite file with the demo
 * organisation): the demo designer opens the load-cell project's proposal (accepted and approved
 * in the demo seed), uploads a broken file and reads its problems with line numbers, then
 * uploads the example measurement (tests/fixtures/fernhollow-bench-cmrr.csv) through the panel,
 * and finds the plot (uPlot's canvas, the legend's measured and predicted entries) and the
 * sentence stating the difference at the spec frequency; the page passes axe-core.
 *
 * The fixture measures 91.3 dB at 2.5 kHz, the spec frequency of strain-bridge-receiver.json, so
 * the sentence starts "Measured 91.3 dB at 2.5 kHz" whatever the engine predicts.
 *
 * Output (ignored by git): test-results/screenshots/measurements/measurements.png.
 */
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MeasurementEntity } from '../../api/entities/measurement.entity';
import { checkAccessibility } from './helpers/accessibility';
import { openActor, openFirstProposal, visible } from './helpers/actors';
import { launchBrowser, type PageProblems } from './helpers/browser';
import { repoRoot, screenshotDir } from './helpers/paths';
import { startServer, type RunningServer } from './helpers/server';
import { signInAs } from './helpers/sign-in';

/** The demo project whose proposal has a decision (api/seed/demo-seed.ts). */
const PROJECT = 'Kestrel load-cell amplifier';
const FIXTURE = join(repoRoot, 'tests', 'fixtures', 'fernhollow-bench-cmrr.csv');
const shotDir = join(screenshotDir, 'measurements');

let server: RunningServer;
let browser: Browser;
let page: Page;
let problems: PageProblems;
let quiet: (idleMs?: number, timeoutMs?: number) => Promise<void>;

describe('bench measurements on the proposal page', () => {
  beforeAll(async () => {
    mkdirSync(shotDir, { recursive: true });
    rmSync(join(shotDir, 'measurements.png'), { force: true });
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    ({ page, quiet, problems } = await openActor(browser, server.baseUrl, 'designer'));
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('the designer opens the decided demo proposal and finds the panel', async () => {
    await signInAs(page, 'designer');
    await openFirstProposal(page, PROJECT);
    const panel = page.getByRole('region', { name: 'Bench measurements' });
    await visible(panel.getByText('No measurements yet'));
    await visible(panel.getByText(/estimates/));
    await quiet();
  });

  it('refuses a broken file with its problems on their lines, and stores nothing', async () => {
    const panel = page.getByRole('region', { name: 'Bench measurements' });
    await panel.getByLabel('Upload a measurement (CSV)').setInputFiles({
      name: 'broken.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from('frequency_hz,cmrr_db\n10,91\n5,90\n100,loud\n', 'utf8'),
    });
    const alert = await visible(panel.getByRole('alert'));
    await visible(alert.getByText('broken.csv was not saved', { exact: false }));
    await visible(alert.getByText('Line 3:'));
    await visible(alert.getByText('Line 4:'));
    expect(await server.dataSource.getRepository(MeasurementEntity).count()).toBe(0);
  });

  it('uploads the example measurement and shows the plot and the difference at the spec frequency', async () => {
    const panel = page.getByRole('region', { name: 'Bench measurements' });
    await panel.getByLabel('Note for the next upload (optional)').fill('Board K-03, 25 °C');
    await panel.getByLabel('Upload a measurement (CSV)').setInputFiles(FIXTURE);

    const sentence = await visible(panel.getByTestId('measurement-difference'));
    expect(await sentence.textContent()).toMatch(/^Measured 91\.3 dB at 2\.5 kHz, \d+\.\d dB (above|below) the prediction \(\d+\.\d dB\)\.$/);
    await visible(panel.locator('canvas'));
    const legend = panel.locator('figure');
    await visible(legend.getByText('Bench (measured)'));
    await visible(legend.getByText('Engine (predicted)'));
    await visible(panel.getByRole('table', { name: 'Bench measurements of this proposal' }).getByText('fernhollow-bench-cmrr.csv'));
    await visible(panel.getByText(/Board K-03, 25 °C/).first());
    expect(await panel.getByRole('alert').count()).toBe(0);
    expect(await server.dataSource.getRepository(MeasurementEntity).count()).toBe(1);
    await quiet();
  });

  it('passes axe-core with no serious or critical violation', async () => {
    await checkAccessibility(page, 'proposal page with a bench measurement (designer)');
  });

  it('is screenshotted at the panel', async () => {
    await page.locator('#measurements').scrollIntoViewIfNeeded();
    await page.locator('#measurements').screenshot({ path: join(shotDir, 'measurements.png'), animations: 'disabled' });
    expect(problems.list).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
