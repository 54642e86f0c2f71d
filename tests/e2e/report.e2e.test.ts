/**
 * The review report in the browser, in headless Chromium against the real app (built into
 * dist/web by the e2e globalSetup, served in-process on a fresh SQLite file with the demo
 * organisation): the demo reviewer opens the biosignal project's proposal (an override the
 * reviewer returned; the spec marks the input patient-connected), follows "Review report" from
 * the proposal page (after commenting on a check, replying and resolving the thread there), and
 * finds every section with the caution and the comment thread; the page passes axe-core; it is
 * screenshotted on screen and with print media, and printed to PDF.
 *
 * Output (ignored by git): test-results/screenshots/report/report-screen.png and
 * report-print.png, and test-results/report.pdf. Its own folder, so the workflow test's
 * clearing of test-results/screenshots/*.png leaves these alone.
 */
import { mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkAccessibility } from './helpers/accessibility';
import { openActor, openFirstProposal, visible } from './helpers/actors';
import { launchBrowser, type PageProblems } from './helpers/browser';
import { repoRoot, screenshotDir } from './helpers/paths';
import { startServer, type RunningServer } from './helpers/server';
import { signInAs } from './helpers/sign-in';

/** The demo project whose proposal carries a caution (api/seed/demo-seed.ts, electrode-amplifier-input.json). */
const PROJECT = 'Marram biosignal front end';
const SECTIONS = ['Cautions', 'Requirement spec', 'Ranked options', 'Chosen design', 'Checks', 'SPICE verification', 'Bench measurements', 'Comments', 'Audit trail', 'Sources of the formulas'];
/** The reviewer's comment on a check and the reply (invented). */
const COMMENT = 'Is the patient-leakage margin taken at the hot corner?';
const REPLY = 'Yes: 45 °C with the supply high.';

const shotDir = join(screenshotDir, 'report');
const pdfPath = join(repoRoot, 'test-results', 'report.pdf');

let server: RunningServer;
let browser: Browser;
let page: Page;
let problems: PageProblems;
let quiet: (idleMs?: number, timeoutMs?: number) => Promise<void>;
let proposalId = 0;

describe('the review report, printed', () => {
  beforeAll(async () => {
    mkdirSync(shotDir, { recursive: true });
    for (const file of ['report-screen.png', 'report-print.png']) rmSync(join(shotDir, file), { force: true });
    rmSync(pdfPath, { force: true });
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    ({ page, quiet, problems } = await openActor(browser, server.baseUrl, 'reviewer'));
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  it('the reviewer follows "Review report" from a demo proposal', async () => {
    await signInAs(page, 'reviewer');
    await openFirstProposal(page, PROJECT);
    proposalId = Number(/\/proposals\/(\d+)$/.exec(page.url())?.[1]);
    await visible(page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));

    // A comment on a check of the decided option, a reply, the thread resolved: the record the report prints.
    await page.getByRole('button', { name: /^Comment on the check / }).first().click();
    const panel = page.getByRole('dialog', { name: 'Comments' });
    await panel.getByRole('textbox', { name: 'New comment' }).fill(COMMENT);
    await panel.getByRole('button', { name: 'Post comment' }).click();
    const thread = panel.getByRole('article', { name: /^Comment #\d+ by / });
    await visible(thread.getByText(COMMENT));
    await thread.getByRole('textbox', { name: 'Reply' }).fill(REPLY);
    await thread.getByRole('button', { name: 'Reply' }).click();
    await visible(thread.getByText(REPLY));
    await thread.getByRole('button', { name: 'Resolve' }).click();
    await visible(thread.getByText(/Resolved by/));
    await page.keyboard.press('Escape');
    await visible(page.getByRole('region', { name: 'Comments' }).getByText('0 open, 1 resolved.'));

    await page.getByRole('link', { name: 'Review report' }).click();
    await page.waitForURL(new RegExp(`/proposals/${proposalId}/report$`));
    await visible(page.getByRole('heading', { level: 1, name: new RegExp(`Proposal #${proposalId}`) }));
    await quiet();
  });

  it('shows every section in order, with the caution and the estimates notice', async () => {
    const headings = (await page.getByRole('heading', { level: 2 }).allTextContents()).map((h) => h.replace(/^\d+\s*/, '').trim());
    expect(headings).toEqual(SECTIONS);

    const cautions = page.getByRole('region', { name: /Cautions/ });
    await visible(cautions.getByText(/patient-connected/i));
    await visible(cautions.getByText(/applicable standards, local codes or licensed practice/));

    const title = page.locator('header.report-title');
    await visible(title.getByText(PROJECT));
    await visible(title.getByText('Returned to designer'));
    await visible(page.getByText(/confirm them by SPICE simulation and bench measurement/).first());

    // The override and the reviewer's return, with the drawn stage
    const design = page.getByRole('region', { name: /Chosen design/ });
    await visible(design.getByText(/used own values/));
    await visible(design.getByText(/sent this decision back for rework/));
    expect(await design.getByRole('img', { name: /^Schematic, degenerated mirror tail/ }).count()).toBe(1);
    // The design's Monte Carlo and the ranking's rejection against frequency, drawn as SVG (they print).
    await visible(design.getByRole('img', { name: /Monte Carlo samples/ }));
    const rejection = page.getByRole('region', { name: /Ranked options/ }).getByRole('img', { name: /Rejection against frequency/ });
    await visible(rejection);
    expect(await rejection.evaluate((el) => el.tagName.toLowerCase())).toBe('svg');
    expect(await page.locator('.report-page canvas').count()).toBe(0);

    const checks = page.getByRole('region', { name: /^\d+\s*Checks$/ });
    await visible(checks.getByRole('heading', { level: 3, name: /Every check of Degenerated mirror, the decided design/ }));

    // Nothing was verified in the demo (or the server has no verification route yet)
    await visible(page.getByRole('region', { name: /SPICE verification/ }).getByText('Not verified yet.'));

    // The comment thread: its anchor, state, author, text and reply
    const comments = page.getByRole('region', { name: /^\d+\s*Comments$/ });
    await visible(comments.getByText(/^#\d+ on the check “.+” of the /));
    await visible(comments.getByText(/Resolved by/));
    await visible(comments.getByText(COMMENT));
    await visible(comments.getByText(REPLY));

    // The audit trail, each time to the second
    const auditTimes = await page.getByRole('region', { name: /Audit trail/ }).locator('time').allTextContents();
    expect(auditTimes.length).toBeGreaterThanOrEqual(3);
    for (const time of auditTimes) expect(time).toMatch(/\d{1,2}:\d{2}:\d{2}/);

    await visible(page.getByRole('region', { name: /Sources of the formulas/ }).getByText(/Gray, Hurst, Lewis, Meyer/));
    await visible(page.getByRole('button', { name: 'Print or save as PDF' }));
  });

  it('passes axe-core with no serious or critical violation', async () => {
    await checkAccessibility(page, 'review report (reviewer)');
  });

  it('is screenshotted on screen and with print media, and prints to a PDF of several pages', async () => {
    await page.screenshot({ path: join(shotDir, 'report-screen.png'), fullPage: true, animations: 'disabled' });

    await page.emulateMedia({ media: 'print' });
    // Printed: no app frame and no buttons
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false);
    expect(await page.getByRole('button', { name: 'Print or save as PDF' }).isVisible()).toBe(false);
    // Printed, the plots are still there.
    await visible(page.getByRole('img', { name: /Rejection against frequency/ }));
    await page.screenshot({ path: join(shotDir, 'report-print.png'), fullPage: true, animations: 'disabled' });

    await page.pdf({ path: pdfPath, format: 'A4', preferCSSPageSize: true });
    const pdf = readFileSync(pdfPath);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const pages = pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g)?.length ?? 0;
    expect(pages).toBeGreaterThan(1);
    expect(pdf.length).toBeGreaterThan(20_000);
    await page.emulateMedia({ media: 'screen' });

    expect(problems.list).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
