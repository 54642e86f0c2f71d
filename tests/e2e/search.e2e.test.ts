/**
 * The one search in headless Chromium against the real app (demo organisation, fresh SQLite
 * file), by keyboard alone:
 * - the designer presses `/` on the home page, types a spec's value with its unit ("78 dB"),
 *   reads the listed spec with the value marked and why it matched, moves to it with the arrow
 *   keys and opens it with Enter;
 * - types a state, presses Enter with nothing chosen and lands on the results page; moves
 *   between the hits with the arrow keys and opens a proposal with Enter; pages through one kind;
 * - clears the box with Escape;
 * - finds nothing of a project they do not belong to, which its own member finds.
 * Every step is screenshotted at 1440 px and 390 px into test-results/screenshots/search/, and
 * passes axe-core at both widths (the box open, the results page, the dark theme).
 */
import { join } from 'node:path';
import type { Browser, Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkAccessibility } from './helpers/accessibility';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { jsonFromPage } from './helpers/page-api';
import { screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { signInAs } from './helpers/sign-in';

/** The demo spec whose minimum CMRR is 78 dB (api/demo/specs/strain-bridge-receiver.json). */
const BRIDGE_TITLE = 'Kestrel load-cell amplifier — strain bridge receiver, rev B';
/** A project the designer does not belong to, and its spec (invented). */
const HIDDEN_PROJECT = 'Ferrowick tide gauge';
const HIDDEN_SPEC = 'Ferrowick tide gauge — pressure bridge input';

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<'admin' | 'requirements' | 'designer', Actor>;

const box = (page: Page) => page.getByRole('search').getByRole('combobox', { name: 'Search projects, specs, proposals and people' });
const options = (page: Page) => page.getByRole('listbox', { name: 'Search results' });

/** The page as it is now at 1440 px (screenshot and axe), then at 390 px (screenshot, axe, nothing wider than the screen). */
async function bothWidths(actor: Actor, step: string, settle?: (page: Page) => Promise<unknown>): Promise<void> {
  await actor.page.setViewportSize({ width: 1440, height: 900 });
  await settle?.(actor.page);
  await record(actor, shots, `${step}-1440`);
  await actor.page.setViewportSize({ width: 390, height: 844 });
  await settle?.(actor.page);
  await actor.quiet();
  await shots.take(actor.page, `${step}-390`);
  await checkAccessibility(actor.page, `${step} at 390 px (${actor.role})`);
  const overflow = await actor.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow, `${step}: nothing wider than a 390 px screen`).toBeLessThanOrEqual(0);
  await actor.page.setViewportSize({ width: 1440, height: 900 });
}

/** `/` from the page, then the query typed as a person types it. */
async function typeQuery(page: Page, query: string): Promise<Locator> {
  await page.locator('body').click({ position: { x: 5, y: 300 } });
  await page.keyboard.press('/');
  const input = box(page);
  await expect.poll(() => input.evaluate((element) => element === document.activeElement)).toBe(true);
  await page.keyboard.type(query, { delay: 20 });
  return input;
}

describe('Longtail in the browser: the one search, by keyboard', () => {
  beforeAll(async () => {
    shots = screenshots(join(screenshotDir, 'search'));
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    for (const role of ['admin', 'requirements', 'designer'] as const) {
      actors[role] = await openActor(browser, server.baseUrl, role);
      await signInAs(actors[role].page, role);
    }
    // The scene: a project only the systems engineer belongs to, with a spec (through the API, as a script would).
    const admin = actors.admin.page;
    const project = await jsonFromPage<{ id: number }>(admin, 'POST', '/api/projects', { name: HIDDEN_PROJECT, description: 'Harbour pressure sensor; invented for the search test.' });
    expect(project.status).toBe(201);
    const me = await jsonFromPage<{ user: { id: number } }>(actors.requirements.page, 'GET', '/api/auth/me');
    expect((await jsonFromPage(admin, 'POST', `/api/projects/${project.body.id}/members`, { userId: me.body.user.id, role: 'requirements' })).status).toBe(201);
    const payload = { ...(await import('../../api/demo/specs/strain-bridge-receiver.json')).default, title: HIDDEN_SPEC };
    const spec = await jsonFromPage(actors.requirements.page, 'POST', `/api/projects/${project.body.id}/specs`, { title: HIDDEN_SPEC, payload });
    expect(spec.status).toBe(201);
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
    for (const actor of Object.values(actors)) expect(actor.problems.list).toEqual([]);
    expect(server?.serverErrors ?? []).toEqual([]);
  });

  it('the designer presses /, types a value with its unit, reads why the spec matched and opens it with the arrow keys and Enter', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await page.goto('/');
    await visible(page.getByRole('heading', { level: 1, name: 'Projects' }));
    const input = await typeQuery(page, '78 dB');
    const list = await visible(options(page));
    const specs = list.getByRole('group', { name: /^Specs: \d+$/ });
    const bridge = specs.getByRole('option').filter({ hasText: BRIDGE_TITLE });
    await visible(bridge);
    expect(await bridge.locator('mark').allTextContents()).toContain('78 dB');
    await expect(bridge.textContent()).resolves.toContain('Minimum CMRR: 78 dB');
    await bothWidths(actor, 'box-78-db', async (p) => {
      // The list closes when the page is resized with the box blurred: put the cursor back.
      if (!(await options(p).isVisible())) await box(p).focus();
      await visible(options(p));
    });

    await box(page).focus();
    await visible(options(page));
    const all = await list.getByRole('option').allTextContents();
    const index = all.findIndex((text) => text.includes(BRIDGE_TITLE));
    for (let i = 0; i <= index; i += 1) await page.keyboard.press('ArrowDown');
    const chosen = await input.getAttribute('aria-activedescendant');
    expect(await page.locator(`[id="${chosen}"]`).textContent()).toContain(BRIDGE_TITLE);
    expect(await page.locator(`[id="${chosen}"]`).getAttribute('aria-selected')).toBe('true');
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/specs\/\d+$/);
    await visible(page.getByRole('heading', { level: 1, name: BRIDGE_TITLE }));
    expect(await input.inputValue()).toBe('');
  });

  it('the designer types a state, presses Enter for the results page, moves between hits with the arrow keys and opens one', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await typeQuery(page, 'awaiting decision');
    await visible(options(page));
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === '/search' && url.searchParams.get('q') === 'awaiting decision');
    await visible(page.getByRole('heading', { level: 1, name: 'Search' }));
    const proposals = await visible(page.getByRole('region', { name: /^Proposals\W+\d+$/ }));
    const links = proposals.getByRole('link');
    await visible(links.first());
    expect(await links.count()).toBeGreaterThanOrEqual(2);
    for (const text of await links.allTextContents()) expect(text).toContain('Awaiting decision');
    await bothWidths(actor, 'results-awaiting-decision');

    // The cursor on the first hit, then down and up the list by arrow keys, and Enter opens the one it is on.
    const focused = () => page.evaluate(() => document.activeElement?.getAttribute('href'));
    const [first, second] = [await links.nth(0).getAttribute('href'), await links.nth(1).getAttribute('href')];
    await links.first().focus();
    await page.keyboard.press('ArrowDown');
    expect(await focused()).toBe(second);
    await page.keyboard.press('ArrowUp');
    expect(await focused()).toBe(first);
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === second);
  });

  it('the designer reads one kind alone and its pages, and the results in the dark theme', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await page.goto('/search?q=kestrel');
    const kinds = await visible(page.getByRole('navigation', { name: 'Kinds of results' }));
    await kinds.getByRole('link', { name: /^Proposals \d+$/ }).click();
    await page.waitForURL((url) => url.searchParams.get('kind') === 'proposal');
    const list = await visible(page.getByRole('list', { name: 'Proposals' }));
    expect(await list.getByRole('link').count()).toBeGreaterThan(0);
    expect(await kinds.getByRole('link', { name: /^Proposals/ }).getAttribute('aria-current')).toBe('page');
    await bothWidths(actor, 'results-kestrel-proposals');

    await page.emulateMedia({ colorScheme: 'dark' });
    await page.goto('/search?q=kestrel');
    await visible(page.getByRole('region', { name: /^Specs\W+\d+$/ }));
    expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await typeQuery(page, 'mirror');
    await visible(options(page));
    await actor.quiet();
    await checkAccessibility(page, 'search, dark theme');
    await shots.take(page, 'search-dark');
    await page.keyboard.press('Escape');
    await page.emulateMedia({ colorScheme: 'light' });
  });

  it('Escape clears the box and closes the list; a second Escape leaves the box', async () => {
    const { page } = actors.designer;
    await page.goto('/');
    const input = await typeQuery(page, 'kestrel');
    await visible(options(page));
    await page.keyboard.press('Escape');
    expect(await input.inputValue()).toBe('');
    expect(await options(page).count()).toBe(0);
    expect(await input.evaluate((element) => element === document.activeElement)).toBe(true);
    await page.keyboard.press('Escape');
    expect(await input.evaluate((element) => element === document.activeElement)).toBe(false);
  });

  it('the designer finds nothing of a project they do not belong to; its member finds it', async () => {
    const designer = actors.designer.page;
    await designer.goto(`/search?q=${encodeURIComponent('Ferrowick')}`);
    await visible(designer.getByText('Nothing you can see matches “Ferrowick”'));
    await record(actors.designer, shots, 'results-other-project-designer');
    const answer = await jsonFromPage<{ counts: Record<string, number> }>(designer, 'GET', '/api/search?q=Ferrowick');
    expect(answer.body.counts).toEqual({ project: 0, spec: 0, proposal: 0, person: 0 });

    const requirements = actors.requirements.page;
    await requirements.goto(`/search?q=${encodeURIComponent('Ferrowick')}`);
    const specs = await visible(requirements.getByRole('region', { name: /^Specs\W+1$/ }));
    await visible(specs.getByRole('link', { name: new RegExp(`^${HIDDEN_SPEC}`) }));
    await visible(requirements.getByRole('region', { name: /^Projects\W+1$/ }).getByRole('link', { name: new RegExp(`^${HIDDEN_PROJECT}`) }));
    await record(actors.requirements, shots, 'results-other-project-member');
  });
});
