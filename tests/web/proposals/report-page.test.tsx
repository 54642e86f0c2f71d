// @vitest-environment jsdom
/**
 * The printable review report (/proposals/:id/report) on a hand-built proposal around the real
 * engine's ranking of an invented bridge-receiver spec (tests/web/fixtures): every section heading a reviewer expects,
 * the cautions when the ranking has any, "not verified yet" without a verification (before the
 * verification route exists and after), the SPICE comparison once one has finished, and the audit
 * trail to the second.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, configure, render, screen, within } from '@testing-library/react';
import { createRoutesStub } from 'react-router-dom';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { VerificationStatus } from '#shared/verification/types';
import type { Decision, Proposal } from '#shared/api/proposals';
import { Component, ErrorBoundary, loader } from '../../../web/src/routes/proposal-report';
import { mockFetch } from './decision/fixtures/fetch-mock';
import { auditEvent, DESIGNER, proposalFixture, RANKING, rankedOptionOf, REVIEWER } from './decision/fixtures/proposal-fixture';
import { job } from './verification/verification-fixtures';

// Route modules load lazily on first use: give the first render of a file time.
configure({ asyncUtilTimeout: 5000 });

// The reader of these reports sits in Berlin (UTC+1 in March, CET, by the IANA time zone database).
process.env.TZ = 'Europe/Berlin';

const SECTION_HEADINGS = ['Cautions', 'Requirement spec', 'Ranked options', 'Chosen design', 'Checks', 'SPICE verification', 'Bench measurements', 'Comments', 'Audit trail', 'Sources of the formulas'];

/** One resolved thread on a check of the Wilson mirror, with a reply (invented). */
const THREADS = {
  items: [
    {
      id: 31,
      proposalId: 2,
      anchor: { kind: 'check', topology: 'wilson', checkId: rankedOptionOf('wilson').checks[0]!.rule },
      specVersionId: 1,
      specVersion: 1,
      engineVersion: RANKING.engineVersion,
      rulesetVersion: RANKING.rulesetVersion,
      body: 'Which corner sets this margin?',
      author: { id: REVIEWER.id, displayName: REVIEWER.displayName },
      createdAt: '2026-03-02T10:40:00.000Z',
      resolvedAt: '2026-03-02T11:05:00.000Z',
      resolvedBy: { id: REVIEWER.id, displayName: REVIEWER.displayName },
      replies: [{ id: 32, body: 'The hot one, supply low.', author: { id: DESIGNER.id, displayName: DESIGNER.displayName }, createdAt: '2026-03-02T10:50:00.000Z' }],
    },
  ],
};

const PATIENT_CAUTION = 'Caution: the input is patient-connected. Medical electrical equipment falls under IEC 60601-1, with its isolation and leakage-current limits.';
const CHOOSE_REASON = 'The Wilson mirror keeps the tail current steadier over the 0–70 °C range on this board.';
const APPROVE_COMMENT = 'Wilson is fine here; the extra transistor is already on the BOM.';

const PROJECT = { id: 1, name: 'Kestrel load-cell amplifier', description: 'Bridge receiver.', createdById: 1, createdAt: '2026-03-01T08:00:00.000Z' };

/** A decided and approved proposal: the designer chose the ranked Wilson mirror, a reviewer approved; the spec marks the input patient-connected. */
function approvedWithCautions(): Proposal {
  const base = proposalFixture();
  const decision: Decision = {
    id: 11,
    proposalId: 2,
    kind: 'choose',
    topology: 'wilson',
    design: rankedOptionOf('wilson').design!,
    evaluation: null,
    reason: CHOOSE_REASON,
    decidedById: DESIGNER.id,
    createdAt: '2026-03-02T10:15:42.000Z',
  };
  return {
    ...base,
    status: 'approved',
    allowedEvents: [],
    result: { ...RANKING, cautions: [PATIENT_CAUTION] },
    specVersion: { ...base.specVersion, payload: { ...base.specVersion.payload, hazards: { patientConnected: true, mainsReferenced: false } } },
    decisions: [decision],
    reviews: [{ id: 21, proposalId: 2, decisionId: 11, verdict: 'approve', comment: APPROVE_COMMENT, reviewerId: REVIEWER.id, createdAt: '2026-03-02T11:20:07.000Z' }],
  };
}

const AUDIT = {
  items: [
    auditEvent(1, '2026-03-02T09:30:00.000Z', 'proposal.ranked', DESIGNER.id, 2, { specVersion: 1, recommended: 'degenerated-mirror', status: 'ranked' }),
    auditEvent(2, '2026-03-02T10:15:42.000Z', 'proposal.decided', DESIGNER.id, 11, { kind: 'choose', topology: 'wilson', from: 'ranked', to: 'decided' }),
    auditEvent(3, '2026-03-02T11:20:07.000Z', 'proposal.approved', REVIEWER.id, 21, { verdict: 'approve', from: 'decided', to: 'approved' }),
  ],
};

const ROUTE_NOT_FOUND = { status: 404, body: { error: 'No such API route.', code: 'route-not-found' } };

function finishedVerification(): VerificationStatus {
  const verification = job({
    id: 5,
    proposalId: 2,
    createdAt: '2026-03-02T09:40:00.000Z',
    startedAt: '2026-03-02T09:40:01.000Z',
    finishedAt: '2026-03-02T09:40:09.000Z',
    result: {
      simulator: 'ngspice-45',
      tolerances: { currentPercent: 3, gainPercent: 5, singleEndedCmrrDb: 1.5, differentialCmrrDb: 2, tailOutputResistancePercent: 20, cornerFrequencyPercent: 20, powerPercent: 5, voltageV: 0.05 },
      simulatorStartMs: 300,
      elapsedMs: 8000,
      options: [
        {
          topology: 'degenerated-mirror',
          source: 'option',
          outcome: 'verified',
          error: null,
          nominal: {
            label: 'Nominal',
            inputCommonModeV: 0,
            temperatureC: 27,
            figures: [
              // Hand-made numbers: 1 mA predicted against 990 µA simulated is +1.0 % of the simulated value.
              { key: 'tailCurrentA', label: 'Tail current', unit: 'A', predicted: 1e-3, simulated: 0.99e-3, delta: 1.0101, deltaKind: 'percent', tolerance: 3, agrees: true },
              { key: 'cmrrSingleEndedDb', label: 'Single-ended CMRR', unit: 'dB', predicted: 101.2, simulated: 98.9, delta: 2.3, deltaKind: 'db', tolerance: 1.5, agrees: false },
            ],
          },
          corners: [],
          rejectionCurve: [],
          agrees: false,
          disagreements: 1,
          elapsedMs: 1200,
        },
      ],
    },
  });
  return { verification, monteCarlo: [] };
}

let fetchMock: ReturnType<typeof mockFetch>;

afterEach(() => {
  cleanup();
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

function renderReport(proposal: Proposal, verification: { status?: number; body: unknown }) {
  fetchMock = mockFetch({
    'GET /api/proposals/2': () => ({ body: proposal }),
    'GET /api/proposals/2/audit': () => ({ body: AUDIT }),
    'GET /api/proposals/2/comments': () => ({ body: THREADS }),
    'GET /api/proposals/2/verification': () => verification,
    'GET /api/proposals/2/measurements?page=1&pageSize=100': () => ({ body: { items: [], total: 0, page: 1, pageSize: 100 } }),
    'GET /api/projects/1': () => ({ body: PROJECT }),
    'GET /api/projects/1/members': () => ({ body: { items: [DESIGNER, REVIEWER] } }),
  });
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const Stub = createRoutesStub([{ path: '/proposals/:proposalId/report', Component, loader: loader(queryClient), ErrorBoundary, HydrateFallback: () => <p>Loading the report…</p> }]);
  render(
    <QueryClientProvider client={queryClient}>
      <Stub initialEntries={['/proposals/2/report']} />
    </QueryClientProvider>,
  );
}

const section = (name: string) => screen.getByRole('region', { name: new RegExp(name) });

describe('review report page', () => {
  test('when a decided proposal with a caution opens before the verification route exists, then every section is there, in order, with the caution and "not verified yet"', async () => {
    renderReport(approvedWithCautions(), ROUTE_NOT_FOUND);

    const title = await screen.findByRole('heading', { level: 1 });
    expect(title.textContent).toContain('Proposal #2');
    const headings = screen.getAllByRole('heading', { level: 2 }).map((h) => h.textContent ?? '');
    expect(headings.map((h) => h.replace(/^\d+\s*/, ''))).toEqual(SECTION_HEADINGS);

    // Title block: product, project, proposal, spec version, state, versions, the estimates notice.
    const header = title.closest('header')!;
    expect(header.textContent).toContain('Longtail');
    expect(await within(header).findByText('Kestrel load-cell amplifier')).toBeTruthy();
    expect(header.textContent).toContain(`${proposalFixture().specVersion.title}, version 1`);
    expect(header.textContent).toContain('Approved');
    expect(header.textContent).toContain(RANKING.rulesetVersion);
    expect(header.textContent).toMatch(/estimates?.*confirm them by SPICE simulation and bench measurement/i);
    expect(screen.getByRole('button', { name: 'Print or save as PDF' })).toBeTruthy();

    const cautions = section('Cautions');
    expect(within(cautions).getByRole('note', { name: 'Cautions' }).textContent).toContain('The input is patient-connected');
    expect(cautions.textContent).toMatch(/applicable standards, local codes or licensed practice/);

    // The spec as field and value with its unit.
    const spec = section('Requirement spec');
    const payload = proposalFixture().specVersion.payload;
    const positiveRow = within(spec).getByRole('rowheader', { name: 'Positive rail' }).closest('tr')!;
    expect(positiveRow.textContent).toMatch(new RegExp(`${payload.supply.positiveV}\\s?V$`));
    expect(within(spec).getByRole('rowheader', { name: 'Patient-connected input' }).closest('tr')!.textContent).toContain('Yes');

    const ranking = section('Ranked options');
    // A row of group headings, a row of column headings, then one row per option.
    expect(within(ranking).getAllByRole('row')).toHaveLength(RANKING.options.length + 2);
    // An approved proposal's design is 'signed off' in the report's table, as on the page.
    expect(within(ranking).getByRole('rowheader', { name: /Wilson mirror/ }).textContent).toContain('signed off');

    const design = section('Chosen design');
    expect(design.textContent).toContain('Priya Valcourt');
    expect(design.textContent).toContain(CHOOSE_REASON);
    expect(design.textContent).toContain('Samir Edelstein signed off this decision');
    // The design itself is named first, with the recommendation and the designer's reason beside it.
    expect(within(design).getByTestId('report-design').textContent).toMatch(/^Signed-off design: Wilson mirror/);
    expect(within(design).getByTestId('report-design').textContent).toContain(CHOOSE_REASON);
    expect(design.textContent).toContain(APPROVE_COMMENT);
    // The schematic first, then the Monte Carlo plot.
    expect(within(design).getAllByRole('img')[0].getAttribute('aria-label')).toMatch(/Wilson/i);

    const checks = section('Checks');
    expect(within(checks).getByRole('heading', { level: 3, name: /Every check of Wilson mirror, the decided design/ })).toBeTruthy();
    const wilsonChecks = within(checks).getByRole('table');
    expect(within(wilsonChecks).getAllByRole('row')).toHaveLength(rankedOptionOf('wilson').checks.length + 1);
    expect(within(checks).getByRole('heading', { level: 3, name: 'Failed checks of the other options' })).toBeTruthy();

    expect(section('SPICE verification').textContent).toMatch(/Not verified yet/);

    const comments = section('Comments');
    const wilsonCheck = rankedOptionOf('wilson').checks[0]!;
    expect(comments.textContent).toContain('1 thread: 0 open, 1 resolved.');
    expect(comments.textContent).toContain(`#31 on the check “${wilsonCheck.title ?? wilsonCheck.rule}” of the Wilson mirror`);
    expect(comments.textContent).toMatch(/Resolved by Samir Edelstein, 2 Mar 2026/);
    expect(comments.textContent).toContain('Which corner sets this margin?');
    expect(comments.textContent).toMatch(/Priya Valcourt, 2 Mar 2026.*:The hot one, supply low\./);

    const audit = section('Audit trail');
    const rows = within(audit).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(3);
    // Full timestamps: hours, minutes and seconds (the seconds of the approval are 07).
    expect(rows[2].querySelector('time')!.getAttribute('dateTime')).toBe('2026-03-02T11:20:07.000Z');
    expect(rows[2].querySelector('time')!.textContent).toMatch(/\d{1,2}:\d{2}:07/);
    expect(rows[2].textContent).toContain('Samir Edelstein');

    // Sources as DOMAIN.md cites them (author, title, edition).
    const sources = section('Sources of the formulas');
    expect(sources.textContent).toContain('Gray, Hurst, Lewis, Meyer, Analysis and Design of Analog Integrated Circuits');
    expect(sources.textContent).toContain('Sedra, Smith, Microelectronic Circuits');
    expect(sources.textContent).toContain('IEC 60063:2015');

    const footer = screen.getByText(/Longtail review report of proposal #2/).closest('footer')!;
    expect(footer.textContent).toMatch(/confirm them by SPICE simulation and bench measurement/);
  });

  test('when the ranking has no caution and nobody has decided or verified, then it says so in each place', async () => {
    renderReport(proposalFixture({ result: { ...RANKING, cautions: [] } }), { body: { verification: null, monteCarlo: [] } });

    await screen.findByRole('heading', { level: 1 });
    expect(section('Cautions').textContent).toMatch(/None\. The rule set raised no caution/);
    expect(screen.queryByRole('note', { name: 'Cautions' })).toBeNull();
    expect(section('Chosen design').textContent).toMatch(/No decision yet/);
    expect(within(section('Checks')).getByRole('heading', { level: 3, name: /Every check of Degenerated mirror, the recommendation/ })).toBeTruthy();
    expect(section('SPICE verification').textContent).toMatch(/Not verified yet.*Nobody has asked/);
  });

  test('when a verification is still running, then the report says "not verified yet" and how far it is', async () => {
    const running = finishedVerification();
    running.verification = { ...running.verification!, state: 'simulating', done: 2, total: 6, finishedAt: null, result: null };
    renderReport(proposalFixture(), { body: running });

    await screen.findByRole('heading', { level: 1 });
    expect(section('SPICE verification').textContent).toMatch(/Not verified yet.*running \(2 of 6 done\)/);
  });

  test('when a verification has finished, then each figure shows predicted beside simulated with the difference and the agreement', async () => {
    renderReport(proposalFixture(), { body: finishedVerification() });

    await screen.findByRole('heading', { level: 1 });
    const verification = section('SPICE verification');
    expect(verification.textContent).not.toMatch(/Not verified yet/);
    expect(verification.textContent).toContain('ngspice-45');
    expect(within(verification).getByRole('heading', { level: 3 }).textContent).toMatch(/Degenerated mirror.*1 figure outside tolerance/);
    const current = within(verification).getByRole('rowheader', { name: 'Tail current' }).closest('tr')!;
    // The last cell is the verdict: a glyph (hidden from assistive technology) and a word.
    const cells = (row: Element) => within(row as HTMLElement).getAllByRole('cell').map((c) => c.textContent?.replace(/^[✓✕]/, ''));
    expect(cells(current)).toEqual(['1 mA', '990 µA', '+1.0 %', '±3 %', 'Agrees']);
    const cmrr = within(verification).getByRole('rowheader', { name: 'Single-ended CMRR' }).closest('tr')!;
    expect(cells(cmrr)).toEqual(['101.2 dB', '98.9 dB', '+2.30 dB', '±1.5 dB', 'Outside']);
  });

  test('the audit trail prints times in the reader’s time zone and names it', async () => {
    renderReport(approvedWithCautions(), ROUTE_NOT_FOUND);

    await screen.findByRole('heading', { level: 1 });
    const audit = section('Audit trail');
    expect(within(audit).getByRole('table').querySelector('caption')!.textContent).toContain('Europe/Berlin (CET)');
    const rows = within(audit).getAllByRole('row').slice(1);
    // 11:20:07 UTC is 12:20:07 in Berlin in March.
    expect(rows[2].querySelector('time')!.textContent).toBe('2 Mar 2026, 12:20:07 CET');
  });

  test('the plots are static SVG: rejection against frequency for every solved option, and the design’s Monte Carlo beside a finished SPICE one', async () => {
    const status = finishedVerification();
    // A finished SPICE Monte Carlo of the decided Wilson mirror (hand-made counts on four shared bins).
    const monteCarlo = job({
      id: 6,
      proposalId: 2,
      kind: 'monte-carlo',
      topology: 'wilson',
      runs: 10,
      finishedAt: '2026-03-02T09:50:00.000Z',
      result: {
        simulator: 'ngspice-45',
        topology: 'wilson',
        figure: 'cmrr-differential',
        condition: 'ICM −1.5 V, 65 °C',
        runs: 10,
        seed: 1,
        requiredDb: 78,
        failedRuns: 0,
        simulatedDb: [80, 85, 90, 95, 100, 100, 105, 110, 115, 118],
        simulated: { yieldPercent: 100, percentilesDb: { p1: 80, p5: 80, p50: 100, p95: 118 } },
        predictedDb: [81, 86, 91, 95, 99, 101, 104, 111, 114, 119],
        predicted: { yieldPercent: 100, percentilesDb: { p1: 81, p5: 81, p50: 100, p95: 119 } },
        histogram: { binEdgesDb: [80, 90, 100, 110, 120], simulatedCounts: [2, 2, 3, 3], predictedCounts: [2, 2, 3, 3] },
        elapsedMs: 900,
      },
    });
    renderReport(approvedWithCautions(), { body: { ...status, monteCarlo: [monteCarlo] } });

    await screen.findByRole('heading', { level: 1 });
    expect(document.querySelector('canvas')).toBeNull();

    const ranking = section('Ranked options');
    const rejection = within(ranking).getByRole('img', { name: /Rejection against frequency/ });
    expect(rejection.tagName.toLowerCase()).toBe('svg');
    const solved = RANKING.options.filter((o) => o.curves).map((o) => o.topology);
    const drawn = [...rejection.querySelectorAll('path[data-series]')].map((p) => p.getAttribute('data-series'));
    for (const topology of solved) expect(drawn).toContain(topology);
    // The strain bridge's output is differential: the decided option's mismatch worst case is drawn too.
    expect(drawn).toContain('mismatch');
    for (const path of rejection.querySelectorAll('path[data-series]')) expect(path.getAttribute('d')).toMatch(/^M[\d.]+,[\d.]+L/);
    // Axis labels in words and units.
    expect(rejection.textContent).toContain('Frequency');
    expect(rejection.textContent).toContain('Rejection, dB');

    const design = section('Chosen design');
    const histograms = within(design).getAllByRole('img', { name: /Monte Carlo/ });
    expect(histograms.map((h) => h.tagName.toLowerCase())).toEqual(['svg', 'svg']);
    // The engine's histogram has one bar per bin of its Monte Carlo result.
    expect(histograms[0].querySelectorAll('g[data-series="engine"] rect')).toHaveLength(rankedOptionOf('wilson').monteCarlo!.histogram.counts.length);
    expect(histograms[1].querySelectorAll('g[data-series="simulated"] rect')).toHaveLength(4);
    expect(histograms[1].querySelector('path[data-series="predicted"]')).toBeTruthy();
  });
});
