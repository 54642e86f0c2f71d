/**
 * What is decided is what is shown, verified and signed off, in headless Chromium against the real
 * app (demo organisation, fresh SQLite file). A designer's own values are decided and simulated in
 * SPICE; the reviewer sends them back; the designer decides again with other values (RC and the
 * pair's emitter resistors) through the form. The reviewer then finds the earlier SPICE result
 * labelled stale with what changed, the sign-off held with the reason, runs the fresh check the
 * page offers, and signs off; the review records the job it relied on. The page header, the
 * netlist download, the project list and the review report all name the signed-off design.
 *
 * The steps depend on each other and run in order. Screenshots land in
 * test-results/screenshots/decided-design/.
 */
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { jsonFromPage } from './helpers/page-api';
import { screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { signInAs, type DemoRole } from './helpers/sign-in';

const PROJECT = 'Kestrel load-cell amplifier';
const SPEC_TITLE = 'Kestrel rev D — thermopile input pair (decided-design test)';
/** An invented spec with two tail options, so each SPICE check is short; a differential output. */
const SPEC = {
  title: SPEC_TITLE,
  device: { beta: 180, earlyVoltageV: 72, saturationCurrentA: 9e-15 },
  supply: { positiveV: 9, negativeV: -9 },
  gain: { target: 14, tolerancePercent: 8, output: 'differential' },
  cmrr: { minDb: 74, atFrequencyHz: 400, marginDb: 3, minYieldPercent: 95 },
  inputCommonMode: { minV: -2.2, maxV: 2.6 },
  outputSwingVpp: 2.4,
  powerBudgetW: 0.03,
  // bench rails (±0.2 %) and 10 ppm/°C resistors: the degenerated mirror passes at the sign-off corners
  supplyTolerance: { positivePercent: 0.2, negativePercent: 0.2 },
  resistors: { series: 'E96', tolerancePercent: 1, tempcoPpmPerC: 10 },
  monteCarlo: { samples: 300, seed: 17 },
  topologies: ['degenerated-mirror', 'cascode'],
};
/** E96 values near the engine's sizing (RC 2.26 kΩ, pair RE 82.5 Ω): first decided, then decided again. */
const FIRST = { rc: 2210, re: 78.7 };
const SECOND = { rcText: '2k49', reText: '100', rc: 2490 };

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<DemoRole, Actor>;
let projectId = 0;
let proposalId = 0;
let freshJobId = 0;

async function textFromPage(page: Page, url: string): Promise<string> {
  return page.evaluate(async (href) => (await fetch(href, { credentials: 'same-origin' })).text(), url);
}

async function openProposal(actor: Actor): Promise<void> {
  await actor.page.goto(`/proposals/${proposalId}`);
  await visible(actor.page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
  await visible(actor.page.getByRole('table', { name: /Tail options, ranked/ }));
}

describe('Longtail in the browser: the decided design is what is verified and signed off', () => {
  beforeAll(async () => {
    shots = screenshots(join(screenshotDir, 'decided-design'));
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    for (const role of ['requirements', 'designer', 'reviewer'] as const) {
      actors[role] = await openActor(browser, server.baseUrl, role);
      await signInAs(actors[role].page, role);
    }
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
  });

  it('sets the scene: a spec ranked, own values decided and simulated in SPICE', async () => {
    const { page } = actors.requirements;
    const projects = await jsonFromPage<{ items: { id: number; name: string }[] }>(page, 'GET', '/api/projects');
    projectId = projects.body.items.find((p) => p.name === PROJECT)!.id;
    const spec = await jsonFromPage<{ id: number }>(page, 'POST', `/api/projects/${projectId}/specs`, { title: SPEC_TITLE, payload: SPEC });
    expect(spec.status).toBe(201);

    const designer = actors.designer.page;
    const ranked = await jsonFromPage<{ id: number; result: { recommended: string; options: { topology: string; design: Record<string, unknown> }[] } }>(designer, 'POST', `/api/specs/${spec.body.id}/proposals`);
    expect(ranked.status).toBe(201);
    proposalId = ranked.body.id;
    expect(ranked.body.result.recommended).toBe('degenerated-mirror');
    const design = ranked.body.result.options.find((o) => o.topology === 'degenerated-mirror')!.design;
    const decided = await jsonFromPage(designer, 'POST', `/api/proposals/${proposalId}/decision`, {
      kind: 'override',
      design: { ...design, collectorResistanceOhm: FIRST.rc, pairEmitterResistanceOhm: FIRST.re },
      reason: 'Bench drawer stock: 2k21 collector and 78R7 emitter resistors.',
    });
    expect(decided.status).toBe(201);

    const reviewer = actors.reviewer.page;
    expect((await jsonFromPage(reviewer, 'POST', `/api/proposals/${proposalId}/verification`)).status).toBe(202);
    for (let i = 0; ; i += 1) {
      const status = await jsonFromPage<{ verification: { state: string } | null; currentDesign: { state: string } }>(reviewer, 'GET', `/api/proposals/${proposalId}/verification`);
      if (status.body.verification?.state === 'finished') {
        expect(status.body.currentDesign.state).toBe('current');
        break;
      }
      expect(i, 'the first SPICE check finishes within 2 minutes').toBeLessThan(1200);
      await reviewer.waitForTimeout(100);
    }
  });

  it('the reviewer sends the own values back for rework', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await openProposal(actor);
    const review = await visible(page.getByRole('region', { name: 'Review the decided design' }));
    await review.getByRole('textbox', { name: /^Comment/ }).fill('Use the 2k49 parts from the new reel and a little more degeneration.');
    await review.getByRole('button', { name: 'Send back for rework' }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Sent back for rework with your comment.' }));
  });

  it('the designer decides again with other values through the form', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await openProposal(actor);
    const decision = await visible(page.getByRole('region', { name: 'Your decision' }));
    await decision.getByRole('radio', { name: 'Use my own values' }).check();
    await decision.getByRole('combobox', { name: 'Tail topology' }).selectOption({ label: 'Degenerated mirror' });
    await decision.getByRole('textbox', { name: 'Collector resistor', exact: true }).fill(SECOND.rcText);
    await decision.getByRole('textbox', { name: 'Pair emitter resistor', exact: true }).fill(SECOND.reText);
    await visible(decision.getByText(/^= 2\.49 kΩ/));
    await decision.getByRole('textbox', { name: /^Reason/ }).fill('New reel: 2k49 collector resistors; 100 Ω emitter resistors.');
    await decision.getByRole('button', { name: /^Record decision: own values/ }).click();
    const confirm = page.getByRole('alertdialog');
    const recorded = page.getByRole('status').filter({ hasText: 'Decision recorded' });
    await visible(confirm.or(recorded), 60_000);
    if (await confirm.isVisible()) await confirm.getByRole('button', { name: 'Record it anyway' }).click();
    await visible(recorded, 60_000);
    // The page now heads with the decided own values, not the recommendation.
    await visible(page.getByTestId('header-design').filter({ hasText: 'Decided design: Degenerated mirror, own values' }));
  });

  it('the reviewer finds the earlier SPICE result labelled stale with what changed, and the sign-off held with the reason', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await openProposal(actor);
    const check = await visible(page.getByRole('region', { name: 'SPICE check', exact: true }));
    const note = await visible(check.locator('[data-design-check="stale"]'));
    expect(await note.innerText()).toContain('simulated RC 2.21 kΩ, decided 2.49 kΩ');
    expect(await note.innerText()).toContain('simulated pair RE 78.7 Ω, decided 100 Ω');
    const ownRow = check.getByRole('table', { name: /Every simulated option/ }).getByRole('row', { name: /Designer’s own values/ });
    expect(await ownRow.innerText()).toMatch(/stale[\s\S]*simulated RC 2\.21 kΩ, decided 2\.49 kΩ/i);

    const review = page.getByRole('region', { name: 'Review the decided design' });
    const signOff = review.getByRole('button', { name: 'Sign off' });
    await visible(review.getByTestId('sign-off-hold').filter({ hasText: /simulated another design/ }));
    expect(await signOff.isDisabled()).toBe(true);
    await check.scrollIntoViewIfNeeded();
    await record(actor, shots, 'stale-label');
  });

  it('the reviewer runs the fresh SPICE check the page offers, and it is of the decided design', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    const check = page.getByRole('region', { name: 'SPICE check', exact: true });
    await check.getByRole('button', { name: 'Run a fresh SPICE check of the decided design' }).click();
    const current = await visible(check.locator('[data-design-check="current"]'), 120_000);
    const text = await current.innerText();
    freshJobId = Number(/job #(\d+)/.exec(text)![1]);
    expect(text).toContain('simulated exactly the decided design (Degenerated mirror, own values)');
    await visible(check.getByRole('region', { name: 'SPICE check of Designer’s own values (Degenerated mirror)' }).getByText('of the current design'));
  });

  it('the reviewer signs off; the review records the job it relied on', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    const review = page.getByRole('region', { name: 'Review the decided design' });
    const signOff = review.getByRole('button', { name: 'Sign off' });
    await expect.poll(() => signOff.isEnabled(), { timeout: 20_000 }).toBe(true);
    await signOff.click();
    await visible(page.getByRole('status').filter({ hasText: 'Signed off: the record is closed.' }));
    await visible(page.getByTestId('relied-on').filter({ hasText: `Relied on SPICE job #${freshJobId}, which simulated exactly this design.` }));
    const proposal = await jsonFromPage<{ reviews: { verificationJobId: number; staleVerificationAccepted: boolean }[] }>(page, 'GET', `/api/proposals/${proposalId}`);
    expect(proposal.body.reviews.at(-1)).toMatchObject({ verificationJobId: freshJobId, staleVerificationAccepted: false });
  });

  it('the header, the highlighted summary and the netlist download name the signed-off design', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await openProposal(actor);
    await visible(page.getByTestId('header-design').filter({ hasText: 'Signed-off design: Degenerated mirror, own values' }));
    expect(await page.locator('[data-current-design]').first().innerText()).toMatch(/^Signed-off design\s*Degenerated mirror, own values/);
    const download = page.getByRole('link', { name: 'Signed-off design as SPICE netlist (own values)' });
    const href = (await download.getAttribute('href'))!;
    expect(href).toContain('source=decision');
    const netlist = await textFromPage(page, href);
    const rc1 = netlist.split('\n').find((line) => /^RC1\s/i.test(line))!;
    expect(Number(rc1.trim().split(/\s+/)[3])).toBeCloseTo(SECOND.rc, 6);
    expect(netlist).toContain('signed-off design, Degenerated mirror, own values');
    await record(actor, shots, 'approved-proposal');
    await page.setViewportSize({ width: 390, height: 844 });
    await openProposal(actor);
    await shots.take(page, 'approved-proposal-390px');
    await page.setViewportSize({ width: 1440, height: 900 });
  });

  it('the project list names the signed-off design, with the recommendation and the reason beside it', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.goto(`/projects/${projectId}`);
    const table = await visible(page.getByRole('table', { name: 'Proposals of this project' }));
    const row = table.getByRole('row').filter({ has: page.getByRole('link', { name: `Proposal #${proposalId}` }) });
    const text = await row.innerText();
    expect(text).toContain('Degenerated mirror, own values');
    expect(text).toContain('(signed off)');
    expect(text).toContain('why: New reel');
    await record(actor, shots, 'project-list');
  });

  it('the review report names the signed-off design and its SPICE check is of that design', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.goto(`/proposals/${proposalId}/report`);
    await visible(page.getByRole('heading', { level: 1, name: new RegExp(`Proposal #${proposalId}`) }));
    await visible(page.getByTestId('report-design').filter({ hasText: 'Signed-off design: Degenerated mirror, own values' }));
    const verification = page.locator('#report-verification');
    await visible(verification.locator('[data-design-check="current"]'));
    expect(await verification.locator('[data-design-check="current"]').innerText()).toContain(`SPICE job #${freshJobId} simulated exactly the decided design`);
    await record(actor, shots, 'report');
    expect([...actors.requirements.problems.list, ...actors.designer.problems.list, ...actors.reviewer.problems.list]).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
