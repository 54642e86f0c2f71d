/**
 * The team features in the browser, in headless Chromium against the real app (built into
 * dist/web by the e2e globalSetup, served in-process on a fresh SQLite file with the demo
 * organisation, and with the local mail server and the outbox worker running as api/server.ts
 * runs them):
 * - the device library: the systems engineer finds the demo library on a project page, uploads a
 *   file of .model cards and sees its cards, uploads a broken file and sees every problem with
 *   its line, writes a spec filled from a library card and finds the card named on the saved spec;
 * - batch import: a file with one bad row is checked (its problem on its row, nothing saved), then
 *   the example file (tests/fixtures/fernhollow-batch-specs.csv) is checked, saved, ranked with a
 *   progress bar and its results downloaded as CSV, one row per spec;
 * - notifications: the administrator reads the "waits for a decision" e-mails those rankings sent
 *   to the project's designer; the designer turns one kind of e-mail off on the profile page (the
 *   server keeps it), then all e-mail, and the next ranking writes no e-mail to them.
 * Every step is screenshotted into test-results/screenshots/team-features/ (its own folder: the
 * workflow test empties test-results/screenshots/*.png), and every page passes axe-core with no
 * serious or critical violation (light theme, and the import page once in the dark theme).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Papa from 'papaparse';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessageEntity } from '../../api/entities/mail-message.entity';
import { MailOutboxEntity } from '../../api/entities/mail-outbox.entity';
import { UserEntity } from '../../api/entities/user.entity';
import { openActor, record, visible, type Actor } from './helpers/actors';
import { launchBrowser } from './helpers/browser';
import { repoRoot, screenshotDir } from './helpers/paths';
import { screenshots, type Screenshots } from './helpers/screenshots';
import { startServer, type RunningServer } from './helpers/server';
import { demoEmail, signInAs } from './helpers/sign-in';

/** The demo project holding the demo device library (api/seed/demo-seed.ts), and its designer. */
const PROJECT = 'Kestrel load-cell amplifier';
const DESIGNER = 'Priya Valcourt';
/** The demo library's cards (api/demo/devices/fernhollow-npn.lib). */
const DEMO_CARDS = ['FH2N22', 'FH2N24', 'FH2N26'];

const fixture = (name: string) => join(repoRoot, 'tests', 'fixtures', name);
/** Two invented NPN cards; FH3N40 is IS=11f BF=260 VAF=95 on line 5 of the file. */
const GOOD_LIBRARY = fixture('fernhollow-bench-npn.lib');
/** A PNP card on line 4 and "BF=4k7" (not a SPICE number) on line 5. */
const BAD_LIBRARY = fixture('fernhollow-broken-npn.lib');
const BATCH_FILE = fixture('fernhollow-batch-specs.csv');

const SPEC_TITLE = 'Kestrel rev C — guard input on the FH3N40 (browser test)';

let server: RunningServer;
let browser: Browser;
let shots: Screenshots;
const actors = {} as Record<'admin' | 'requirements' | 'designer', Actor>;
let projectId = 0;
/** The titles of the example batch file, read from the file itself. */
let batchTitles: string[] = [];

/** Polls until the outbox has nothing waiting (the worker polls every 100 ms here). */
async function outboxDrained(timeoutMs = 20_000): Promise<void> {
  const outbox = server.dataSource.getRepository(MailOutboxEntity);
  const deadline = Date.now() + timeoutMs;
  while ((await outbox.countBy({ status: 'pending' })) > 0) {
    if (Date.now() > deadline) throw new Error('The outbox still had messages waiting');
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

describe('Longtail in the browser: device library, batch import and e-mail', () => {
  beforeAll(async () => {
    shots = screenshots(join(screenshotDir, 'team-features'));
    batchTitles = (Papa.parse<Record<string, string>>(readFileSync(BATCH_FILE, 'utf8'), { header: true, skipEmptyLines: true }).data).map((row) => row.title);
    [server, browser] = await Promise.all([startServer({ mail: true }), launchBrowser()]);
    for (const role of ['admin', 'requirements', 'designer'] as const) actors[role] = await openActor(browser, server.baseUrl, role, { acceptDownloads: true });
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    if (shots) console.log(`Screenshots (${shots.taken.length}):\n${shots.taken.map((s) => `  ${s}`).join('\n')}`);
  });

  it('the systems engineer finds the demo device library on the project page', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await signInAs(page, 'requirements');
    await page.getByRole('link', { name: new RegExp(PROJECT) }).click();
    await visible(page.getByRole('heading', { level: 1, name: PROJECT }));
    projectId = Number(/\/projects\/(\d+)/.exec(page.url())?.[1]);
    expect(projectId).toBeGreaterThan(0);
    const library = await visible(page.getByRole('region', { name: 'Device library' }));
    const table = await visible(library.getByRole('table', { name: 'Device models of this project' }));
    for (const name of DEMO_CARDS) await visible(table.getByText(name, { exact: true }));
    await record(actor, shots, 'library-demo');
  });

  it('uploads a file of .model cards and sees them parsed', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    const library = page.getByRole('region', { name: 'Device library' });
    await library.getByLabel('Upload .model cards').setInputFiles(GOOD_LIBRARY);
    await visible(library.getByRole('status').filter({ hasText: 'Added FH3N40, FH3N41 from fernhollow-bench-npn.lib' }));
    const row = library.getByRole('row').filter({ hasText: 'FH3N40' });
    // IS=11f BF=260 VAF=95 on the card, shown in engineering notation; the card's line in its file
    await visible(row.getByText('11 fA'));
    await visible(row.getByText('260', { exact: true }));
    await visible(row.getByText('95 V'));
    await visible(row.getByText(/line 5/));
    expect(await library.getByRole('table').getByRole('row').count()).toBe(1 + DEMO_CARDS.length + 2);
    // The card's own text and notes open on demand, from the card's name (not the row's Remove button, which names the card to screen readers too)
    await row.locator('summary').filter({ hasText: /^FH3N40$/ }).click();
    await visible(row.getByText(/\.model FH3N40 NPN IS=11f/));
    await record(actor, shots, 'library-uploaded');
  });

  it('uploads a broken file and sees each problem on its line, with nothing stored', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    const library = page.getByRole('region', { name: 'Device library' });
    await library.getByLabel('Upload .model cards').setInputFiles(BAD_LIBRARY);
    const alert = await visible(library.getByRole('alert'));
    await visible(alert.getByText(/fernhollow-broken-npn\.lib was not saved/));
    await visible(alert.getByText(/Line 4/));
    await visible(alert.getByText(/PNP/));
    await visible(alert.getByText(/Line 5/));
    await visible(alert.getByText(/4k7/));
    // The good card of the same file (line 3) was not stored either
    expect(await library.getByText('FH3N50').count()).toBe(0);
    await record(actor, shots, 'library-refused');
  });

  it('writes a spec filled from a library card, and the saved spec names the card', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByRole('link', { name: 'New spec' }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'New spec' }));
    await page.getByRole('textbox', { name: /^Title/ }).fill(SPEC_TITLE);
    const supply = page.getByRole('group', { name: 'Supply rails' });
    await supply.getByRole('textbox', { name: /Positive rail/ }).fill('9 V');
    await supply.getByRole('textbox', { name: /Negative rail/ }).fill('-9 V');
    await page.getByRole('textbox', { name: /Gain target/ }).fill('40');
    await page.getByRole('textbox', { name: /Minimum CMRR/ }).fill('75 dB');
    await page.getByRole('textbox', { name: /At frequency/ }).fill('100');

    const picker = page.getByLabel('Fill from the device library');
    const option = await picker.locator('option').filter({ hasText: 'FH3N40' }).textContent();
    await picker.selectOption({ label: option ?? '' });
    // The card's BF fills the form, and the note says where it came from
    expect(await page.getByRole('textbox', { name: /^Current gain/ }).inputValue()).toMatch(/^260$/);
    await visible(page.getByText(/come from card FH3N40 of fernhollow-bench-npn\.lib/));
    await record(actor, shots, 'new-spec-from-library');

    await page.getByRole('button', { name: 'Create spec' }).click();
    await page.waitForURL(/\/specs\/\d+$/);
    await visible(page.getByRole('heading', { level: 1, name: SPEC_TITLE }));
    await visible(page.getByText('Saved as version 1.'));
    // Reloaded from the server: the spec still names its card
    await page.reload();
    await visible(page.getByRole('heading', { level: 1, name: SPEC_TITLE }));
    await visible(page.getByText(/come from card FH3N40 of fernhollow-bench-npn\.lib/));
    expect(await page.getByLabel('Fill from the device library').locator('option:checked').textContent()).toMatch(/^FH3N40/);
    await record(actor, shots, 'spec-from-library-saved');
  });

  it('checks a batch file with a bad row: the problem on its row, nothing saved yet', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.goto(`/projects/${projectId}`);
    await page.getByRole('link', { name: 'Import specs' }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'Import specs' }));
    await record(actor, shots, 'import-start');

    // The example file with a sixth spec whose gain cell is no quantity: row 7 as a spreadsheet counts
    const text = readFileSync(BATCH_FILE, 'utf8').trimEnd();
    const eol = text.includes('\r\n') ? '\r\n' : '\n';
    const header = text.split(eol)[0].split(',');
    const bad = header.map((column) => ({ title: 'Heron test row — unreadable gain', 'supply.positiveV': '12', 'supply.negativeV': '-12', 'gain.target': 'lots', 'cmrr.minDb': '60' })[column] ?? '');
    await page.getByLabel(/^Spec file/).setInputFiles({ name: 'batch-with-a-bad-row.csv', mimeType: 'text/csv', buffer: Buffer.from(`${text}${eol}${bad.join(',')}${eol}`) });
    const check = await visible(page.getByRole('region', { name: 'Check' }));
    await visible(check.getByText(/6 specs in batch-with-a-bad-row\.csv: 5 valid, 1 with problems/));
    const badRow = check.locator('tr[data-row="7"]').first();
    await visible(badRow.getByText('gain.target'));
    await visible(check.getByRole('button', { name: 'Save 5 valid specs' }));
    await record(actor, shots, 'import-check-bad-row');
    await check.getByRole('button', { name: 'Choose another file' }).click();
  });

  it('imports the example file: the check, then the valid rows saved', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    await page.getByLabel(/^Spec file/).setInputFiles(BATCH_FILE);
    const check = await visible(page.getByRole('region', { name: 'Check' }));
    await visible(check.getByText(new RegExp(`${batchTitles.length} specs in fernhollow-batch-specs\\.csv: ${batchTitles.length} valid, 0 with problems`)));
    for (const title of batchTitles) await visible(check.getByRole('row').filter({ hasText: title }).getByText('New spec'));
    await record(actor, shots, 'import-check');

    await check.getByRole('button', { name: `Save ${batchTitles.length} valid specs` }).click();
    const saved = await visible(page.getByRole('region', { name: 'Saved' }));
    await visible(saved.getByText(new RegExp(`${batchTitles.length} new specs`)));
    for (const title of batchTitles) await visible(saved.getByRole('link', { name: title }));
    await record(actor, shots, 'import-saved');
  });

  it('ranks every imported spec with a progress bar, then downloads the batch CSV with one row per spec', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    const rank = page.getByRole('region', { name: 'Rank' });
    await rank.getByRole('button', { name: `Rank all ${batchTitles.length} imported specs` }).click();
    const progress = await visible(rank.getByRole('progressbar', { name: 'Ranking progress' }));
    await shots.take(page, 'import-ranking-progress');
    await visible(rank.getByText(`Ranked ${batchTitles.length} of ${batchTitles.length}.`), 180_000);
    expect(await progress.getAttribute('value')).toBe(String(batchTitles.length));
    const results = rank.getByRole('table', { name: 'Proposals of the imported specs' });
    expect(await results.locator('tbody tr').count()).toBe(batchTitles.length);
    expect(await results.getByRole('alert').count()).toBe(0);
    await record(actor, shots, 'import-ranked');

    const [download] = await Promise.all([page.waitForEvent('download'), rank.getByRole('link', { name: /Download the batch results/ }).click()]);
    const csv = readFileSync(await download.path(), 'utf8');
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(expect.arrayContaining(['spec_title', 'proposal_id', 'state', 'recommended_topology']));
    expect(parsed.data.map((row) => row.spec_title).sort()).toEqual([...batchTitles].sort());
    expect(new Set(parsed.data.map((row) => row.proposal_id)).size).toBe(batchTitles.length);
  });

  it('the import page passes axe in the dark theme too', async () => {
    const actor = actors.requirements;
    const { page } = actor;
    while ((await page.getByRole('button', { name: /^Theme: / }).textContent()) !== 'Theme: dark') await page.getByRole('button', { name: /^Theme: / }).click();
    expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await record(actor, shots, 'import-ranked-dark');
    await page.getByRole('link', { name: PROJECT, exact: true }).click();
    await visible(page.getByRole('region', { name: 'Device library' }).getByRole('table'));
    await record(actor, shots, 'library-dark');
    await page.evaluate(() => localStorage.setItem('longtail.theme', 'light'));
  });

  it('the administrator reads the "waits for a decision" e-mails those rankings sent to the designer', async () => {
    await outboxDrained();
    const actor = actors.admin;
    const { page } = actor;
    await signInAs(page, 'admin');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Mail' }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'Mail' }));
    await visible(page.getByRole('status').filter({ hasText: 'Outbox: nothing waiting' }));
    const list = page.getByRole('navigation', { name: 'Messages' });
    // Each ranking is told once, alone or in a digest of a burst; titles are in the text, never in a subject.
    const received = await server.dataSource.getRepository(MailMessageEntity).find();
    const toDesigner = received.filter((m) => m.recipients.includes(demoEmail('designer')));
    for (const title of batchTitles) {
      expect(toDesigner.filter((m) => m.textBody.includes(title))).toHaveLength(1);
      expect(received.some((m) => m.subject.includes(title))).toBe(false);
    }
    expect(await list.getByRole('button').filter({ hasText: /waits for a decision|workflow updates/ }).filter({ hasText: `To ${demoEmail('designer')}` }).count()).toBeGreaterThan(0);
    await record(actor, shots, 'mail-list');

    await list.getByRole('button').filter({ hasText: /waits for a decision/ }).first().click();
    const open = page.getByRole('region', { name: 'Message' });
    await visible(open.getByRole('heading', { name: /waits for a decision/ }));
    await visible(open.getByText(`Hello ${DESIGNER},`, { exact: false }));
    await visible(open.getByText(new RegExp(`${server.baseUrl.replace(/[.]/g, '\\.')}/proposals/\\d+`)));
    await record(actor, shots, 'mail-open');
  });

  it('the designer turns one kind of e-mail off, then all e-mail, on the profile page, and the next ranking writes them none', async () => {
    const actor = actors.designer;
    const { page } = actor;
    await signInAs(page, 'designer');
    await page.getByRole('link', { name: /Your profile/ }).click();
    await visible(page.getByRole('heading', { level: 1, name: 'Your profile' }));
    const toggle = page.getByRole('checkbox', { name: 'E-mail me about the workflow' });
    expect(await toggle.isChecked()).toBe(true);
    await record(actor, shots, 'profile-email-on');
    // One kind off on its own: the switch stays off after a reload, and the server keeps exactly that kind
    const kind = page.getByRole('switch', { name: /New version of a spec you ranked/ });
    expect(await kind.isChecked()).toBe(true);
    await kind.uncheck();
    await visible(page.getByRole('status').filter({ hasText: /Saved: .*New version of a spec you ranked.* off\./ }));
    await page.reload();
    expect(await page.getByRole('switch', { name: /New version of a spec you ranked/ }).isChecked()).toBe(false);
    expect(await page.getByRole('checkbox', { name: 'E-mail me about the workflow' }).isChecked()).toBe(true);
    const stored = await server.dataSource.getRepository(UserEntity).findOneByOrFail({ email: demoEmail('designer') });
    expect(stored.noticesOff).toEqual(['spec.new-version']);
    await record(actor, shots, 'profile-one-kind-off');
    await toggle.uncheck();
    await visible(page.getByRole('status').filter({ hasText: 'Saved: e-mail is off.' }));
    await page.reload();
    expect(await page.getByRole('checkbox', { name: 'E-mail me about the workflow' }).isChecked()).toBe(false);
    await record(actor, shots, 'profile-email-off');

    // The systems engineer ranks the spec filled from the library: no e-mail is written to the designer
    const author = actors.requirements;
    await author.page.goto(`/projects/${projectId}`);
    await author.page.getByRole('link', { name: SPEC_TITLE }).click();
    await author.page.getByRole('button', { name: 'Rank tail options' }).click();
    await author.page.waitForURL(/\/proposals\/\d+$/, { timeout: 60_000 });
    const proposalId = Number(/\/proposals\/(\d+)$/.exec(author.page.url())?.[1]);
    expect(proposalId).toBeGreaterThan(0);
    const outbox = server.dataSource.getRepository(MailOutboxEntity);
    expect(await outbox.countBy({ proposalId, toAddress: demoEmail('designer') })).toBe(0);
    // ... while the earlier rankings did write to them (the check above can fail)
    expect(await outbox.countBy({ kind: 'proposal.ready', toAddress: demoEmail('designer') })).toBeGreaterThanOrEqual(batchTitles.length);

    for (const a of Object.values(actors)) expect(a.problems.list).toEqual([]);
    expect(server.serverErrors).toEqual([]);
  });
});
