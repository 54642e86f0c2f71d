/**
 * The whole workflow in the browser, in headless Chromium against the real app (built into
 * dist/web by the e2e globalSetup, served in-process on a fresh SQLite file with the demo
 * organisation): every demo role signs in through the form; the systems engineer writes a spec
 * in engineering notation and asks for a ranking; the designer overrides with own values and a
 * reason; the reviewer returns it; the designer decides again; the reviewer approves; the
 * record shows every step. Each role is refused what it may not do, on screen and by the
 * server (a direct API call from the page answering 403). Every step is screenshotted into
 * test-results/screenshots/, and every page visited passes axe-core with no serious or
 * critical violation (light theme, plus the proposal page once in the dark theme).
 *
 * The steps depend on each other and run in order, in one describe; each role keeps its own
 * browser context (its own session) for the whole run.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ProjectEntity } from '../../api/entities/project.entity';
import { UserEntity } from '../../api/entities/user.entity';
import { createProposal } from '../../api/services/proposals.service';
import { createSpec } from '../../api/services/specs.service';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { apiFromPage } from './helpers/page-api';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { DEMO_ROLES, demoEmail, signInAs, type DemoRole } from './helpers/sign-in';

/** The demo project the new spec goes into (api/seed/demo-seed.ts), and its people. */
const PROJECT = 'Kestrel load-cell amplifier';
const PEOPLE: Record<DemoRole, string> = { admin: 'Ines Okafor-Lind', requirements: 'Tomasz Rehn', designer: 'Priya Valcourt', reviewer: 'Samir Edelstein' };

const SPEC_TITLE = 'Kestrel rev C — ±7.5 V bridge input pair (browser test)';
const OVERRIDE_REASON = 'Stock on hand: 4k75 collector resistors and 1k emitter resistors from the rev B kit; 12k1 reference keeps the tail near 1.1 mA.';
const RETURN_COMMENT = 'The 1 kΩ emitter resistors move the tail current off 1.1 mA: take the ranked values unless stock really forces this.';
/**
 * The spec the browser writes above at the default ±10 % gain tolerance, in another demo project
 * where the designer also designs: no option holds the gain over 0 to 70 °C (it goes as 1/T,
 * about −12 % at 70 °C against 27 °C), so nothing is recommended.
 */
const OTHER_PROJECT = 'Larkspur studio interface';
const NOTHING_PASSES_TITLE = 'Kestrel rev C — ±7.5 V bridge input pair at ±10 % gain (browser test)';
const NOTHING_PASSES_SPEC = {
  supply: { positiveV: 7.5, negativeV: -7.5 },
  gain: { target: 100, tolerancePercent: 10 },
  cmrr: { minDb: 80, atFrequencyHz: 1000 },
  inputCommonMode: { minV: -1, maxV: 1.5 },
  temperatureC: { min: 0, max: 70 },
  powerBudgetW: 0.05,
  tailCurrentA: 1.1e-3,
  tailCapacitanceF: 3.3e-12,
};
const APPROVE_COMMENT = 'Recommended degenerated mirror with its ranked values; margins hold at both temperature corners.';

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<DemoRole, Actor>;
/** Set as the steps go. */
let projectId = 0;
let specId = 0;
let proposalId = 0;
/** The recommended tail's name as the ranking table shows it ("Degenerated mirror" for this spec today). */
let recommended = '';

async function openProposal(actor: Actor): Promise<void> {
  await actor.page.goto(`/proposals/${proposalId}`);
  await visible(actor.page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
  await visible(actor.page.getByRole('table', { name: /Tail options, ranked/ }));
}

/** Buttons and controls only a reviewer with a decision to review gets. */
const reviewButtons = (page: Page) => page.getByRole('button', { name: /^(Sign off|Send back for rework)$/ });
/** Controls only a designer deciding gets. */
const decisionControls = (page: Page) => page.getByRole('button', { name: /^Record decision/ }).or(page.getByRole('radio', { name: /Use my own values|Accept the recommendation|Choose another ranked option/ }));

describe('Longtail in the browser: spec to approved proposal', () => {
  beforeAll(async () => {
    shots = screenshots();
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    for (const role of DEMO_ROLES) actors[role] = await openActor(browser, server.baseUrl, role);
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
  });

  it('shows the sign-in page to someone not signed in', async () => {
    const { page } = actors.admin;
    await page.goto('/');
    await page.waitForURL(/\/sign-in/);
    await visible(page.getByRole('heading', { level: 1, name: 'Sign in' }));
    await record(actors.admin, shots, 'sign-in');
  });

  it('signs in each demo role through the form and shows its Projects page', async () => {
    for (const role of DEMO_ROLES) {
      const actor = actors[role];
      await signInAs(actor.page, role);
      await visible(actor.page.getByText(PEOPLE[role], { exact: true }));
      await visible(actor.page.getByRole('link', { name: new RegExp(PROJECT) }));
      // Only an administrator is offered People in the navigation
      const nav = actor.page.getByRole('navigation', { name: 'Main' });
      expect(await nav.getByRole('link', { name: 'People' }).count()).toBe(role === 'admin' ? 1 : 0);
      await record(actor, shots, `projects-${role}`);
    }
  });

  it('lets the administrator manage people', async () => {
    const { page } = actors.admin;
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'People' }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'People' }));
    await visible(page.getByRole('region', { name: 'Accounts' }).getByText('designer@demo.longtail.test'));
    await record(actors.admin, shots, 'people-admin');
  });

  it('the systems engineer opens a project and writes a new spec in engineering notation', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByRole('link', { name: new RegExp(PROJECT) }).click();
    await visible(page.getByRole('heading', { level: 1, name: PROJECT }));
    projectId = Number(/\/projects\/(\d+)/.exec(page.url())?.[1]);
    expect(projectId).toBeGreaterThan(0);
    await record(actor, shots, 'project-requirements');

    await page.getByRole('link', { name: 'New spec' }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'New spec' }));
    await visible(page.getByRole('button', { name: 'Create spec' }));
    await record(actor, shots, 'new-spec-empty');

    await page.getByRole('textbox', { name: /^Title/ }).fill(SPEC_TITLE);
    const supply = page.getByRole('group', { name: 'Supply rails' });
    await supply.getByRole('textbox', { name: /Positive rail/ }).fill('7.5 V');
    await supply.getByRole('textbox', { name: /Negative rail/ }).fill('-7.5 V');
    await page.getByRole('textbox', { name: /Gain target/ }).fill('100');
    // ±15 % over 0 to 70 °C: an undegenerated pair's gain goes as 1/T (about −12 % at 70 °C
    // against 27 °C), so the default ±10 % leaves no option passing; this front end's gain is
    // set by the load-cell calibration downstream, and ±15 % is what its requirement states.
    await page.getByRole('textbox', { name: /Gain tolerance/ }).fill('15');
    // Regulated ±7.5 V rails (±0.5 %) and 10 ppm/°C resistors: at the default ±5 % rails the
    // sign-off corners move a mirror's current, and with it the gain, past ±15 %
    await page.getByRole('textbox', { name: /Tolerance of the positive rail/ }).fill('0.5');
    await page.getByRole('textbox', { name: /Tolerance of the negative rail/ }).fill('0.5');
    await page.getByRole('textbox', { name: /^Temperature coefficient/ }).fill('10');
    await page.getByRole('textbox', { name: /Minimum CMRR/ }).fill('80 dB');
    await page.getByRole('textbox', { name: /At frequency/ }).fill('1k');
    const commonMode = page.getByRole('group', { name: 'Input common-mode range' });
    await commonMode.getByRole('textbox', { name: /Lowest/ }).fill('-1');
    await commonMode.getByRole('textbox', { name: /Highest/ }).fill('1.5');
    await page.getByRole('textbox', { name: /Power budget/ }).fill('50m');
    await page.getByRole('textbox', { name: /Tail capacitance/ }).fill('3.3 pF');

    // Text that is no quantity is refused beside its field, then corrected
    const tailCurrent = page.getByRole('textbox', { name: /Tail current/ });
    await tailCurrent.fill('1.1 mm');
    await visible(page.getByText(/cannot read '1\.1 mm'/));
    expect(await tailCurrent.getAttribute('aria-invalid')).toBe('true');
    await tailCurrent.fill('1.1m');

    // Each entry shows the SI value it was read as
    for (const reading of ['= 7.5 V', '= −7.5 V', '= 15 %', '= 1 kHz', '= 50 mW', '= 3.3 pF', '= 1.1 mA']) {
      await visible(page.getByText(reading, { exact: true }));
    }
    expect(await page.getByText(/cannot read/).count()).toBe(0);
    await record(actor, shots, 'new-spec-filled');

    await page.getByRole('button', { name: 'Create spec' }).click();
    await page.waitForURL(/\/specs\/\d+$/);
    specId = Number(/\/specs\/(\d+)$/.exec(page.url())?.[1]);
    await visible(page.getByRole('heading', { level: 1, name: SPEC_TITLE }));
    await visible(page.getByText('Saved as version 1.'));
    // The saved spec holds the values as read, shown back with prefixes
    expect(await page.getByRole('textbox', { name: /Tail current/ }).inputValue()).toBe('1.1m');
    expect(await page.getByRole('textbox', { name: /Tail capacitance/ }).inputValue()).toBe('3.3p');
    await record(actor, shots, 'spec-saved');
  });

  it('the systems engineer asks for a proposal and lands on its page', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByRole('button', { name: 'Rank tail options' }).click();
    await page.waitForURL(/\/proposals\/\d+$/, { timeout: 60_000 });
    proposalId = Number(/\/proposals\/(\d+)$/.exec(page.url())?.[1]);
    await visible(page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
    const options = await visible(page.getByRole('table', { name: /Tail options, ranked/ }));
    // Six topologies were asked for: one row each
    expect(await options.locator('tbody').getByRole('row').count()).toBe(6);
    // The spec leaves passing options, so there is a recommendation, marked in the table
    recommended = (await options.getByRole('rowheader', { name: /\(recommended\)/ }).getByRole('button').textContent())?.trim() ?? '';
    expect(recommended).not.toBe('');
    await visible(page.getByText('Awaiting decision').first());
    await record(actor, shots, 'ranking-requirements');
  });

  it('the systems engineer gets no decision or review controls, and the server refuses both', async () => {
    const { page } = actors.requirements;
    expect(await reviewButtons(page).count()).toBe(0);
    expect(await decisionControls(page).count()).toBe(0);
    await visible(page.getByRole('region', { name: 'Decision' }).getByText('No decision yet'));
    const review = await apiFromPage(page, 'POST', `/api/proposals/${proposalId}/review`, { verdict: 'approve' });
    expect(review).toEqual({ status: 403, code: 'forbidden' });
    const decision = await apiFromPage(page, 'POST', `/api/proposals/${proposalId}/decision`, { kind: 'accept' });
    expect(decision).toEqual({ status: 403, code: 'forbidden' });
  });

  it('the spec history page opens for the new spec', async () => {
    const actor = actors.requirements;
    await actor.page.goto(`/specs/${specId}/history`);
    await visible(actor.page.getByRole('heading', { level: 1, name: 'Version history' }));
    await visible(actor.page.getByText('Only one version so far'));
    await record(actor, shots, 'spec-history');
  });

  it('a designer opening People is not allowed, and the server refuses the accounts list', async () => {
    const actor = actors.designer;
    await actor.page.goto('/people');
    await visible(actor.page.getByRole('alert').getByRole('heading', { name: 'Not allowed' }));
    expect(await actor.page.getByRole('region', { name: 'Accounts' }).count()).toBe(0);
    await record(actor, shots, 'people-designer-not-allowed');
    expect(await apiFromPage(actor.page, 'GET', '/api/users')).toEqual({ status: 403, code: 'forbidden' });
  });

  it('the designer finds the new proposal waiting in the project', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await page.goto(`/projects/${projectId}`);
    await visible(page.getByRole('heading', { level: 1, name: PROJECT }));
    await visible(page.getByRole('region', { name: 'What needs you' }).getByRole('button', { name: /1 proposal waits for your decision/ }));
    const table = await visible(page.getByRole('table', { name: 'Proposals of this project' }));
    const row = table.getByRole('row').filter({ has: page.getByRole('link', { name: `Proposal #${proposalId}` }) });
    await visible(row.getByText('Awaiting decision'));
    await record(actor, shots, 'project-designer');
    await row.getByRole('link', { name: `Proposal #${proposalId}` }).click();
    await visible(page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
  });

  it('the designer overrides with own values in engineering notation and a reason', async () => {
    const actor = actors.designer;
    const { page } = actor;
    const decision = page.getByRole('region', { name: 'Your decision' });
    await visible(decision);
    expect(await reviewButtons(page).count()).toBe(0);
    await record(actor, shots, 'ranking-designer');

    await decision.getByRole('radio', { name: 'Use my own values' }).check();
    await decision.getByRole('combobox', { name: 'Tail topology' }).selectOption({ label: 'Degenerated mirror' });
    await decision.getByRole('textbox', { name: 'Collector resistor', exact: true }).fill('4k75');
    await decision.getByRole('textbox', { name: 'Reference resistor', exact: true }).fill('12k1');
    await decision.getByRole('textbox', { name: 'Emitter resistor', exact: true }).fill('1k');
    for (const reading of ['= 4.75 kΩ', '= 12.1 kΩ', '= 1 kΩ']) await visible(decision.getByText(new RegExp(`^${reading}`)));
    // The live what-if answers for the typed values
    await visible(decision.getByRole('status').filter({ hasText: 'Up to date' }));
    await decision.getByRole('textbox', { name: /^Reason/ }).fill(OVERRIDE_REASON);

    // The full check, where the form offers one, before recording
    const fullCheck = decision.getByRole('button', { name: /Check every rule at every corner/ });
    if ((await fullCheck.count()) > 0) {
      await fullCheck.click();
      await visible(decision.getByText('Up to date with the values in the fields.'), 60_000);
    }
    await record(actor, shots, 'override-filled');

    await decision.getByRole('button', { name: /^Record decision: own values/ }).click();
    // Values short on a blocking rule are recorded after a second thought
    const confirm = page.getByRole('alertdialog');
    const recorded = page.getByRole('status').filter({ hasText: 'Decision recorded' });
    await visible(confirm.or(recorded), 60_000);
    if (await confirm.isVisible()) {
      await shots.take(page, 'override-confirm');
      await confirm.getByRole('button', { name: 'Record it anyway' }).click();
    }
    await visible(recorded, 60_000);
    await visible(page.getByText('Awaiting review').first());
    await record(actor, shots, 'override-recorded');
  });

  it('the designer cannot review the decision: no review controls, and the server refuses', async () => {
    const { page } = actors.designer;
    expect(await reviewButtons(page).count()).toBe(0);
    expect(await apiFromPage(page, 'POST', `/api/proposals/${proposalId}/review`, { verdict: 'approve' })).toEqual({ status: 403, code: 'forbidden' });
  });

  it('the reviewer sees the decision waiting and returns it with a comment', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await page.goto(`/projects/${projectId}`);
    await visible(page.getByRole('region', { name: 'What needs you' }).getByRole('button', { name: /1 decision waits for your review/ }));
    await record(actor, shots, 'project-reviewer');

    await openProposal(actor);
    const review = await visible(page.getByRole('region', { name: 'Review the decided design' }));
    await visible(review.getByText(OVERRIDE_REASON));
    expect(await decisionControls(page).count()).toBe(0);
    await record(actor, shots, 'review-override');

    // Sending back needs a comment: asked for beside the field
    await review.getByRole('button', { name: 'Send back for rework' }).click();
    await visible(review.getByText(/sending back needs a comment/));
    await review.getByRole('textbox', { name: /^Comment/ }).fill(RETURN_COMMENT);
    await review.getByRole('button', { name: 'Send back for rework' }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Sent back for rework with your comment.' }));
    await visible(page.getByText('Returned to designer').first());
    await record(actor, shots, 'returned');
  });

  it('the reviewer gets no decision controls and no editable spec, and the server refuses both', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    expect(await decisionControls(page).count()).toBe(0);
    expect(await apiFromPage(page, 'POST', `/api/proposals/${proposalId}/decision`, { kind: 'accept' })).toEqual({ status: 403, code: 'forbidden' });

    await page.goto(`/specs/${specId}`);
    await visible(page.getByRole('heading', { level: 1, name: SPEC_TITLE }));
    await visible(page.getByText(/read-only: specs are edited by systems engineers/));
    const tailCurrent = await visible(page.getByRole('textbox', { name: /Tail current/ }));
    expect(await tailCurrent.isEditable()).toBe(false);
    expect(await page.getByRole('button', { name: /Save as new version|Rank tail options/ }).count()).toBe(0);
    await record(actor, shots, 'spec-reviewer-read-only');
    const payload = { title: SPEC_TITLE, supply: { positiveV: 9, negativeV: -9 }, gain: { target: 100 }, cmrr: { minDb: 80 } };
    expect(await apiFromPage(page, 'PUT', `/api/specs/${specId}`, { title: SPEC_TITLE, payload })).toEqual({ status: 403, code: 'forbidden' });
    expect(await apiFromPage(page, 'POST', `/api/specs/${specId}/proposals`)).toEqual({ status: 403, code: 'forbidden' });
  });

  it('the designer reads the comment and decides again: accepts the recommendation', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await page.goto(`/projects/${projectId}`);
    await visible(page.getByRole('region', { name: 'What needs you' }).getByRole('button', { name: /1 sent back for rework by a reviewer/ }));
    await openProposal(actor);
    const decision = await visible(page.getByRole('region', { name: 'Your decision' }));
    await visible(decision.getByRole('heading', { name: 'Decide again' }));
    await visible(decision.getByText(RETURN_COMMENT));
    await record(actor, shots, 'decide-again');

    await decision.getByRole('radio', { name: 'Accept the recommendation' }).check();
    await decision.getByRole('button', { name: new RegExp(`^Record decision: accept the ${recommended}`, 'i') }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Decision recorded' }), 60_000);
    await visible(page.getByText('Awaiting review').first());
    await record(actor, shots, 'accepted');
  });

  it('the reviewer runs every option through SPICE, watches it progress and reads engine and ngspice side by side', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await openProposal(actor);
    const panel = await visible(page.getByRole('region', { name: 'SPICE check' }));
    await panel.getByRole('button', { name: /Run every option through SPICE/ }).click();
    const progress = await visible(panel.getByRole('progressbar'));
    await progress.first().waitFor();
    await shots.take(page, 'verification-progress');
    const tally = await visible(panel.getByText(/(\d+) of \1 agree with the engine within tolerance/), 120_000);
    expect(await tally.first().textContent()).toMatch(/\b6 of 6 agree/);
    // Engine and ngspice figures, their difference, tolerance and verdict for the selected option.
    const table = panel.getByRole('table').filter({ hasText: 'Tail current' }).first();
    await visible(table.getByRole('columnheader', { name: 'Engine' }));
    await visible(table.getByRole('columnheader', { name: 'ngspice' }));
    await visible(table.getByRole('row').filter({ hasText: 'Tail output resistance' }).getByText(/Agrees/));
    await visible(panel.getByText(/Rejection against frequency/));
    await record(actor, shots, 'verification-result');
  });

  it('the reviewer approves; the systems engineer sees no review controls on the approved record', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await openProposal(actor);
    const review = await visible(page.getByRole('region', { name: 'Review the decided design' }));
    await visible(review.getByRole('heading', { name: 'Earlier reviews' }));
    await review.getByRole('textbox', { name: /^Comment/ }).fill(APPROVE_COMMENT);
    await review.getByRole('button', { name: 'Sign off' }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Signed off: the record is closed.' }));
    await visible(page.getByRole('main').getByText(/^\W*Approved$/));
    expect(await reviewButtons(page).count()).toBe(0);
    await record(actor, shots, 'approved');

    const author = actors.requirements;
    await openProposal(author);
    expect(await reviewButtons(author.page).count()).toBe(0);
    expect(await decisionControls(author.page).count()).toBe(0);
  });

  it('the review report shows every section with the SPICE results and prints to PDF', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await openProposal(actor);
    await page.getByRole('link', { name: 'Review report' }).click();
    for (const title of ['Cautions', 'Requirement spec', 'Ranked options', 'Chosen design', 'Checks', 'SPICE verification', 'Audit trail', 'Sources of the formulas']) {
      await visible(page.getByRole('heading', { level: 2, name: new RegExp(title) }));
    }
    await visible(page.getByText(/Every figure agrees within its tolerance/));
    expect(await page.getByText('Not verified yet.').count()).toBe(0);
    await record(actor, shots, 'review-report');
    await page.emulateMedia({ media: 'print' });
    await shots.take(page, 'review-report-print');
    const pdf = await page.pdf({ format: 'A4', printBackground: false });
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    await page.emulateMedia({ media: 'screen' });
  });

  it('the record shows every step, in order, with who did it', async () => {
    const actor = actors.requirements;
    const timeline = await visible(actor.page.getByRole('region', { name: 'Record of this proposal' }));
    const events = timeline.getByRole('list', { name: 'Events, oldest first' }).getByRole('listitem');
    await visible(events.nth(5));
    const texts = await events.allInnerTexts();
    expect(texts).toHaveLength(6);
    const expected: [string, RegExp][] = [
      [PEOPLE.requirements, new RegExp(`asked for a proposal of spec version 1: ranked by the engine; recommended: ${recommended}`, 'i')],
      [PEOPLE.designer, /decided: own values \(Degenerated mirror\)[\s\S]*Reason: .?Stock on hand/],
      [PEOPLE.reviewer, /sent the decided design \(Degenerated mirror, own values\) back for rework[\s\S]*Comment: .?The 1 kΩ emitter resistors/],
      [PEOPLE.designer, new RegExp(`decided: accepted the recommendation \\(${recommended}\\)`, 'i')],
      [PEOPLE.reviewer, /asked for a SPICE check of every option/],
      [PEOPLE.reviewer, /signed off the decided design \(Degenerated mirror\)[\s\S]*Comment: .?Recommended degenerated mirror/],
    ];
    expected.forEach(([who, what], i) => {
      expect(texts[i]).toContain(who);
      expect(texts[i]).toMatch(what);
    });
    await timeline.scrollIntoViewIfNeeded();
    await record(actor, shots, 'record-timeline');
  });

  it('the proposal page passes axe in the dark theme too', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await page.evaluate(() => localStorage.setItem('longtail.theme', 'dark'));
    await openProposal(actor);
    expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await visible(page.getByRole('button', { name: 'Theme: dark' }));
    await record(actor, shots, 'approved-dark');
    await page.evaluate(() => localStorage.removeItem('longtail.theme'));
  });

  it('on a ranking where no option passes, the designer reads plainly why there is nothing to accept', async () => {
    // Arranged through the services, as the demo seed is: the ranking itself is not what is tried here
    const { dataSource, ruleSet } = server;
    const author = await dataSource.getRepository(UserEntity).findOneByOrFail({ email: demoEmail('requirements') });
    const project = await dataSource.getRepository(ProjectEntity).findOneByOrFail({ name: OTHER_PROJECT });
    const spec = await createSpec(dataSource, author, project.id, { title: NOTHING_PASSES_TITLE, payload: NOTHING_PASSES_SPEC });
    const ranked = await createProposal(dataSource, author, spec.id, ruleSet);
    expect(ranked.result.recommended).toBeNull();

    const actor = actors.designer;
    const { page } = actor;
    await page.goto(`/proposals/${ranked.id}`);
    await visible(page.getByRole('heading', { level: 1, name: `Proposal #${ranked.id}` }));
    const decision = await visible(page.getByRole('region', { name: 'Your decision' }));
    expect(await decision.getByRole('radio', { name: 'Accept the recommendation' }).isDisabled()).toBe(true);
    await visible(decision.getByText(/No option passes every blocking check, so there is nothing to accept/));
    // The closed choice's words stay readable (axe checks their contrast)
    await record(actor, shots, 'ranking-designer-nothing-passes');
  });

  it('signs out', async () => {
    const { page } = actors.admin;
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto('/people');
    await page.waitForURL(/\/sign-in\?next=%2Fpeople/);
    expect(await apiFromPage(page, 'GET', '/api/users')).toEqual({ status: 401, code: 'not-signed-in' });
  });

  it('saw no uncaught error, CSP refusal or server error along the way', () => {
    const problems = DEMO_ROLES.flatMap((role) => actors[role].problems.list);
    expect(problems).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
