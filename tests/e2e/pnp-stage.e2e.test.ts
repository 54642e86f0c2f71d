/**
 * A PNP input pair from spec to sign-off, in headless Chromium against the real app with the demo
 * organisation: the systems engineer writes a spec for a single 5 V supply whose input range
 * reaches the negative rail and chooses the PNP family in the Device card (the PTAT source is then
 * offered disabled, with the server's reason), and asks for a ranking; the proposal draws the
 * PNP stage (tail from V+, PNPs hanging from it, loads down to V−); the designer accepts the
 * recommendation; the reviewer's SPICE check agrees with the engine and the reviewer signs off.
 * The spec form with PNP chosen and the proposal with its schematic are screenshotted at 1280 and
 * 390 px into test-results/screenshots/pnp-stage/, and every page recorded passes axe-core.
 */
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { validateSpec } from '#shared/validate';
import { checkAccessibility } from './helpers/accessibility';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { signInAs } from './helpers/sign-in';

/** The demo project of the PNP stage (api/seed/demo-seed.ts). */
const PROJECT = 'Sandpiper soil probe';
const SPEC_TITLE = 'Sandpiper rev B — PNP input on 5 V, range to 0 V (browser test)';
const APPROVE_COMMENT = 'PNP pair on the ranked Widlar values; the input range reaches the sensor’s 20 mV and ngspice agrees.';

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<'requirements' | 'designer' | 'reviewer', Actor>;
let projectId = 0;
let proposalId = 0;
/** The recommended tail's name as the ranking table shows it. */
let recommended = '';

/** The page at 1280 px (screenshot and axe), then at 390 px (screenshot and axe, nothing wider than the screen). */
async function bothWidths(actor: Actor, step: string): Promise<void> {
  await actor.page.setViewportSize({ width: 1280, height: 900 });
  await record(actor, shots, `${step}-1280`);
  await actor.page.setViewportSize({ width: 390, height: 844 });
  await actor.quiet();
  await shots.take(actor.page, `${step}-390`);
  await checkAccessibility(actor.page, `${step} at 390 px (${actor.role})`);
  const overflow = await actor.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow, `${step}: nothing wider than a 390 px screen`).toBeLessThanOrEqual(0);
  await actor.page.setViewportSize({ width: 1280, height: 900 });
}

async function openProposal(actor: Actor): Promise<void> {
  await actor.page.goto(`/proposals/${proposalId}`);
  await visible(actor.page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
  await visible(actor.page.getByRole('table', { name: /Tail options, ranked/ }));
}

describe('Longtail in the browser: a PNP input pair from spec to sign-off', () => {
  beforeAll(async () => {
    shots = screenshots(join(screenshotDir, 'pnp-stage'));
    [server, browser] = await Promise.all([startServer(), launchBrowser()]);
    for (const role of ['requirements', 'designer', 'reviewer'] as const) {
      actors[role] = await openActor(browser, server.baseUrl, role, { viewport: { width: 1280, height: 900 } });
      await signInAs(actors[role].page, role);
    }
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
  });

  it('the systems engineer writes a spec for a PNP pair on a single 5 V supply, the PTAT source refused for it in the server’s words', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByRole('link', { name: new RegExp(PROJECT) }).click();
    await visible(page.getByRole('heading', { level: 1, name: PROJECT }));
    projectId = Number(/\/projects\/(\d+)/.exec(page.url())?.[1]);
    await page.getByRole('link', { name: 'New spec' }).click();
    await visible(page.getByRole('button', { name: 'Create spec' }));

    await page.getByRole('textbox', { name: /^Title/ }).fill(SPEC_TITLE);
    const supply = page.getByRole('group', { name: 'Supply rails' });
    await supply.getByRole('textbox', { name: /Positive rail/ }).fill('5 V');
    await supply.getByRole('textbox', { name: /Negative rail/ }).fill('0');
    await page.getByRole('textbox', { name: /Tolerance of the positive rail/ }).fill('5');
    await page.getByRole('textbox', { name: /Tolerance of the negative rail/ }).fill('0');
    await page.getByRole('textbox', { name: /^Gain target/ }).fill('5');
    await page.getByRole('textbox', { name: /^Gain tolerance/ }).fill('10');
    await page.getByRole('textbox', { name: /^Minimum CMRR/ }).fill('60 dB');
    await page.getByRole('textbox', { name: /^At frequency/ }).fill('50');
    await page.getByRole('textbox', { name: /^Design margin/ }).fill('3');
    await page.getByRole('textbox', { name: /^Minimum yield/ }).fill('95');
    // The sensor sits 20 mV above the negative rail: the range reaches it
    const commonMode = page.getByRole('group', { name: 'Input common-mode range' });
    await commonMode.getByRole('textbox', { name: /Lowest/ }).fill('20m');
    await commonMode.getByRole('textbox', { name: /Highest/ }).fill('2.5');
    await page.getByRole('textbox', { name: /^Output swing/ }).fill('0.2');
    await page.getByRole('textbox', { name: /^Power budget/ }).fill('5m');
    const temperature = page.getByRole('group', { name: 'Temperature range' });
    await temperature.getByRole('textbox', { name: /Lowest/ }).fill('-20');
    await temperature.getByRole('textbox', { name: /Highest/ }).fill('70');
    await page.getByRole('textbox', { name: /^Temperature coefficient/ }).fill('50');

    // The Device card: the PNP family, and the PNP's own figures
    const family = page.getByRole('group', { name: /^Device family/ });
    expect(await family.getByRole('radio', { name: 'NPN bipolar' }).isChecked()).toBe(true);
    await family.getByRole('radio', { name: 'PNP bipolar' }).check();
    await page.getByRole('textbox', { name: /^Current gain \(beta\)/ }).fill('120');
    await page.getByRole('textbox', { name: /^Early voltage/ }).fill('55 V');
    await page.getByRole('textbox', { name: /^Saturation current IS/ }).fill('5f');
    await page.getByRole('textbox', { name: /^VCE\(sat\)/ }).fill('0.15');
    await page.getByRole('textbox', { name: /^VBE mismatch/ }).fill('0.8m');

    // The PTAT source needs an NPN pair: offered disabled, with the server's own reason
    const ptat = page.getByRole('checkbox', { name: 'PTAT (constant-gm) source — needs an NPN pair' });
    expect(await ptat.isDisabled()).toBe(true);
    const refused = validateSpec({ title: 'x', supply: { positiveV: 5, negativeV: 0 }, gain: { target: 5 }, cmrr: { minDb: 60 }, device: { family: 'pnp' }, topologies: ['ptat'] });
    if (refused.ok) throw new Error('the server takes a PNP spec with the PTAT source');
    const reason = refused.errors.find((e) => e.path === '/topologies')!.message.replace(/^the tail options include /, '');
    await visible(page.getByText(reason, { exact: false }));
    for (const reading of ['= 5 V', '= 20 mV', '= 5 mW', '= 5 fA', '= 55 V']) await visible(page.getByText(reading, { exact: true }));
    expect(await page.getByText(/cannot read/).count()).toBe(0);

    await page.getByRole('heading', { name: 'Device' }).scrollIntoViewIfNeeded();
    await bothWidths(actor, 'spec-form-pnp');

    await page.getByRole('button', { name: 'Create spec' }).click();
    await page.waitForURL(/\/specs\/\d+$/);
    await visible(page.getByText('Saved as version 1.'));
    expect(await page.getByRole('group', { name: /^Device family/ }).getByRole('radio', { name: 'PNP bipolar' }).isChecked()).toBe(true);
  });

  it('the systems engineer ranks it: the proposal draws the PNP stage, tail from V+ and loads down to V−', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByRole('button', { name: 'Rank tail options' }).click();
    await page.waitForURL(/\/proposals\/\d+$/, { timeout: 60_000 });
    proposalId = Number(/\/proposals\/(\d+)$/.exec(page.url())?.[1]);
    const options = await visible(page.getByRole('table', { name: /Tail options, ranked/ }));
    // Every bipolar tail but the PTAT source: six rows
    expect(await options.locator('tbody').getByRole('row').count()).toBe(6);
    recommended = (await options.getByRole('rowheader', { name: /\(recommended\)/ }).getByRole('button').textContent())?.trim() ?? '';
    expect(recommended).not.toBe('');
    const schematic = await visible(page.locator('svg[data-family="pnp"][role="img"]'));
    const words = (await schematic.first().getAttribute('aria-label')) ?? '';
    expect(words).toContain('PNP stage');
    expect(words).toContain('Tail from V+ (5 V) at the top');
    expect(words).toMatch(/down to V− \(0 V\)/);
    // Every transistor drawn is a PNP
    const polarities = await schematic.first().locator('[data-device]').evaluateAll((gs) => gs.map((g) => g.getAttribute('data-polarity')));
    expect(polarities.length).toBeGreaterThanOrEqual(4);
    expect(new Set(polarities)).toEqual(new Set(['pnp']));
    await schematic.first().scrollIntoViewIfNeeded();
    await bothWidths(actor, 'proposal-pnp-schematic');
  });

  it('the designer accepts the recommendation', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await openProposal(actor);
    const decision = await visible(page.getByRole('region', { name: 'Your decision' }));
    await decision.getByRole('radio', { name: 'Accept the recommendation' }).check();
    await decision.getByRole('button', { name: new RegExp(`^Record decision: accept the ${recommended}`, 'i') }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Decision recorded' }), 60_000);
    await visible(page.getByText('Awaiting review').first());
    await record(actor, shots, 'accepted');
  });

  it('the reviewer’s SPICE check of every option agrees with the engine', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await openProposal(actor);
    const panel = await visible(page.getByRole('region', { name: 'SPICE check' }));
    await panel.getByRole('button', { name: /Run every option through SPICE/ }).click();
    const tally = await visible(panel.getByText(/(\d+) of \1 agree with the engine within tolerance/), 180_000);
    expect(await tally.first().textContent()).toMatch(/\b6 of 6 agree/);
    await record(actor, shots, 'verification-result');
  });

  it('the reviewer signs off, and the netlist of the decided design carries the PNP card', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    const review = await visible(page.getByRole('region', { name: 'Review the decided design' }));
    await review.getByRole('textbox', { name: /^Comment/ }).fill(APPROVE_COMMENT);
    await review.getByRole('button', { name: 'Sign off' }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Signed off: the record is closed.' }));
    await visible(page.getByRole('main').getByText(/^\W*Approved$/));
    await record(actor, shots, 'approved');
    const netlist = await page.evaluate(async (id) => (await fetch(`/api/proposals/${id}/netlist.cir?source=decision&drive=differential`)).text(), proposalId);
    expect(netlist).toMatch(/^\.model QPNP PNP/m);
    expect(netlist).not.toMatch(/^\.model \S+ NPN/m);
    const csv = await page.evaluate(async (id) => (await fetch(`/api/proposals/${id}/ranking.csv`)).text(), proposalId);
    const [header, ...rows] = csv.trimEnd().split('\r\n').map((line) => line.split(','));
    const column = header.indexOf('device_family');
    expect(rows.map((row) => row[column])).toEqual(Array(6).fill('pnp'));
  });

  it('saw no uncaught error, CSP refusal or server error along the way', () => {
    expect(Object.values(actors).flatMap((a) => a.problems.list)).toEqual([]);
    expect(server.serverErrors).toEqual([]);
    expect(projectId).toBeGreaterThan(0);
  });
});
