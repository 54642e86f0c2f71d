/**
 * What waits for whom, and a project's activity, in headless Chromium against the real app (demo
 * organisation, fresh SQLite file), walked by two roles:
 * - the designer finds a new ranking among the rankings to decide on the home page (with its
 *   project and age) and the count in the navigation, follows the count from a project page back
 *   to the list, opens the ranking from it and decides; the count drops at once;
 * - the reviewer finds that decision among the decisions to review, with who decided it, opens it
 *   and sends it back; then reads the project's activity, filters it by kind and by person, and
 *   downloads what the filter keeps as CSV;
 * - the designer finds the decision sent back, marked as theirs.
 * Every step is screenshotted at 1440 px (and the lists at 390 px) into
 * test-results/screenshots/waiting-list/, and passes axe-core at both widths (the home page in the
 * dark theme too).
 */
import { join } from 'node:path';
import Papa from 'papaparse';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkAccessibility } from './helpers/accessibility';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { jsonFromPage } from './helpers/page-api';
import { screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { signInAs } from './helpers/sign-in';

/** The demo project, its designer and reviewer (api/seed/demo-seed.ts). */
const PROJECT = 'Kestrel load-cell amplifier';
const DESIGNER = 'Priya Valcourt';
const REVIEWER = 'Samir Edelstein';
const SPEC_TITLE = 'Kestrel rev E — thermopile input pair (waiting-list test)';
/** An invented spec with two tail options (a short ranking); a differential output. */
const SPEC = {
  title: SPEC_TITLE,
  device: { beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 },
  supply: { positiveV: 9, negativeV: -9 },
  gain: { target: 14, tolerancePercent: 8, output: 'differential' },
  cmrr: { minDb: 74, atFrequencyHz: 400, marginDb: 3, minYieldPercent: 95 },
  inputCommonMode: { minV: -2.2, maxV: 2.6 },
  outputSwingVpp: 2.4,
  powerBudgetW: 0.03,
  supplyTolerance: { positivePercent: 0.2, negativePercent: 0.2 },
  resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 10 },
  monteCarlo: { samples: 300, seed: 17 },
  topologies: ['degenerated-mirror', 'cascode'],
};
const RETURN_COMMENT = 'Show the rejection at the cold corner before I sign this off.';

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<'requirements' | 'designer' | 'reviewer', Actor>;
let projectId = 0;
let proposalId = 0;

/** The navigation's count of what waits (the number in the Waiting link). */
async function navCount(page: Page): Promise<number> {
  const badge = await visible(page.getByRole('navigation', { name: 'Main' }).locator('[data-waiting-count]'));
  return Number(await badge.getAttribute('data-waiting-count'));
}

/** Waits until the navigation's count reads `expected` (no reload: the app refreshes it). */
async function navCountBecomes(page: Page, expected: number): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).locator(`[data-waiting-count="${expected}"]`).waitFor({ timeout: 20_000 });
}

/** The page as it is now at 1440 px (screenshot and axe), then at 390 px (screenshot and axe). */
async function bothWidths(actor: Actor, step: string): Promise<void> {
  await actor.page.setViewportSize({ width: 1440, height: 900 });
  await record(actor, shots, `${step}-1440`);
  await actor.page.setViewportSize({ width: 390, height: 844 });
  await actor.quiet();
  await shots.take(actor.page, `${step}-390`);
  await checkAccessibility(actor.page, `${step} at 390 px (${actor.role})`);
  const overflow = await actor.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow, `${step}: nothing wider than a 390 px screen`).toBeLessThanOrEqual(0);
  await actor.page.setViewportSize({ width: 1440, height: 900 });
}

describe('Longtail in the browser: what waits for whom, and a project’s activity', () => {
  beforeAll(async () => {
    shots = screenshots(join(screenshotDir, 'waiting-list'));
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    for (const role of ['requirements', 'designer', 'reviewer'] as const) {
      actors[role] = await openActor(browser, server.baseUrl, role);
      await signInAs(actors[role].page, role);
    }
    // The scene: the systems engineer writes a spec in the demo project and ranks it (through the API, as a script would).
    const page = actors.requirements.page;
    const projects = await jsonFromPage<{ items: { id: number; name: string }[] }>(page, 'GET', '/api/projects');
    projectId = projects.body.items.find((p) => p.name === PROJECT)!.id;
    const spec = await jsonFromPage<{ id: number }>(page, 'POST', `/api/projects/${projectId}/specs`, { title: SPEC_TITLE, payload: SPEC });
    expect(spec.status).toBe(201);
    const ranked = await jsonFromPage<{ id: number }>(page, 'POST', `/api/specs/${spec.body.id}/proposals`);
    expect(ranked.status).toBe(201);
    proposalId = ranked.body.id;
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
  });

  it('the designer finds the new ranking among the rankings to decide, with its project and age, and the count in the navigation', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await page.goto('/');
    const waiting = await visible(page.getByRole('region', { name: /^Waiting for you/ }));
    const decide = waiting.getByRole('region', { name: /^Rankings to decide\W+\d+$/ });
    const row = decide.getByRole('listitem').filter({ hasText: SPEC_TITLE });
    await visible(row);
    expect(await row.getByRole('link').textContent()).toBe(`#${proposalId} ${SPEC_TITLE}v1`);
    await expect(row.textContent()).resolves.toMatch(/^waiting (under a minute|\d+ min)/);
    await expect(row.textContent()).resolves.toContain(PROJECT);
    await expect(row.textContent()).resolves.toContain('Asked for by Tomasz Rehn');
    // The navigation counts what the lists hold.
    const counts = await jsonFromPage<{ counts: Record<string, number>; kinds: string[] }>(page, 'GET', '/api/waiting/counts');
    const total = counts.body.kinds.reduce((sum, kind) => sum + counts.body.counts[kind], 0);
    expect(await navCount(page)).toBe(total);
    expect(await decide.getByRole('heading').textContent()).toMatch(new RegExp(`${counts.body.counts.decide}$`));
    await bothWidths(actor, 'designer-waiting');
    // The app follows the system theme as it opens: the dark one, then back.
    await page.emulateMedia({ colorScheme: 'dark' });
    await page.reload();
    await visible(page.getByRole('region', { name: /^Rankings to decide/ }).getByRole('listitem'));
    expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await actor.quiet();
    await checkAccessibility(page, 'designer home, dark theme');
    await shots.take(page, 'designer-waiting-dark');
    await page.emulateMedia({ colorScheme: 'light' });
    await page.reload();
  });

  it('the designer follows the count from a project page back to the list, opens the ranking and decides; the count drops at once', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await page.goto(`/projects/${projectId}`);
    await visible(page.getByRole('heading', { level: 1, name: PROJECT }));
    const before = await navCount(page);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: /^Waiting \d+/ }).click();
    await page.waitForURL((url) => url.pathname === '/' && url.hash === '#waiting');
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe('waiting-heading');

    await page.getByRole('region', { name: /^Rankings to decide/ }).getByRole('link', { name: new RegExp(`^#${proposalId} `) }).click();
    await page.waitForURL(new RegExp(`/proposals/${proposalId}$`));
    const decision = await visible(page.getByRole('region', { name: 'Your decision' }));
    await decision.getByRole('radio', { name: 'Accept the recommendation' }).check();
    await decision.getByRole('button', { name: /^Record decision: accept the / }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Decision recorded' }), 60_000);
    await navCountBecomes(page, before - 1);
    await record(actor, shots, 'designer-decided');
  });

  it('the reviewer finds the decision among the decisions to review, with who decided, opens it and sends it back', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await page.goto('/');
    const review = await visible(page.getByRole('region', { name: /^Decisions to review\W+\d+$/ }));
    const row = review.getByRole('listitem').filter({ hasText: SPEC_TITLE });
    await visible(row);
    await expect(row.textContent()).resolves.toContain(`Decided by ${DESIGNER}`);
    await bothWidths(actor, 'reviewer-waiting');

    const before = await navCount(page);
    await row.getByRole('link').click();
    await page.waitForURL(new RegExp(`/proposals/${proposalId}$`));
    const panel = await visible(page.getByRole('region', { name: 'Review the decided design' }));
    await panel.getByRole('textbox', { name: /^Comment/ }).fill(RETURN_COMMENT);
    await panel.getByRole('button', { name: 'Send back for rework' }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Sent back for rework with your comment.' }));
    await navCountBecomes(page, before - 1);
  });

  it('the reviewer reads the project’s activity, filters it by kind and person, and downloads what the filter keeps', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await page.goto(`/projects/${projectId}`);
    await page.getByRole('link', { name: 'Activity', exact: true }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'Activity' }));
    const events = await visible(page.getByRole('list', { name: 'Events, newest first' }));
    const newest = events.getByRole('listitem').first();
    await expect(newest.textContent()).resolves.toContain(`${REVIEWER} (you) sent the decided design`);
    await expect(newest.textContent()).resolves.toContain(RETURN_COMMENT);
    await visible(newest.getByRole('link', { name: SPEC_TITLE }));
    await bothWidths(actor, 'activity');

    await page.getByRole('combobox', { name: 'Show' }).selectOption({ label: 'decisions' });
    await page.getByRole('combobox', { name: 'by' }).selectOption({ label: DESIGNER });
    await page.waitForURL((url) => url.searchParams.get('kind') === 'decisions' && url.searchParams.has('person'));
    await visible(events.getByRole('listitem').first().filter({ hasText: `${DESIGNER} decided: accepted the recommendation` }));
    const shown = await events.locator('li[data-action]').evaluateAll((items) => items.map((item) => item.getAttribute('data-action')));
    expect(new Set(shown)).toEqual(new Set(['proposal.decided']));
    await bothWidths(actor, 'activity-decisions-by-designer');

    const href = await page.getByRole('link', { name: 'These events as CSV' }).getAttribute('href');
    expect(href).toMatch(/^\/api\/projects\/\d+\/activity\.csv\?actor=\d+&kind=decisions$/);
    const csv = await page.evaluate(async (url) => (await fetch(url, { credentials: 'same-origin' })).text(), href!);
    const rows = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true }).data;
    expect(rows.length).toBe(shown.length);
    expect(rows.every((r) => r.action === 'proposal.decided' && r.person === DESIGNER)).toBe(true);
    expect(rows.at(-1)).toMatchObject({ proposal_id: String(proposalId), spec_title: SPEC_TITLE, what: expect.stringMatching(/^decided: accepted the recommendation/) });
  });

  it('the designer finds the decision sent back, marked as theirs', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await page.goto('/');
    const rework = await visible(page.getByRole('region', { name: /^Sent back for a new decision\W+\d+$/ }));
    const row = rework.getByRole('listitem').filter({ hasText: SPEC_TITLE });
    await visible(row);
    await expect(row.textContent()).resolves.toContain(`Sent back by ${REVIEWER}`);
    await visible(row.getByText('your decision'));
    await bothWidths(actor, 'designer-sent-back');
    for (const role of ['designer', 'reviewer'] as const) expect(actors[role].problems.list, role).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
