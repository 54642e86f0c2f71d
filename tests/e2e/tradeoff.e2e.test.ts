/**
 * The whole decision the tail current sets, in headless Chromium against the real app (demo
 * organisation, fresh SQLite file). The systems engineer adds noise, slew-rate and bias-current
 * targets to a demo spec through its form (10 nV/√Hz at 1 kHz, 5 V/µs into 20 pF, 3 µA) and
 * ranks the new version; the ranking table shows a column per target with its unit, and the
 * trade-off view of the selected option shows the window of tail current the targets leave, with
 * the current the option is sized at inside it. The designer moves the current with the slider's
 * keys, reads the what-if figures at the new current against each limit, and accepts the
 * recommendation. The reviewer runs the SPICE check and finds ngspice's noise at 1 kHz, slew rate
 * and input bias current agreeing with the engine's.
 *
 * The steps depend on each other and run in order. Screenshots land in
 * test-results/screenshots/tradeoff/.
 */
import { join, relative } from 'node:path';
import type { Browser, Locator } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatQuantity } from '#shared/units/format-quantity';
import { parseQuantity } from '#shared/units/parse-quantity';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { repoRoot, screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { signInAs, type DemoRole } from './helpers/sign-in';

/** The demo project and its spec (api/demo/specs/studio-line-receiver.json), ranked by the seed and waiting. */
const PROJECT = 'Larkspur studio interface';
const SPEC_TITLE = 'Larkspur studio interface — balanced line receiver, front stage';
const CHANGE_NOTE = 'Noise, slew-rate and bias-current targets from the monitor path’s budget; 20 pF of cable and converter input on each collector.';

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<DemoRole, Actor>;
let proposalId = 0;
/** Read from the page as the steps go: the recommended option's name, its window and the current it is sized at. */
let recommended = '';
let floorA = 0;
let ceilingA = 0;
let sizedA = 0;

/** A quantity as the page prints it ("606 µA") read back in SI units. */
function amperes(text: string): number {
  const parsed = parseQuantity(text, 'A');
  if (!parsed.ok) throw new Error(`not a current: ${text}`);
  return parsed.value;
}

async function openProposal(actor: Actor): Promise<void> {
  await actor.page.goto(`/proposals/${proposalId}`);
  await visible(actor.page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
  await visible(actor.page.getByRole('table', { name: /Tail options, ranked/ }));
}

const tradeoffView = (actor: Actor): Locator => actor.page.getByRole('region', { name: 'What the tail current trades' });

/** A screenshot of one part of the page (the trade-off view, the SPICE check), beside the step's full-page ones. */
async function detail(locator: Locator, step: string): Promise<void> {
  const file = join(screenshotDir, 'tradeoff', `detail-${step}.png`);
  await locator.screenshot({ path: file, animations: 'disabled' });
  shots.taken.push(relative(repoRoot, file));
}

interface WhatIfRow {
  title: string;
  text: string;
  verdict: string;
}

/** The what-if list as shown: the current it was sized for, what the design draws, and each figure with its verdict. */
async function whatIfFigures(section: Locator) {
  const line = await section.getByText(/^Sized for /).innerText();
  const currents = /^Sized for (.+?); the design draws (.+?)\.$/.exec(line);
  if (!currents) throw new Error(`not the what-if line: ${line}`);
  const rows: WhatIfRow[] = [];
  for (const row of await section.getByRole('row').all()) {
    const title = (await row.getByRole('rowheader').innerText()).split('\n')[0].trim();
    const cells = await row.getByRole('cell').allInnerTexts();
    rows.push({ title, text: cells[0].trim(), verdict: cells[1].replace(/[✓✕]/g, '').trim() });
  }
  const value = (title: string): number => {
    const row = rows.find((r) => r.title === title);
    if (!row) throw new Error(`no what-if row ${title}: ${rows.map((r) => r.title).join(', ')}`);
    const [number, unit] = row.text.split(' ');
    const parsed = parseQuantity(`${number} ${unit}`, unit.replace(/^[pnµmkMG](?=.)/, ''));
    if (!parsed.ok) throw new Error(`not a figure: ${row.text}`);
    return parsed.value;
  };
  return { sizedForA: amperes(currents[1]), drawsA: amperes(currents[2]), rows, value };
}

describe('Longtail in the browser: the decision the tail current sets', () => {
  beforeAll(async () => {
    shots = screenshots(join(screenshotDir, 'tradeoff'));
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

  it('the systems engineer sets noise, slew-rate and bias-current targets through the form and saves a new version', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByRole('link', { name: new RegExp(PROJECT) }).click();
    await visible(page.getByRole('heading', { level: 1, name: PROJECT }));
    await page.getByRole('link', { name: SPEC_TITLE }).first().click();
    await visible(page.getByRole('heading', { level: 1, name: SPEC_TITLE }));
    await visible(page.getByRole('button', { name: 'Save as new version' }));

    // The new targets in their cards: noise and bias current under Input, slew rate under Speed,
    // the collectors' load under Source and load
    const input = await visible(page.getByRole('region', { name: 'Input', exact: true }));
    await input.getByRole('textbox', { name: /^Largest noise density/ }).fill('10 nV/√Hz');
    await input.getByRole('textbox', { name: /^Noise frequency/ }).fill('1 kHz');
    await input.getByRole('textbox', { name: /^Largest input bias current/ }).fill('3 µA');
    await page.getByRole('region', { name: 'Speed', exact: true }).getByRole('textbox', { name: /^Lowest slew rate/ }).fill('5 V/µs');
    await page.getByRole('region', { name: 'Source and load', exact: true }).getByRole('textbox', { name: /^Load capacitance/ }).fill('20 pF');
    await page.getByRole('textbox', { name: /^Change note/ }).fill(CHANGE_NOTE);
    // Each entry shows the SI value it was read as (5 V/µs is 5 MV/s)
    for (const reading of ['= 10 nV/√Hz', '= 1 kHz', '= 3 µA', '= 5 MV/s', '= 20 pF']) await visible(page.getByText(reading, { exact: true }));
    expect(await page.getByText(/cannot read/).count()).toBe(0);
    await shots.take(page, 'spec-targets-filled');
    await detail(input, 'spec-input-card');
    await page.getByRole('button', { name: 'Save as new version' }).click();
    await visible(page.getByText('Saved as version 2.'));
    await record(actor, shots, 'spec-targets-saved');
  });

  it('the systems engineer ranks the new version: a column per target, and the window with the sized current inside it', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByRole('button', { name: 'Rank tail options' }).click();
    await page.waitForURL(/\/proposals\/\d+$/, { timeout: 60_000 });
    proposalId = Number(/\/proposals\/(\d+)$/.exec(page.url())?.[1]);
    await visible(page.getByRole('heading', { level: 1, name: `Proposal #${proposalId}` }));
    const table = await visible(page.getByRole('table', { name: /Tail options, ranked/ }));

    // The targets' columns, each under the group's heading, with the limit and its unit as typed in the form
    await visible(table.getByRole('columnheader', { name: 'Spec targets, worst corner' }));
    await visible(table.getByRole('columnheader', { name: /^Noise\s*≤ 10 nV\/√Hz at 1 kHz$/ }));
    await visible(table.getByRole('columnheader', { name: /^Slew rate\s*≥ 5 MV\/s$/ }));
    await visible(table.getByRole('columnheader', { name: /^Bias current\s*≤ 3 µA$/ }));
    const recommendedRow = table.getByRole('row').filter({ has: page.getByRole('rowheader', { name: /\(recommended\)/ }) });
    recommended = (await recommendedRow.getByRole('rowheader').getByRole('button').textContent())?.trim() ?? '';
    expect(recommended).not.toBe('');
    // Each target's worst-corner figure in the recommended row, with its unit
    const rowText = await recommendedRow.innerText();
    expect(rowText).toMatch(/\d\s*nV\/√Hz/);
    expect(rowText).toMatch(/\d\s*[nµ]A/);
    expect(rowText).toMatch(/\d\s*[kMG]?V\/s/);

    // The trade-off view of the selected (recommended) option names the window's floor and ceiling
    // with the requirement behind each, and the current the option is sized at
    const view = await visible(tradeoffView(actor), 60_000);
    await visible(view.getByRole('heading', { name: `What the tail current trades: ${recommended}` }));
    const sentence = await visible(view.getByText(/^The shaded window is where the targets allow the tail current/));
    const text = await sentence.first().innerText();
    const match = /from ([\d.]+ [nµm]A) \(the noise limit\) to ([\d.]+ [nµm]A) \((.+?)\)\. The option is sized at ([\d.]+ [nµm]A)/.exec(text);
    expect(match, text).not.toBeNull();
    floorA = amperes(match![1]);
    ceilingA = amperes(match![2]);
    sizedA = amperes(match![4]);
    // The bias-current limit or the power budget caps it
    expect(match![3]).toMatch(/power budget|bias current/);
    expect(floorA).toBeLessThan(sizedA);
    expect(sizedA).toBeLessThanOrEqual(ceilingA);
    // The floor is no lower than the pair's own collector shot noise allows: 2kT·VT/IC per
    // transistor referred to its base, both halves added, IC = I/2, so en² = 8kT·VT/I (Gray and
    // Meyer; docs/device-and-formulas.md) and 10 nV/√Hz needs I ≥ 8kT·VT/(10 nV)²
    const kT = 1.380649e-23 * 300.15;
    const vt = kT / 1.602176634e-19;
    expect(floorA).toBeGreaterThan((8 * kT * vt) / 1e-8 ** 2);
    // The ceiling is no higher than the whole 50 mW budget on the tail alone across the 33 V of rails
    expect(ceilingA).toBeLessThan(0.05 / 33);
    await visible(view.getByRole('button', { name: `Back to the sized ${match![4]}` }));
    await view.scrollIntoViewIfNeeded();
    await record(actor, shots, 'ranking-with-targets');
    await detail(view, 'tradeoff-view-sized');
  });

  it('the designer moves the current with the slider and reads the what-if figures against each limit', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await openProposal(actor);
    const view = await visible(tradeoffView(actor), 60_000);
    const whatIf = view.getByRole('region', { name: 'At the what-if current' });
    await visible(whatIf.getByRole('status').filter({ hasText: 'Up to date' }), 60_000);
    const before = await whatIfFigures(whatIf);
    expect(before.sizedForA).toBeCloseTo(sizedA, 12);

    // Ten presses of the left arrow: the slider moves in hundredths of a decade, to 10^−0.1 of the sized current
    const slider = view.getByRole('slider', { name: 'What-if tail current' });
    await slider.focus();
    for (let i = 0; i < 10; i += 1) await slider.press('ArrowLeft');
    const typed = view.getByRole('textbox', { name: 'Typed' });
    const movedA = amperes(await typed.inputValue());
    expect(movedA / sizedA).toBeCloseTo(10 ** -0.1, 2);
    expect(movedA).toBeGreaterThan(floorA);
    await expect.poll(async () => (await whatIfFigures(whatIf)).sizedForA, { timeout: 30_000 }).toBeCloseTo(movedA, 12);
    await visible(whatIf.getByRole('status').filter({ hasText: 'Up to date' }), 30_000);
    const after = await whatIfFigures(whatIf);
    // Every figure inside the window meets its limit
    for (const row of after.rows) expect(row.verdict, row.title).toBe('Meets');
    // The figures move as the hand formulas say for a stage re-sized at the same gain: slew rate
    // 2·I/CL for the full switch while the load capacitance dominates (Gray and Meyer;
    // docs/device-and-formulas.md); bias current I/(2β); noise density as 1/√I (every resistor
    // scales as 1/I, every shot noise as √I)
    const ratio = after.drawsA / before.drawsA;
    expect(after.value('Slew rate') / before.value('Slew rate')).toBeCloseTo(ratio, 1);
    expect(after.value('Slew rate') / ((2 * after.drawsA) / 20e-12)).toBeGreaterThan(0.85);
    expect(after.value('Slew rate') / ((2 * after.drawsA) / 20e-12)).toBeLessThan(1.15);
    expect(after.value('Bias current') / before.value('Bias current') / ratio).toBeGreaterThan(0.95);
    expect(after.value('Bias current') / before.value('Bias current') / ratio).toBeLessThan(1.05);
    expect(after.value('Noise') / before.value('Noise') / Math.sqrt(1 / ratio)).toBeGreaterThan(0.92);
    expect(after.value('Noise') / before.value('Noise') / Math.sqrt(1 / ratio)).toBeLessThan(1.08);
    await record(actor, shots, 'what-if-slider');
    await detail(view, 'tradeoff-view-moved');
    await detail(view.getByRole('figure', { name: 'Noise against tail current' }), 'noise-chart');

    // Below the window's floor, the noise misses its limit
    const belowA = floorA * 0.6;
    await typed.fill(formatQuantity(belowA, 'A', 3));
    await expect.poll(async () => (await whatIfFigures(whatIf)).sizedForA, { timeout: 30_000 }).toBeCloseTo(amperes(formatQuantity(belowA, 'A', 3)), 12);
    await visible(whatIf.getByRole('status').filter({ hasText: 'Up to date' }), 30_000);
    const below = await whatIfFigures(whatIf);
    expect(below.rows.find((r) => r.title === 'Noise')?.verdict).toBe('Misses');
    await detail(view, 'tradeoff-view-below-floor');

    await page.setViewportSize({ width: 390, height: 844 });
    await view.scrollIntoViewIfNeeded();
    await actor.quiet();
    await detail(view, 'tradeoff-view-390px');
    await page.setViewportSize({ width: 1440, height: 900 });
  });

  it('the designer accepts the recommendation', async () => {
    const actor = actors.designer;
    const { page } = actor;
    const decision = await visible(page.getByRole('region', { name: 'Your decision' }));
    await decision.getByRole('radio', { name: 'Accept the recommendation' }).check();
    await decision.getByRole('button', { name: new RegExp(`^Record decision: accept the ${recommended}`, 'i') }).click();
    await visible(page.getByRole('status').filter({ hasText: 'Decision recorded' }), 60_000);
    await visible(page.getByText('Awaiting review').first());
  });

  it('the reviewer runs the SPICE check: ngspice agrees on the noise at 1 kHz, the slew rate and the input bias current', async () => {
    const actor = actors.reviewer;
    const { page } = actor;
    await openProposal(actor);
    const panel = await visible(page.getByRole('region', { name: 'SPICE check', exact: true }));
    await panel.getByRole('button', { name: 'Run every option through SPICE' }).click();
    await visible(panel.getByRole('progressbar'));
    await visible(panel.getByText(/\d+ of \d+ agree with the engine within tolerance/), 120_000);
    const check = await visible(panel.getByRole('region', { name: new RegExp(`^SPICE check of ${recommended}`) }));
    const table = check.getByRole('table', { name: /at nominal conditions/ });
    // The trade-off figures under their headings, each agreeing within its tolerance
    await visible(table.getByRole('columnheader', { name: 'Input', exact: true }));
    await visible(table.getByRole('columnheader', { name: 'Bandwidth, slew rate and noise' }));
    for (const label of ['Input noise density at 1 kHz', 'Slew rate', 'Input bias current']) {
      const row = table.getByRole('row').filter({ has: page.getByRole('rowheader', { name: label, exact: true }) });
      expect(await row.count(), label).toBe(1);
      expect(await row.innerText(), label).toMatch(/Agrees$/);
    }
    await check.scrollIntoViewIfNeeded();
    await record(actor, shots, 'spice-check-tradeoff-rows');
    await detail(check, 'spice-check-detail');
  });

  it('saw no uncaught error, CSP refusal or server error along the way', () => {
    expect([...actors.requirements.problems.list, ...actors.designer.problems.list, ...actors.reviewer.problems.list]).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
