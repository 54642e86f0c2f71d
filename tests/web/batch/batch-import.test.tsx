// @vitest-environment jsdom
/**
 * The batch import page's client side: the check report as a table (row numbers, valid rows
 * marked, one line per problem with its column), then save, rank one spec after another with a
 * progress bar, and the batch CSV link. The server is a fetch stub answering invented reports.
 */
import { configure, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { beforeEach, describe, expect, test } from 'vitest';
import type { ImportReport } from '../../../web/src/features/batch/api/batch-api';
import { BatchImport } from '../../../web/src/features/batch/components/batch-import';
import { ImportReportTable } from '../../../web/src/features/batch/components/import-report-table';
import { rankInTurn } from '../../../web/src/features/batch/lib/rank-in-turn';
import { json, useFetchStub } from '../helpers/fetch-stub';
import { renderWithClient } from '../helpers/render';

configure({ asyncUtilTimeout: 5000 });

/** An invented check of a four-row file: rows 2 and 5 valid, 3 with two problems, 4 with one. */
function report(dryRun: boolean): ImportReport {
  return {
    fileName: 'tarn-batch.csv',
    format: 'csv',
    dryRun,
    total: 4,
    valid: 2,
    counts: { created: 1, 'new-version': 1, unchanged: 0, skipped: 2 },
    headerErrors: [{ row: 1, field: 'colour', message: 'is not a known column (column F); check its spelling against the template' }],
    rows: [
      { row: 2, title: 'Tarn probe — channel A', ok: true, errors: [], action: 'created', specId: dryRun ? null : 21, version: dryRun ? null : 1 },
      {
        row: 3,
        title: 'Tarn probe — channel B',
        ok: false,
        errors: [
          { row: 3, field: 'supply.positiveV', message: '"12 A" has an unexpected unit "A": expected V' },
          { row: 3, field: 'cmrr.minDb', message: 'must be >= 0 dB, got -3 dB' },
        ],
        action: 'skipped',
        specId: null,
        version: null,
      },
      { row: 4, title: null, ok: false, errors: [{ row: 4, field: 'title', message: 'is required' }], action: 'skipped', specId: null, version: null },
      { row: 5, title: 'Tarn probe — reference', ok: true, errors: [], action: 'new-version', specId: 22, version: 3 },
    ],
  };
}

/** jsdom's File has no text(): read it as the browser's FileReader would. */
const readText = (file: File) =>
  new Promise<string>((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () => resolve(String(reader.result));
    reader.onerror = () => reject(reader.error);
    reader.readAsText(file);
  });

/** The same file checked again after it was saved: both valid rows unchanged, nothing to write. */
function reimported(): ImportReport {
  return {
    fileName: 'tarn-batch.csv',
    format: 'csv',
    dryRun: true,
    total: 2,
    valid: 2,
    counts: { created: 0, 'new-version': 0, unchanged: 2, skipped: 0 },
    headerErrors: [],
    rows: [
      { row: 2, title: 'Tarn probe — channel A', ok: true, errors: [], action: 'unchanged', specId: 21, version: 1 },
      { row: 3, title: 'Tarn probe — reference', ok: true, errors: [], action: 'unchanged', specId: 22, version: 3 },
    ],
  };
}
let answerReimported = false;

let uploads: { url: string; fileName: string; text: string }[];
let rankAnswers: Map<number, { resolve: () => void; promise: Promise<Response> }>;

function deferredRanking(specId: number, proposalId: number, recommendedTopology: string | null) {
  let resolve!: () => void;
  const promise = new Promise<Response>((done) => {
    resolve = () => done(json(201, { id: proposalId, specId, recommendedTopology, status: 'ranked' }));
  });
  rankAnswers.set(specId, { resolve, promise });
}

beforeEach(() => {
  answerReimported = false;
  uploads = [];
  rankAnswers = new Map();
});

const api = useFetchStub(async ({ key, path }, init) => {
  if (key === 'GET /api/auth/csrf') return json(200, { token: 't' });
  if (key.startsWith('POST /api/projects/1/specs/import')) {
    const file = (init?.body as FormData).get('file') as File;
    uploads.push({ url: path, fileName: file.name, text: await readText(file) });
    return json(200, answerReimported ? reimported() : report(path.endsWith('?dryRun=true') === true));
  }
  const rank = /^POST \/api\/specs\/(\d+)\/proposals$/.exec(key);
  if (rank && rankAnswers.has(Number(rank[1]))) return rankAnswers.get(Number(rank[1]))!.promise;
  return undefined;
});

function renderWithProviders(ui: React.ReactNode) {
  renderWithClient(<MemoryRouter>{ui}</MemoryRouter>);
}

/** Each body row's visible cells, as text. */
function bodyRows(table: HTMLElement): string[][] {
  return within(table)
    .getAllByRole('row')
    .slice(1)
    .map((tr) => within(tr).getAllByRole('cell').map((td) => td.textContent ?? ''));
}

describe('the check report table', () => {
  test('when a dry run is shown, then each row has its number and status, valid rows say what saving does, and each problem has its own line', () => {
    renderWithProviders(<ImportReportTable report={report(true)} />);

    const table = screen.getByRole('table', { name: 'Check of tarn-batch.csv: 2 of 4 specs valid' });
    expect(bodyRows(table)).toEqual([
      ['2', 'Tarn probe — channel A', '✓Valid', '', 'New spec'],
      ['3', 'Tarn probe — channel B', '✕2 problems', 'supply.positiveV', '"12 A" has an unexpected unit "A": expected V'],
      ['cmrr.minDb', 'must be >= 0 dB, got -3 dB'],
      ['4', 'no title', '✕1 problem', 'title', 'is required'],
      ['5', 'Tarn probe — reference', '✓Valid', '', 'New version (v3)'],
    ]);
    expect(within(screen.getByRole('note', { name: 'Header problems' })).getByText(/is not a known column \(column F\)/)).toBeTruthy();
  });

  test('when only problems are asked for, then the valid rows are left out', () => {
    renderWithProviders(<ImportReportTable report={report(true)} showOnlyProblems />);
    expect(bodyRows(screen.getByRole('table')).map((cells) => cells[0])).toEqual(['3', 'cmrr.minDb', '4']);
  });

  test('when the saved report is shown, then saved specs link to their pages', () => {
    renderWithProviders(<ImportReportTable report={report(false)} />);
    expect(screen.getByRole('link', { name: 'Tarn probe — reference' }).getAttribute('href')).toBe('/specs/22');
    expect(bodyRows(screen.getByRole('table'))[0][4]).toBe('Created (v1)');
  });
});

describe('the batch flow', () => {
  test('when a file is chosen, saved and ranked, then the check comes first, specs are ranked one at a time with progress, and the CSV link names the proposals', async () => {
    const user = userEvent.setup();
    renderWithProviders(<BatchImport projectId={1} canRank />);

    await user.upload(screen.getByLabelText('Spec file (CSV or JSON, up to 1 MB)'), new File(['title,gain.target\r\nTarn probe,20\r\n'], 'tarn-batch.csv', { type: 'text/csv' }));

    expect(await screen.findByRole('table', { name: /Check of tarn-batch.csv/ })).toBeTruthy();
    expect(uploads).toEqual([{ url: '/api/projects/1/specs/import?dryRun=true', fileName: 'tarn-batch.csv', text: 'title,gain.target\r\nTarn probe,20\r\n' }]);

    await user.click(screen.getByRole('button', { name: 'Save 2 valid specs' }));
    expect(await screen.findByText(/Saved in one go: 1 new spec and 1 new version; 2 skipped \(rows with problems\)\./)).toBeTruthy();
    expect(uploads.map((u) => u.url)).toEqual(['/api/projects/1/specs/import?dryRun=true', '/api/projects/1/specs/import']);

    deferredRanking(21, 31, 'wilson');
    deferredRanking(22, 32, null);
    await user.click(screen.getByRole('button', { name: 'Rank all 2 imported specs' }));

    expect(await screen.findByText('Tarn probe — channel A', { selector: 'span' })).toBeTruthy();
    const bar = screen.getByRole('progressbar', { name: 'Ranking progress' }) as HTMLProgressElement;
    expect([bar.value, bar.max]).toEqual([0, 2]);
    expect(api.sent.map((r) => r.key).filter((k) => k.includes('/proposals'))).toEqual(['POST /api/specs/21/proposals']); // one at a time
    rankAnswers.get(21)!.resolve();

    expect(await screen.findByText('Tarn probe — reference', { selector: 'span' })).toBeTruthy();
    expect(bar.value).toBe(1);
    rankAnswers.get(22)!.resolve();

    const link = await screen.findByRole('link', { name: 'Download the batch results (CSV)' });
    expect(link.getAttribute('href')).toBe('/api/projects/1/proposals.csv?ids=31,32');
    expect(screen.getByText(/^Ranked 2 of 2\.$/)).toBeTruthy();
    expect(bodyRows(screen.getByRole('table', { name: 'Proposals of the imported specs' }))).toEqual([
      ['Tarn probe — channel A', '#31', 'Wilson mirror'],
      ['Tarn probe — reference', '#32', 'No option passes'],
    ]);
    expect(screen.getByText(/estimates; confirm them by SPICE simulation and bench measurement/)).toBeTruthy();
  });

  test('when a file imported before is chosen again, then the page says so and offers to rank its specs as they stand', async () => {
    answerReimported = true;
    const user = userEvent.setup();
    renderWithProviders(<BatchImport projectId={1} canRank />);

    await user.upload(screen.getByLabelText('Spec file (CSV or JSON, up to 1 MB)'), new File(['title\r\nTarn probe\r\n'], 'tarn-batch.csv', { type: 'text/csv' }));

    expect((await screen.findByRole('note', { name: '' })).textContent).toMatch(/imported before: all 2 valid specs are already in the project with the same figures/);
    expect((screen.getByRole('button', { name: 'Nothing to save' }) as HTMLButtonElement).disabled).toBe(true);
    deferredRanking(21, 41, 'cascode');
    deferredRanking(22, 42, 'wilson');
    await user.click(screen.getByRole('button', { name: 'Rank all 2 imported specs' }));
    rankAnswers.get(21)!.resolve();
    await screen.findByText('Tarn probe — reference', { selector: 'span' });
    rankAnswers.get(22)!.resolve();

    expect((await screen.findByRole('link', { name: 'Download the batch results (CSV)' })).getAttribute('href')).toBe('/api/projects/1/proposals.csv?ids=41,42');
    expect(uploads.map((u) => u.url)).toEqual(['/api/projects/1/specs/import?dryRun=true']);
  });

  test('when a file over 1 MB is chosen, then it is refused in the browser and nothing is sent', async () => {
    const user = userEvent.setup();
    renderWithProviders(<BatchImport projectId={1} canRank />);

    await user.upload(screen.getByLabelText('Spec file (CSV or JSON, up to 1 MB)'), new File([new Uint8Array(1024 * 1024 + 10)], 'huge.csv', { type: 'text/csv' }));

    expect((await screen.findByRole('alert')).textContent).toMatch(/huge.csv is 1.0 MB; a file may be at most 1 MB/);
    expect(uploads).toEqual([]);
  });
});

describe('rankInTurn', () => {
  test('when one ranking fails, then the next still runs, and a stop request ends the run between specs', async () => {
    const calls: number[] = [];
    let stopAfter = Infinity;
    const outcomes = await rankInTurn(
      [
        { specId: 1, title: 'A' },
        { specId: 2, title: 'B' },
        { specId: 3, title: 'C' },
        { specId: 4, title: 'D' },
      ],
      async (specId) => {
        calls.push(specId);
        if (specId === 2) throw new Error('engine busy');
        if (specId === 3) stopAfter = 3;
        return { id: specId * 10 };
      },
      { shouldStop: () => calls.length >= stopAfter },
    );

    expect(calls).toEqual([1, 2, 3]);
    expect(outcomes.map((o) => [o.item.title, o.proposal?.id ?? null, o.error ?? null])).toEqual([
      ['A', 10, null],
      ['B', null, 'engine busy'],
      ['C', 30, null],
    ]);
  });

  test('when the server says too many (its per-person proposal limit), then the run waits and asks for the same spec again, saying so', async () => {
    const calls: number[] = [];
    const waits: number[] = [];
    const progress: (number | undefined)[] = [];
    const tooMany = new Error('You asked for 60 proposals in the last minute');
    const outcomes = await rankInTurn(
      [
        { specId: 1, title: 'A' },
        { specId: 2, title: 'B' },
      ],
      async (specId) => {
        calls.push(specId);
        if (specId === 2 && calls.filter((c) => c === 2).length < 3) throw tooMany;
        return { id: specId * 10 };
      },
      { waitBefore: (error) => (error === tooMany ? 10_000 : null), sleep: async (ms) => void waits.push(ms), onProgress: (p) => progress.push(p.waitingS) },
    );

    expect(calls).toEqual([1, 2, 2, 2]);
    expect(waits).toEqual([10_000, 10_000]);
    expect(progress.filter((s) => s !== undefined)).toEqual([10, 10]);
    expect(outcomes.map((o) => [o.item.title, o.proposal?.id ?? null, o.error ?? null])).toEqual([
      ['A', 10, null],
      ['B', 20, null],
    ]);
  });
});
