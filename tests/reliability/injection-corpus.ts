/**
 * Hostile input, second half: an injection corpus (SQL, script tags, attribute breakers,
 * template syntax, unicode edge cases, values at and over each field's length limit, path
 * traversal and odd names in uploads) stored through the HTTP API of the real app (listening on
 * 127.0.0.1, a fresh SQLite file, the demo organisation) in every text field a person types:
 * project names and descriptions, display names, spec titles, decision reasons, review comments,
 * spec change notes, withdrawal reasons,
 * device-library card comments and file names. Each is read back through the API and must be
 * byte-identical (the server trims surrounding blanks, so no corpus string has any); a value
 * over its field's limit, or holding a control character or bidi override (LF is allowed in
 * multi-line fields), must be refused with 400; an uploaded file name must come back as a
 * printable base name (no / or \, no control characters, at most 255 characters) and unchanged
 * when it already was one.
 *
 * Then the browser check: the app built into a private temp folder (`vite build --outDir`, so
 * the shared dist/web is not touched), headless Chromium (Debian's, through playwright-core and
 * tests/e2e/helpers/browser.ts) signed in as the admin opens every page that shows those values.
 * Payloads set `window.__pwned` or carry a `data-injected` attribute: it must stay undefined, no
 * element with that attribute may exist and no dialog may open; the markup payloads must be on
 * the page as text.
 */
import { spawnSync } from 'node:child_process';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { createApp } from '../../api/app';
import { openDatabase } from '../../api/data-source';
import { seedDemo } from '../../api/seed/demo-seed';
import { loadRuleSet } from '../../rules/index';
import { firstUnsafeCharacter } from '#shared/text/plain-text';
import { specPayload } from '../helpers/api-app';
import { launchBrowser, networkQuiet, newContext } from '../e2e/helpers/browser';
import { DEMO_PASSWORD } from '../e2e/helpers/server';
import { signInAs } from '../e2e/helpers/sign-in';
import { demoEmail, HttpClient, repoRoot, row, tempDir, type PartResult, type RunOptions, type SummaryRow } from './lib';

const PART = 'Hostile input';

/** Strings that would do harm if a layer interpreted them. None starts or ends with a blank. */
export const MARKUP = [
  '<script>window.__pwned = "script"</script>',
  '<img src=x onerror="window.__pwned = \'img\'" data-injected>',
  '"><svg onload="window.__pwned = \'svg\'" data-injected="1">',
  "' autofocus onfocus='window.__pwned = \"focus\"' data-injected='",
  '" onmouseover="window.__pwned = 1" data-injected="',
  '</textarea></title><b data-injected>bold</b>',
  '<a href="javascript:window.__pwned = \'link\'" data-injected>click</a>',
  '<iframe srcdoc="<script>parent.__pwned = 1</script>" data-injected></iframe>',
  '{{constructor.constructor("window.__pwned = \'tpl\'")()}} ${window.__pwned = "tpl"}',
  'javascript:window.__pwned = "url"',
  '<style>body { display: none }</style><i data-injected>styled</i>',
  ']]><!-- <b data-injected> --><![CDATA[',
];
export const SQL = [
  "'; DROP TABLE spec; --",
  '" OR "1"="1',
  "Robert'); DELETE FROM proposal WHERE ('1'='1",
  "1; UPDATE user SET role = 'admin' --",
  "%' OR 1=1 --",
  "\\'; SELECT sqlite_version(); --",
];
export const UNICODE = [
  'Zero\u200Bwidth\u200Djoiner\u2060word',
  'Right-to-left \u202Egnp.exe\u202C end',
  'Z\u0351\u0362\u0336a\u0334\u0321\u0347lgo text',
  '👩‍🔬 𝔘𝔫𝔦𝔠𝔬𝔡𝔢 ﷽ 🏳️‍🌈',
  'Ω≈ç√∫ µ° ± ½ ‰ — “quotes” ‘single’',
  'NUL\u0000inside',
  'Line\nbreak\r\nand\ttab',
  'Byte\uFEFForder mark inside',
  'Émigré naïve café 東京 مرحبا שלום',
];
const CORPUS = [...MARKUP, ...SQL, ...UNICODE];

/** File names for the device-library uploads. */
const UPLOAD_NAMES = [
  '../../etc/passwd',
  '..\\..\\windows\\system32\\models.lib',
  '/absolute/path/models.lib',
  '<img src=x onerror="window.__pwned = \'file\'" data-injected>.lib',
  '"quoted" name.lib',
  'name%00.lib',
  'ﬁle ünïcödé 模型.lib',
  'CON.lib',
  `${'long-'.repeat(70)}.lib`,
  '\u202Ebil.exe',
  'tab\tand\u0007bell.lib',
];

/** Each text field, its limit (characters, as the body schemas count) and how to store and read one value. */
interface Field {
  name: string;
  max: number;
  /** Multi-line text: LF line breaks are stored; other control characters and bidi overrides are refused (400) in every field. */
  multiline?: boolean;
  /** Stores the value; answers the HTTP status and a function reading it back. */
  store: (value: string, i: number) => Promise<{ status: number; text?: string; read?: () => Promise<string | null> }>;
}

export async function injectionCorpus(options: RunOptions & { browser: boolean }): Promise<PartResult> {
  const { log } = options;
  const temp = tempDir('longtail-reliability-corpus-');
  const dataSource = await openDatabase(join(temp.dir, 'longtail.sqlite'));
  const ruleSet = await loadRuleSet();
  await seedDemo(dataSource, ruleSet, DEMO_PASSWORD);
  const serverErrors: string[] = [];

  let webDir: string | undefined;
  let buildProblem = '';
  if (options.browser) {
    webDir = join(temp.dir, 'web');
    const built = spawnSync('npx', ['vite', 'build', '--outDir', webDir, '--emptyOutDir', '--logLevel', 'error'], { cwd: repoRoot, encoding: 'utf8', env: { ...process.env, NODE_ENV: 'production' } });
    if (built.status !== 0) {
      buildProblem = `vite build failed: ${built.stderr.slice(0, 500)}`;
      webDir = undefined;
    }
  }
  const app = createApp({ dataSource, ruleSet, sessionSecret: 'reliability-corpus-session-secret-0123456789', staticDir: webDir, log: (m) => serverErrors.push(m) });
  const server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const rows: SummaryRow[] = [];

  try {
    const signed = async (role: 'admin' | 'requirements' | 'designer' | 'reviewer') => {
      const client = new HttpClient(base);
      await client.signIn(demoEmail(role), DEMO_PASSWORD);
      return client;
    };
    const admin = await signed('admin');
    const author = await signed('requirements');
    const designer = await signed('designer');
    const reviewer = await signed('reviewer');
    const demoUsers = ((await admin.request('GET', '/api/users')).json as { items: { id: number; email: string }[] }).items;
    const project = (await admin.request('POST', '/api/projects', { name: 'Corpus project — hostile values', description: 'Where the reliability run stores its injection corpus.' })).json as { id: number };
    for (const role of ['requirements', 'designer', 'reviewer'] as const) {
      await admin.request('POST', `/api/projects/${project.id}/members`, { userId: demoUsers.find((u) => u.email === demoEmail(role))!.id, role });
    }
    // One proposal collects every reason and comment: decide, return, decide again, …
    const spec = (await author.request('POST', `/api/projects/${project.id}/specs`, { title: 'Corpus spec — plain title', payload: specPayload() })).json as { id: number };
    const proposal = (await designer.request('POST', `/api/specs/${spec.id}/proposals`)).json as { id: number; result?: { recommended: string | null; options: { topology: string; design?: unknown }[] } };
    const chosen = proposal.result?.recommended ?? proposal.result?.options.find((o) => o.design)?.topology ?? 'wilson';
    let state: 'ranked' | 'decided' | 'returned' = 'ranked';
    // Specs of their own for change notes (each save a new version) and withdrawals (each a fresh ranking).
    const notedSpec = (await author.request('POST', `/api/projects/${project.id}/specs`, { title: 'Corpus spec — change notes', payload: specPayload() })).json as { id: number };
    const withdrawnSpec = (await author.request('POST', `/api/projects/${project.id}/specs`, { title: 'Corpus spec — withdrawals', payload: specPayload() })).json as { id: number };
    const proposalRecord = async () => (await admin.request('GET', `/api/proposals/${proposal.id}`)).json as { decisions: { id: number; reason: string | null }[]; reviews: { id: number; comment: string | null }[] };

    const fields: Field[] = [
      {
        name: 'project name',
        max: 160,
        store: async (value) => {
          const answer = await admin.request('POST', '/api/projects', { name: value, description: 'Corpus value in the name.' });
          const id = (answer.json as { id?: number })?.id;
          return { status: answer.status, read: async () => ((await admin.request('GET', `/api/projects/${id}`)).json as { name: string }).name };
        },
      },
      {
        name: 'project description',
        multiline: true,
        max: 4000,
        store: async (value, i) => {
          const answer = await admin.request('POST', '/api/projects', { name: `Corpus description ${i}`, description: value });
          const id = (answer.json as { id?: number })?.id;
          return { status: answer.status, read: async () => ((await admin.request('GET', `/api/projects/${id}`)).json as { description: string }).description };
        },
      },
      {
        name: 'display name',
        max: 120,
        store: async (value, i) => {
          const answer = await admin.request('POST', '/api/users', { email: `corpus-${i}-${value.length}@corpus.longtail.test`, displayName: value, role: 'member', password: 'corpus-password-0423' });
          const id = (answer.json as { id?: number })?.id;
          if (id) await admin.request('POST', `/api/projects/${project.id}/members`, { userId: id, role: 'designer' });
          return { status: answer.status, read: async () => ((await admin.request('GET', '/api/users')).json as { items: { id: number; displayName: string }[] }).items.find((u) => u.id === id)?.displayName ?? null };
        },
      },
      {
        name: 'spec title',
        max: 200,
        store: async (value) => {
          const answer = await author.request('POST', `/api/projects/${project.id}/specs`, { title: value, payload: specPayload() });
          const id = (answer.json as { id?: number })?.id;
          return {
            status: answer.status,
            read: async () => {
              const read = (await author.request('GET', `/api/specs/${id}`)).json as { title: string; latest: { title: string; payload: { title: string } } };
              // The spec, its version and the stored document all carry the title
              return read.title === read.latest.title && read.latest.title === read.latest.payload.title ? read.title : `(differs: ${JSON.stringify([read.title, read.latest.title, read.latest.payload.title])})`;
            },
          };
        },
      },
      {
        name: 'decision reason',
        multiline: true,
        max: 4000,
        store: async (value) => {
          if (state === 'decided' && (await reviewer.request('POST', `/api/proposals/${proposal.id}/review`, { verdict: 'return', comment: 'Returned so the next corpus reason can be stored.' })).status === 201) state = 'returned';
          const answer = await designer.request('POST', `/api/proposals/${proposal.id}/decision`, { kind: 'choose', topology: chosen, reason: value });
          if (answer.status === 201) state = 'decided';
          const id = (answer.json as { decisions?: { id: number }[] })?.decisions?.at(-1)?.id;
          return { status: answer.status, text: answer.text, read: async () => (await proposalRecord()).decisions.find((d) => d.id === id)?.reason ?? null };
        },
      },
      {
        name: 'review comment',
        multiline: true,
        max: 4000,
        store: async (value) => {
          if (state !== 'decided') {
            const decided = await designer.request('POST', `/api/proposals/${proposal.id}/decision`, { kind: 'choose', topology: chosen, reason: 'Decided again so the next corpus comment can be stored.' });
            if (decided.status === 201) state = 'decided';
          }
          const answer = await reviewer.request('POST', `/api/proposals/${proposal.id}/review`, { verdict: 'return', comment: value });
          if (answer.status === 201) state = 'returned';
          const id = (answer.json as { reviews?: { id: number }[] })?.reviews?.at(-1)?.id;
          return { status: answer.status, text: answer.text, read: async () => (await proposalRecord()).reviews.find((r) => r.id === id)?.comment ?? null };
        },
      },
      {
        name: 'spec change note',
        max: 1000,
        store: async (value, i) => {
          // Other figures each time, so each save is a new version carrying its note.
          const answer = await author.request('PUT', `/api/specs/${notedSpec.id}`, { title: 'Corpus spec — change notes', payload: { ...specPayload(), powerBudgetW: 0.03 + (i + 1) * 1e-5 }, note: value });
          const version = (answer.json as { latest?: { version: number } })?.latest?.version;
          return {
            status: answer.status,
            text: answer.text,
            read: async () => ((await author.request('GET', `/api/specs/${notedSpec.id}/versions`)).json as { items: { version: number; note: string | null }[] }).items.find((v) => v.version === version)?.note ?? null,
          };
        },
      },
      {
        name: 'withdrawal reason',
        max: 4000,
        store: async (value) => {
          const ranked = (await designer.request('POST', `/api/specs/${withdrawnSpec.id}/proposals`)).json as { id: number };
          const answer = await designer.request('POST', `/api/proposals/${ranked.id}/withdrawal`, { reason: value });
          return { status: answer.status, text: answer.text, read: async () => ((await admin.request('GET', `/api/proposals/${ranked.id}`)).json as { closedReason: string | null }).closedReason };
        },
      },
    ];

    // Every corpus string in every field, and each field at its limit (stored) and one over (refused)
    let stored = 0;
    let changed = 0;
    let overlongAccepted = 0;
    let unexpectedStatus = 0;
    const problems: string[] = [];
    for (const field of fields) {
      const values = [
        ...CORPUS.map((value) => ({ value, expect: firstUnsafeCharacter(value, field.multiline) ? ('refused' as const) : ('stored' as const) })),
        ...(field.multiline ? [{ value: 'Line\nbreak\nkept', expect: 'stored' as const }] : []),
        { value: '€'.repeat(field.max), expect: 'stored' as const },
        { value: `${'€'.repeat(field.max)}x`, expect: 'refused' as const },
      ];
      for (const [i, { value, expect }] of values.entries()) {
        const { status, read, text } = await field.store(value, i);
        if (expect === 'refused') {
          if (status !== 400) {
            overlongAccepted += 1;
            problems.push(`${field.name}: ${JSON.stringify(value).slice(0, 60)} (${[...value].length} characters) answered ${status}, not 400`);
          }
          continue;
        }
        if (status < 200 || status >= 300) {
          unexpectedStatus += 1;
          problems.push(`${field.name}: ${JSON.stringify(value).slice(0, 60)} answered ${status} ${text ?? ''}`.slice(0, 300));
          continue;
        }
        stored += 1;
        const back = read ? await read() : null;
        if (back !== value) {
          changed += 1;
          problems.push(`${field.name}: sent ${JSON.stringify(value).slice(0, 80)}, read back ${JSON.stringify(back)?.slice(0, 80)}`);
        }
      }
    }

    // The device library: a card comment per corpus string (one line, so no line breaks or control characters) under odd file names
    let uploads = 0;
    let badNames = 0;
    let refusedNames = 0;
    const cardComments = CORPUS.filter((s) => !/[\u0000-\u001f\u007f-\u009f]/.test(s));
    for (const [i, comment] of cardComments.entries()) {
      const name = UPLOAD_NAMES[i % UPLOAD_NAMES.length];
      const cardLine = `.model FHC${i} NPN (IS=6f BF=140 VAF=70) ; ${comment}`;
      const form = new FormData();
      form.append('file', new Blob([`* Corpus card ${i}\n${cardLine}\n`], { type: 'text/plain' }), name);
      const answer = await author.request('POST', `/api/projects/${project.id}/devices`, form);
      // A control character in the multipart header makes the upload unreadable: a 400 is a fair answer there
      if (answer.status === 400 && /[\u0000-\u001f\u007f]/.test(name)) {
        refusedNames += 1;
        continue;
      }
      if (answer.status !== 201) {
        unexpectedStatus += 1;
        problems.push(`device upload ${JSON.stringify(name)} with ${JSON.stringify(comment).slice(0, 60)} answered ${answer.status}: ${answer.text.slice(0, 200)}`);
        continue;
      }
      uploads += 1;
      stored += 1;
      const [card] = (answer.json as { items: { id: number }[] }).items;
      const listed = ((await author.request('GET', `/api/projects/${project.id}/devices`)).json as { items: { id: number; card: string; fileName: string }[] }).items.find((d) => d.id === card.id);
      if (listed?.card !== cardLine) {
        changed += 1;
        problems.push(`card comment: sent ${JSON.stringify(cardLine).slice(0, 80)}, read back ${JSON.stringify(listed?.card)?.slice(0, 80)}`);
      }
      const fileName = listed?.fileName ?? '';
      const plain = !/[\\/\u0000-\u001f\u007f-\u009f]/.test(name) && name === name.trim() && [...name].length <= 255;
      if (/[\\/\u0000-\u001f\u007f-\u009f]/.test(fileName) || [...fileName].length > 255 || fileName === '' || (plain && fileName !== name)) {
        badNames += 1;
        problems.push(`upload name ${JSON.stringify(name).slice(0, 80)} stored as ${JSON.stringify(fileName).slice(0, 80)}`);
      }
    }
    if (refusedNames) log(`${refusedNames} upload(s) whose file name has control characters were refused with 400 (the multipart header is unreadable)`);
    log(`corpus: ${CORPUS.length} strings (${MARKUP.length} markup, ${SQL.length} SQL, ${UNICODE.length} unicode) in ${fields.length} fields + at/over each limit; ${cardComments.length} device uploads under ${UPLOAD_NAMES.length} odd file names`);
    for (const problem of problems.slice(0, 15)) log(`  problem: ${problem}`);
    // The SQL strings named these tables: they are all still there, with their rows
    const counts = (await dataSource.query('SELECT (SELECT count(*) FROM spec) AS specs, (SELECT count(*) FROM proposal) AS proposals, (SELECT count(*) FROM user_account) AS users')) as { specs: number; proposals: number; users: number }[];
    const tablesOk = counts[0].specs > CORPUS.length && counts[0].proposals > 0 && counts[0].users > CORPUS.length;
    rows.push(
      row(PART, 'corpus values stored', stored, `> 0, all of them`, stored > 0 && unexpectedStatus === 0),
      row(PART, 'corpus values read back changed', changed, '0', changed === 0),
      row(PART, 'over-limit or control-character values accepted', overlongAccepted, '0', overlongAccepted === 0),
      row(PART, 'upload names not a safe base name', badNames, '0', badNames === 0 && uploads > 0),
      row(PART, 'tables intact after SQL strings', tablesOk ? 'yes' : 'no', 'yes', tablesOk),
    );

    // The browser check
    if (!options.browser) {
      rows.push(row(PART, 'browser check', 'skipped (--no-browser)', 'run', false));
    } else if (!webDir) {
      log(buildProblem);
      rows.push(row(PART, 'browser check', 'no build', 'run', false));
    } else {
      const specs = ((await admin.request('GET', `/api/projects/${project.id}/specs`)).json as { items: { id: number; title: string }[] }).items;
      const markupSpecs = specs.filter((s) => MARKUP.includes(s.title));
      const pages = ['/', `/projects/${project.id}`, `/proposals/${proposal.id}`, `/proposals/${proposal.id}/report`, '/people', ...markupSpecs.map((s) => `/specs/${s.id}`)];
      const result = await browserCheck(base, pages, log);
      log(`browser: ${pages.length} pages as the admin; markup payloads shown as text ${result.shown} times; injected elements ${result.injected}, scripts run ${result.pwned}, dialogs ${result.dialogs}`);
      rows.push(
        row(PART, 'browser: pages opened', result.opened, `${pages.length}`, result.opened === pages.length),
        row(PART, 'browser: injected elements / scripts run', `${result.injected} / ${result.pwned + result.dialogs}`, '0 / 0', result.injected === 0 && result.pwned + result.dialogs === 0),
        row(PART, 'browser: markup payloads visible as text', result.shown, '> 0', result.shown > 0),
      );
    }
    rows.push(row(PART, 'server errors logged (corpus)', serverErrors.length, '0', serverErrors.length === 0));
    for (const message of serverErrors.slice(0, 3)) log(`  server error: ${message.slice(0, 400)}`);
  } finally {
    server.closeAllConnections();
    await new Promise((resolve) => server.close(resolve));
    app.closeApp();
    await dataSource.destroy();
    temp.remove();
  }
  return { rows };
}

async function browserCheck(base: string, pages: string[], log: (line: string) => void) {
  const browser = await launchBrowser();
  let opened = 0;
  let injected = 0;
  let pwned = 0;
  let dialogs = 0;
  let shown = 0;
  try {
    const context = await newContext(browser, base);
    const page: Page = await context.newPage();
    page.setDefaultTimeout(30_000);
    page.on('dialog', (dialog) => {
      dialogs += 1;
      void dialog.dismiss();
    });
    const quiet = networkQuiet(page);
    await signInAs(page, 'admin');
    for (const path of pages) {
      try {
        await page.goto(path);
        await page.getByRole('heading', { level: 1 }).first().waitFor();
        await quiet();
        // Focus and hover everything once, so focus and mouse handlers would fire if any had been injected
        await page.mouse.move(300, 300);
        const found = await page.evaluate((markup: string[]) => {
          const text = document.body.innerText;
          return {
            injected: document.querySelectorAll('[data-injected]').length,
            pwned: (window as unknown as { __pwned?: unknown }).__pwned !== undefined || (window as unknown as { parent: { __pwned?: unknown } }).parent.__pwned !== undefined,
            shown: markup.filter((m) => text.includes(m)).length,
          };
        }, MARKUP);
        opened += 1;
        injected += found.injected;
        pwned += found.pwned ? 1 : 0;
        shown += found.shown;
        if (found.injected || found.pwned) log(`  ${path}: ${found.injected} injected element(s), script ran: ${found.pwned}`);
      } catch (error) {
        log(`  ${path}: could not be checked: ${error instanceof Error ? error.message.split('\n')[0] : String(error)}`);
      }
    }
    await context.close();
  } finally {
    await browser.close();
  }
  return { opened, injected, pwned, dialogs, shown };
}
