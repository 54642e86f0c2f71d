/**
 * A team's day across three projects at once, in headless Chromium against the real app (demo
 * organisation, fresh SQLite file, with the local mail server and the outbox worker running as
 * api/server.ts runs them). Two designers (Priya Valcourt in two projects, Wren Halloway-Ito in the
 * third) and a reviewer (Samir Edelstein, in all three) work three invented projects whose specs the
 * systems engineer wrote and ranked together (through the API, as a script would):
 * - each person's home page lists what waits for them and nobody else's, with the navigation's
 *   count equal to what the lists hold;
 * - the reviewer searches by `/` for a word of every spec's title and finds the specs of all three
 *   projects; a designer searching the same word finds only the projects she belongs to;
 * - the designer sets two options side by side and the reviewer opens the same view from its
 *   address in a fresh page;
 * - the reviewer comments on a check, the designer replies, the reviewer resolves the thread;
 * - the administrator reads the e-mails on the Mail page: the designer's rankings reach her (the
 *   busy minute's in a digest), never her colleague's, and the reviewer's and the comment's
 *   messages name who decided and who commented.
 * The key pages are screenshotted at 1280 px and 390 px into test-results/screenshots/team-day/,
 * pass axe-core at both widths and are never wider than a 390 px screen.
 */
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessageEntity } from '../../api/entities/mail-message.entity';
import { MailOutboxEntity } from '../../api/entities/mail-outbox.entity';
import { configureNotifications, notificationSettings } from '../../api/services/notifications.service';
import { checkAccessibility } from './helpers/accessibility';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { jsonFromPage } from './helpers/page-api';
import { screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { demoEmail, signInAs, type DemoAccount } from './helpers/sign-in';

/** The demo people (api/seed/demo-seed.ts). */
const DESIGNER = 'Priya Valcourt';
const SECOND_DESIGNER = 'Wren Halloway-Ito';
const REVIEWER = 'Samir Edelstein';

/** A word of every spec title below, and of nothing in the demo organisation. */
const SHARED_WORD = 'Quillon';
/** Three invented projects; Priya designs in the first two, Wren in the third. */
const PROJECTS = [
  { key: 'osprey', name: 'Osprey gas-sensor front end', description: 'Invented for the team-day test: a pellistor bridge amplifier.', designer: 'designer' },
  { key: 'tamsin', name: 'Tamsin hydrophone preamplifier', description: 'Invented for the team-day test: a towed-array channel.', designer: 'designer' },
  { key: 'corvid', name: 'Corvid thermocouple scanner', description: 'Invented for the team-day test: a 16-channel scanner input.', designer: 'lead' },
] as const;
type ProjectKey = (typeof PROJECTS)[number]['key'];
/** Two specs in each of Priya's projects, one in Wren's: Priya's rankings make a busy minute for her. */
const SPECS: { project: ProjectKey; title: string }[] = [
  { project: 'osprey', title: `Osprey — ${SHARED_WORD} pellistor pair, rev A` },
  { project: 'osprey', title: `Osprey — ${SHARED_WORD} reference channel, rev A` },
  { project: 'tamsin', title: `Tamsin — ${SHARED_WORD} hydrophone input, rev C` },
  { project: 'tamsin', title: `Tamsin — ${SHARED_WORD} calibration tone path, rev C` },
  { project: 'corvid', title: `Corvid — ${SHARED_WORD} cold-junction pair, rev B` },
];
/** An invented spec with two tail options (a short ranking); a differential output. */
const PAYLOAD = {
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
const COMMENT = 'The pellistor heater pulls the negative rail at switch-on: is this margin taken with the rail low?';
const REPLY = 'Yes: the −5 % supply corner is in the sign-off search, and the margin holds there.';
/**
 * The digest window while the rankings are stored: on a loaded machine five rankings may spread
 * over more than the server helper's 5 s, and the digest is what this test reads.
 */
const SCENE_DIGEST_WINDOW_MS = 30_000;

type Person = 'admin' | 'requirements' | 'designer' | 'lead' | 'reviewer';

const shotDir = join(screenshotDir, 'team-day');

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<Person, Actor>;
const projectIds = {} as Record<ProjectKey, number>;
/** Proposal id by spec title. */
const proposalOf = new Map<string, number>();
let compareUrl = '';

const titlesOf = (...keys: ProjectKey[]) => SPECS.filter((s) => keys.includes(s.project)).map((s) => s.title);
const [DECIDED] = titlesOf('osprey');

/** The navigation's count of what waits (the number in the Waiting link). */
async function navCount(page: Page): Promise<number> {
  const badge = await visible(page.getByRole('navigation', { name: 'Main' }).locator('[data-waiting-count]'));
  return Number(await badge.getAttribute('data-waiting-count'));
}

/** The page at 1280 px (screenshot and axe), then at 390 px (screenshot, axe, nothing wider than the screen). */
async function bothWidths(actor: Actor, step: string, settle?: (page: Page) => Promise<unknown>): Promise<void> {
  await actor.page.setViewportSize({ width: 1280, height: 800 });
  await settle?.(actor.page);
  await record(actor, shots, `${step}-1280`);
  await actor.page.setViewportSize({ width: 390, height: 844 });
  await settle?.(actor.page);
  await actor.quiet();
  await shots.take(actor.page, `${step}-390`);
  await checkAccessibility(actor.page, `${step} at 390 px (${actor.role})`);
  const overflow = await actor.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow, `${step}: nothing wider than a 390 px screen`).toBeLessThanOrEqual(0);
  await actor.page.setViewportSize({ width: 1280, height: 800 });
}

/** Polls until the outbox has nothing waiting (the worker polls every 100 ms here). */
async function outboxDrained(timeoutMs: number): Promise<void> {
  const outbox = server.dataSource.getRepository(MailOutboxEntity);
  const deadline = Date.now() + timeoutMs;
  while ((await outbox.countBy({ status: 'pending' })) > 0) {
    if (Date.now() > deadline) throw new Error('The outbox still had messages waiting');
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}

describe('Longtail in the browser: a team’s day over three projects', () => {
  beforeAll(async () => {
    shots = screenshots(shotDir);
    [server, browser] = await Promise.all([startServer({ mail: true }), launchBrowser()]);
    const accounts: Person[] = ['admin', 'requirements', 'designer', 'lead', 'reviewer'];
    for (const person of accounts) {
      actors[person] = await openActor(browser, server.baseUrl, person as DemoAccount, { viewport: { width: 1280, height: 800 } });
      await signInAs(actors[person].page, person);
    }

    // The scene, through the API: three projects, their members, five specs ranked together, one decided.
    const usual = notificationSettings();
    configureNotifications({ ...usual, digestWindowMs: SCENE_DIGEST_WINDOW_MS });
    const admin = actors.admin.page;
    const users = await jsonFromPage<{ items: { id: number; email: string }[] }>(admin, 'GET', '/api/users');
    const idOf = (person: Person) => users.body.items.find((u) => u.email === demoEmail(person))!.id;
    for (const project of PROJECTS) {
      const created = await jsonFromPage<{ id: number }>(admin, 'POST', '/api/projects', { name: project.name, description: project.description });
      expect(created.status).toBe(201);
      projectIds[project.key] = created.body.id;
      for (const [person, role] of [['requirements', 'requirements'], [project.designer, 'designer'], ['reviewer', 'reviewer']] as const) {
        expect((await jsonFromPage(admin, 'POST', `/api/projects/${created.body.id}/members`, { userId: idOf(person), role })).status).toBe(201);
      }
    }
    const author = actors.requirements.page;
    const specIds: number[] = [];
    for (const spec of SPECS) {
      const saved = await jsonFromPage<{ id: number }>(author, 'POST', `/api/projects/${projectIds[spec.project]}/specs`, { title: spec.title, payload: { ...PAYLOAD, title: spec.title } });
      expect(saved.status).toBe(201);
      specIds.push(saved.body.id);
    }
    const ranked = await Promise.all(specIds.map((id) => jsonFromPage<{ id: number }>(author, 'POST', `/api/specs/${id}/proposals`)));
    ranked.forEach((answer, i) => {
      expect(answer.status).toBe(201);
      proposalOf.set(SPECS[i].title, answer.body.id);
    });
    const decided = await jsonFromPage(actors.designer.page, 'POST', `/api/proposals/${proposalOf.get(DECIDED)}/decision`, { kind: 'accept' });
    expect(decided.status).toBe(201);
    configureNotifications(usual);
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
  });

  it('each person’s home page lists what waits for them alone, and the navigation counts it', async () => {
    const expectations: { person: Person; region: RegExp; holds: string[]; lacks: string[]; by?: string }[] = [
      { person: 'designer', region: /^Rankings to decide\W+\d+$/, holds: titlesOf('osprey', 'tamsin').filter((t) => t !== DECIDED), lacks: [DECIDED, ...titlesOf('corvid')] },
      { person: 'lead', region: /^Rankings to decide\W+\d+$/, holds: titlesOf('corvid'), lacks: titlesOf('osprey', 'tamsin') },
      { person: 'reviewer', region: /^Decisions to review\W+\d+$/, holds: [DECIDED], lacks: titlesOf('osprey', 'tamsin', 'corvid').filter((t) => t !== DECIDED), by: `Decided by ${DESIGNER}` },
    ];
    for (const { person, region, holds, lacks, by } of expectations) {
      const actor = actors[person];
      const { page } = actor;
      await page.goto('/');
      const waiting = await visible(page.getByRole('region', { name: /^Waiting for you/ }));
      const list = await visible(waiting.getByRole('region', { name: region }));
      for (const title of holds) {
        const row = await visible(list.getByRole('listitem').filter({ hasText: title }));
        await expect(row.textContent()).resolves.toContain(`#${proposalOf.get(title)} `);
        if (by) await expect(row.textContent()).resolves.toContain(by);
      }
      const everything = (await waiting.textContent()) ?? '';
      for (const title of lacks) expect(everything, `${person} is not shown ${title}`).not.toContain(title);
      // The navigation's count is what the lists hold, kind by kind.
      const counts = await jsonFromPage<{ counts: Record<string, number>; kinds: string[] }>(page, 'GET', '/api/waiting/counts');
      const total = counts.body.kinds.reduce((sum, kind) => sum + counts.body.counts[kind], 0);
      expect(total).toBeGreaterThanOrEqual(holds.length);
      expect(await navCount(page)).toBe(total);
      await bothWidths(actor, `waiting-${person}`);
    }
  });

  it('the reviewer finds the specs of all three projects by one word; a designer finds only her projects’', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await page.locator('body').click({ position: { x: 5, y: 300 } });
    await page.keyboard.press('/');
    const input = page.getByRole('search').getByRole('combobox', { name: 'Search projects, specs, proposals and people' });
    await expect.poll(() => input.evaluate((element) => element === document.activeElement)).toBe(true);
    await page.keyboard.type(SHARED_WORD.toLowerCase(), { delay: 20 });
    await visible(page.getByRole('listbox', { name: 'Search results' }).getByRole('option').filter({ hasText: SHARED_WORD }));
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === '/search' && url.searchParams.get('q') === SHARED_WORD.toLowerCase());
    const specs = await visible(page.getByRole('region', { name: new RegExp(`^Specs\\W+${SPECS.length}$`) }));
    for (const { title } of SPECS) await visible(specs.getByRole('link', { name: new RegExp(`^${title}`) }));
    const proposals = await visible(page.getByRole('region', { name: /^Proposals\W+\d+$/ }));
    expect(await proposals.getByRole('link').count()).toBeGreaterThan(0);
    await bothWidths(actor, 'search-reviewer');

    const designer = actors.designer.page;
    await designer.goto(`/search?q=${SHARED_WORD}`);
    const hers = titlesOf('osprey', 'tamsin');
    const found = await visible(designer.getByRole('region', { name: new RegExp(`^Specs\\W+${hers.length}$`) }));
    for (const title of hers) await visible(found.getByRole('link', { name: new RegExp(`^${title}`) }));
    for (const title of titlesOf('corvid')) expect(await designer.getByText(title).count()).toBe(0);
  });

  it('the designer sets two options side by side; the reviewer opens the same view from its address', async () => {
    const { page } = actors.designer;
    const proposalId = proposalOf.get(titlesOf('tamsin')[0])!;
    await page.goto(`/proposals/${proposalId}`);
    const picker = await visible(page.getByRole('region', { name: 'Side by side' }));
    await picker.getByRole('combobox', { name: 'Compare', exact: true }).selectOption('degenerated-mirror');
    await picker.getByRole('combobox', { name: 'with', exact: true }).selectOption('cascode');
    await picker.getByRole('link', { name: 'Set these two options side by side' }).click();
    await page.waitForURL(new RegExp(`/compare\\?a=${proposalId}&b=${proposalId}&tailA=degenerated-mirror&tailB=cascode$`));
    compareUrl = new URL(page.url()).pathname + new URL(page.url()).search;

    const reviewer = actors.reviewer;
    await reviewer.page.goto(compareUrl);
    await visible(reviewer.page.getByRole('heading', { level: 1, name: 'Degenerated mirror beside Cascode mirror' }));
    for (const letter of ['A', 'B']) {
      const side = reviewer.page.getByRole('region', { name: `Side ${letter}`, exact: true });
      await expect.poll(() => side.innerText()).toMatch(new RegExp(`Proposal\\s+#${proposalId}`));
    }
    expect(await reviewer.page.locator('tr[data-marked]').count()).toBeGreaterThan(0);
    await bothWidths(reviewer, 'compare-from-address');
  });

  it('the reviewer comments on a check, the designer replies, and the reviewer resolves the thread', async () => {
    const proposalId = proposalOf.get(DECIDED)!;
    const reviewer = actors.reviewer.page;
    await reviewer.goto(`/proposals/${proposalId}`);
    await visible(reviewer.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
    const commentButton = reviewer.getByRole('button', { name: /^Comment on the check / }).first();
    const anchor = await commentButton.getAttribute('data-comment-anchor');
    await commentButton.click();
    const panel = reviewer.getByRole('dialog', { name: 'Comments' });
    await panel.getByRole('textbox', { name: 'New comment' }).fill(COMMENT);
    await panel.getByRole('button', { name: 'Post comment' }).click();
    await visible(panel.getByRole('article', { name: new RegExp(`^Comment #\\d+ by ${REVIEWER}`) }).getByText(COMMENT));
    await reviewer.keyboard.press('Escape');

    const designer = actors.designer;
    await designer.page.goto(`/proposals/${proposalId}`);
    const open = await visible(designer.page.locator(`button[data-comment-anchor="${anchor}"]`));
    expect(await open.getAttribute('aria-label')).toMatch(/: 1 open, 0 resolved$/);
    await open.click();
    const thread = designer.page.getByRole('dialog', { name: 'Comments' }).getByRole('article', { name: new RegExp(`^Comment #\\d+ by ${REVIEWER}`) });
    await visible(thread.getByText(COMMENT));
    await thread.getByRole('textbox', { name: 'Reply' }).fill(REPLY);
    await thread.getByRole('button', { name: 'Reply' }).click();
    await visible(thread.getByText(REPLY));
    const panelOpen = async (page: Page) => {
      // The panel is the point of these shots: open again if the resize closed it.
      const dialog = page.getByRole('dialog', { name: 'Comments' });
      if (!(await dialog.isVisible())) await page.locator(`button[data-comment-anchor="${anchor}"]`).click();
      await visible(dialog.getByText(REPLY));
      return dialog;
    };
    await bothWidths(designer, 'comment-replied', panelOpen);
    // A whole-page capture shows a fixed panel wherever the page was scrolled: the panel alone too, at both widths.
    for (const [width, height] of [[1280, 800], [390, 844]]) {
      await designer.page.setViewportSize({ width, height });
      await (await panelOpen(designer.page)).screenshot({ path: join(shotDir, `comment-panel-${width}.png`) });
    }
    await designer.page.setViewportSize({ width: 1280, height: 800 });
    await designer.page.keyboard.press('Escape');

    await reviewer.reload();
    await reviewer.locator(`button[data-comment-anchor="${anchor}"]`).click();
    const same = reviewer.getByRole('dialog', { name: 'Comments' }).getByRole('article', { name: new RegExp(`^Comment #\\d+ by ${REVIEWER}`) });
    await visible(same.getByText(REPLY));
    await visible(same.getByText(DESIGNER));
    await same.getByRole('button', { name: 'Resolve' }).click();
    await visible(same.getByText(new RegExp(`Resolved by ${REVIEWER}`)));
    await reviewer.keyboard.press('Escape');
    await visible(reviewer.getByRole('region', { name: 'Comments' }).getByText('0 open, 1 resolved.'));
  });

  it('the administrator reads the e-mails on the Mail page, each naming the right people', async () => {
    await outboxDrained(SCENE_DIGEST_WINDOW_MS + 20_000);
    const received = await server.dataSource.getRepository(MailMessageEntity).find();
    const to = (person: Person) => received.filter((m) => m.recipients.includes(demoEmail(person)));
    const isDigest = (m: { subject: string }) => /^Longtail: \d+ workflow updates?$/.test(m.subject);

    // Priya is told of each of her four rankings once (the busy minute's in a digest), never of Wren's.
    const toPriya = to('designer');
    const waitsForHer = (title: string) => `Proposal #${proposalOf.get(title)} waits for a decision`;
    for (const title of titlesOf('osprey', 'tamsin')) expect(toPriya.filter((m) => `${m.subject}\n${m.textBody}`.includes(waitsForHer(title))), title).toHaveLength(1);
    for (const title of titlesOf('corvid')) expect(toPriya.some((m) => m.textBody.includes(title))).toBe(false);
    const digest = toPriya.find((m) => isDigest(m) && titlesOf('osprey', 'tamsin').some((t) => m.textBody.includes(t)));
    expect(digest, 'a digest to the designer holding one of her rankings').toBeDefined();
    expect(digest!.textBody).toContain(`Hello ${DESIGNER},`);
    // Wren is told of his ranking, and of nothing in Priya's projects.
    const toWren = to('lead');
    const wrens = toWren.filter((m) => m.textBody.includes(titlesOf('corvid')[0]));
    expect(wrens).toHaveLength(1);
    expect(wrens[0].textBody).toContain(`Hello ${SECOND_DESIGNER},`);
    for (const title of titlesOf('osprey', 'tamsin')) expect(toWren.some((m) => m.textBody.includes(title))).toBe(false);
    // The reviewer is told who decided; the designer who commented, with the comment.
    expect(to('reviewer').filter((m) => m.textBody.includes(DECIDED) && m.textBody.includes(DESIGNER))).toHaveLength(1);
    const commented = toPriya.filter((m) => m.textBody.includes(COMMENT));
    expect(commented).toHaveLength(1);
    expect(commented[0].textBody).toContain(REVIEWER);
    // Her own reply tells nobody: the latest decision is hers.
    expect(received.some((m) => m.textBody.includes(REPLY))).toBe(false);

    const actor = actors.admin;
    const { page } = actor;
    await page.goto('/');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Mail' }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'Mail' }));
    await visible(page.getByRole('status').filter({ hasText: 'Outbox: nothing waiting' }));
    const list = page.getByRole('navigation', { name: 'Messages' });
    const pick = list.getByRole('button').filter({ hasText: digest!.subject }).filter({ hasText: `To ${demoEmail('designer')}` });
    await visible(pick);
    // Of the designer's digests, the one read above (they are listed newest first, as stored).
    const digestsToPriya = toPriya.filter(isDigest).sort((a, b) => b.id - a.id);
    await pick.nth(digestsToPriya.filter((m) => m.subject === digest!.subject).findIndex((m) => m.id === digest!.id)).click();
    const message = page.getByRole('region', { name: 'Message' });
    await visible(message.getByText(`Hello ${DESIGNER},`, { exact: false }));
    const shown = (await message.textContent()) ?? '';
    expect(shown).toContain(demoEmail('designer'));
    expect(titlesOf('osprey', 'tamsin').some((title) => shown.includes(title))).toBe(true);
    for (const title of titlesOf('corvid')) expect(shown).not.toContain(title);
    await bothWidths(actor, 'mail-designer-digest');

    await list.getByRole('button').filter({ hasText: `Proposal #${proposalOf.get(DECIDED)}: a new comment` }).click();
    await visible(message.getByText(COMMENT, { exact: false }));
    await expect(message.textContent()).resolves.toContain(REVIEWER);
    await record(actor, shots, 'mail-comment-1280');

    // On a phone the message comes after the whole list: picking one brings it into view.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.evaluate(() => window.scrollTo(0, 0));
    await list.getByRole('button').filter({ hasText: `Proposal #${proposalOf.get(DECIDED)} decided, waiting for review` }).filter({ hasText: `To ${demoEmail('reviewer')}` }).click();
    await visible(message.getByText(`Hello ${REVIEWER},`, { exact: false }));
    await expect.poll(() => message.evaluate((element) => element.getBoundingClientRect().top)).toBeLessThan(844 / 2);
    await expect(message.textContent()).resolves.toContain(DESIGNER);
    await actor.quiet();
    await shots.take(page, 'mail-reviewer-390');
    await page.setViewportSize({ width: 1280, height: 800 });

    for (const person of Object.keys(actors) as Person[]) expect(actors[person].problems.list, person).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
