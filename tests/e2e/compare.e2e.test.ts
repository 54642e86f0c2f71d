/**
 * Side by side, in headless Chromium against the real app (demo organisation, fresh SQLite file).
 * The load-cell project holds two rankings of one spec: version 1 (rev A, a 3 dB rejection margin)
 * and version 2 (rev B, 6 dB). The designer sets two options of the rev B ranking side by side from
 * the proposal page, then that ranking beside the rev A one, then reaches the same two versions'
 * rankings from the spec's version history; the address reproduces each view in a fresh page, at
 * 1440 and 390 px (axe on each). A person outside the project opening the same address gets the
 * usual refusal.
 *
 * The steps depend on each other and run in order. Screenshots land in
 * test-results/screenshots/compare/.
 */
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkAccessibility } from './helpers/accessibility';
import { openActor, openFirstProposal, record, visible, type Actor } from './helpers/actors';
import { launchBrowser, newContext } from './helpers/browser';
import { screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { DEMO_PASSWORD, startServer, type RunningServer } from './helpers/server';
import { signInAs } from './helpers/sign-in';

const PROJECT = 'Kestrel load-cell amplifier';

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
let designer: Actor;
let optionsUrl = '';
let rankingsUrl = '';

/** The page at 1440 px (screenshot and axe), then at 390 px (screenshot and axe, and nothing wider than the screen). */
async function both(actor: Actor, step: string): Promise<void> {
  await actor.page.setViewportSize({ width: 1440, height: 900 });
  await record(actor, shots, `${step}-1440`);
  await actor.page.setViewportSize({ width: 390, height: 844 });
  await actor.quiet();
  await shots.take(actor.page, `${step}-390`);
  await checkAccessibility(actor.page, `${step} at 390 px`);
  const width = await actor.page.evaluate(() => document.documentElement.scrollWidth);
  expect(width, 'the page is no wider than a phone').toBeLessThanOrEqual(390);
  await actor.page.setViewportSize({ width: 1440, height: 900 });
}

/** The figures and checks tables' rows, as the page shows them. */
async function markedRows(page: Page): Promise<string[]> {
  return page.locator('tr[data-marked]').allInnerTexts();
}

describe('Longtail in the browser: side by side', () => {
  beforeAll(async () => {
    shots = screenshots(join(screenshotDir, 'compare'));
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    designer = await openActor(browser, server.baseUrl, 'designer');
    await signInAs(designer.page, 'designer');
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
  });

  it('sets two options of one ranking side by side from the proposal page, the choice kept in the address', async () => {
    const { page } = designer;
    await openFirstProposal(page, PROJECT);
    const picker = await visible(page.getByRole('region', { name: 'Side by side' }));
    await picker.getByRole('combobox', { name: 'Compare', exact: true }).selectOption('simple-mirror');
    await picker.getByRole('combobox', { name: 'with', exact: true }).selectOption('cascode');
    await picker.scrollIntoViewIfNeeded();
    await picker.screenshot({ path: join(screenshotDir, 'compare', 'picker-1440.png') });
    await checkAccessibility(page, 'proposal page with the side-by-side choices');
    await page.setViewportSize({ width: 390, height: 844 });
    await picker.screenshot({ path: join(screenshotDir, 'compare', 'picker-390.png') });
    await page.setViewportSize({ width: 1440, height: 900 });
    await picker.getByRole('link', { name: 'Set these two options side by side' }).click();
    await page.waitForURL(/\/compare\?a=\d+&b=\d+&tailA=simple-mirror&tailB=cascode$/);
    optionsUrl = new URL(page.url()).pathname + new URL(page.url()).search;
    await visible(page.getByRole('heading', { level: 1, name: 'Simple mirror beside Cascode mirror' }));

    // Each column says exactly where it comes from
    for (const letter of ['A', 'B']) {
      const side = page.getByRole('region', { name: `Side ${letter}`, exact: true });
      await expect.poll(() => side.innerText()).toMatch(/Proposal\s+#\d+/);
      expect(await side.innerText()).toMatch(/Engine\s+\d+\.\d+\.\d+/);
      expect(await side.innerText()).toMatch(/Rule set\s+[0-9a-f]{64}/);
      expect(await side.innerText()).toMatch(/version 2/);
    }
    // One ranking: nothing to warn of; the two tails differ, and each difference is said in words
    expect(await page.getByRole('note', { name: 'Read with care' }).count()).toBe(0);
    const marked = await markedRows(page);
    expect(marked.length).toBeGreaterThan(0);
    for (const row of marked) expect(row).toMatch(/moved [+−]\d|verdict changed|margin changed sign|only on side/);
    expect(await page.getByTestId('difference-summary').innerText()).toContain('more than 1 % of the larger');
    await visible(page.getByRole('figure').filter({ hasText: 'Rejection against frequency, both sides' }).locator('canvas'));
    await both(designer, 'two-options');
  });

  it('the address reproduces the view in a fresh page', async () => {
    const page = await designer.context.newPage();
    await page.goto(optionsUrl);
    await visible(page.getByRole('heading', { level: 1, name: 'Simple mirror beside Cascode mirror' }));
    expect(await markedRows(page)).toEqual(await markedRows(designer.page));
    await page.close();
  });

  it('sets the rev B ranking beside the rev A one (rev A on side A): the spec version said above the table, the spec’s changes field by field', async () => {
    const { page } = designer;
    await page.goBack();
    const picker = await visible(page.getByRole('region', { name: 'Side by side' }));
    const other = picker.getByRole('combobox', { name: /with another proposal of this project/ });
    const rev1 = other.locator('option', { hasText: 'version 1' });
    await other.selectOption(await rev1.first().getAttribute('value'));
    await picker.getByRole('link', { name: 'Set it beside this one' }).click();
    await page.waitForURL(/\/compare\?a=\d+&b=\d+/);
    rankingsUrl = new URL(page.url()).pathname + new URL(page.url()).search;
    const note = await visible(page.getByRole('note', { name: 'Read with care' }));
    // the earlier version on side A: before, then after
    expect(await note.innerText()).toContain('A: version 1, B: version 2');
    const changes = await visible(page.getByRole('region', { name: 'What the spec changed' }));
    await expect.poll(() => changes.innerText()).toMatch(/3 dB/);
    expect(await changes.innerText()).toMatch(/6 dB/);
    await both(designer, 'two-versions');
  });

  it('reaches the two versions’ rankings from the spec’s version history', async () => {
    const { page } = designer;
    await page.getByRole('region', { name: 'Side B', exact: true }).getByRole('link', { name: /rev B/ }).click();
    await page.waitForURL(/\/specs\/\d+$/);
    await page.goto(`${new URL(page.url()).pathname}/history`);
    const link = await visible(page.getByRole('link', { name: /^Set the rankings of versions 1 and 2 side by side/ }));
    await link.click();
    await page.waitForURL(/\/compare\?a=\d+&b=\d+$/);
    const note = await visible(page.getByRole('note', { name: 'Read with care' }));
    expect(await note.innerText()).toContain('A: version 1, B: version 2');
    await record(designer, shots, 'from-history-1440');
  });

  it('someone outside the project gets the usual refusal at the same address', async () => {
    const context = await newContext(browser, server.baseUrl);
    const page = await context.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail address').fill('lead@demo.longtail.test');
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { level: 1, name: 'Projects' }).waitFor();
    await page.goto(rankingsUrl);
    await visible(page.getByRole('alert'));
    expect(await page.getByRole('heading', { level: 1 }).innerText()).toMatch(/^Not (found|allowed)$/);
    expect(await page.getByRole('region', { name: 'Side A', exact: true }).count()).toBe(0);
    await shots.take(page, 'refused');
    await context.close();
  });
});
