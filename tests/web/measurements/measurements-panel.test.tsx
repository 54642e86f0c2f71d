// @vitest-environment jsdom
/**
 * The bench measurements panel asks for one page of the list (metadata and comparison, no
 * points), then for the points of the one measurement it plots, and of another only when it is
 * shown; more measurements than a page bring page controls. The measurements are invented
 * (Fernhollow Instruments' bench); the comparison figures are written out by hand.
 */
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { MeasurementSummary, MeasurementView } from '#shared/measurements/types';
import { MeasurementsPanel } from '../../../web/src/features/measurements/components/measurements-panel';
import type { Decision, Proposal } from '#shared/api/proposals';
import { mockFetch } from '../proposals/decision/fixtures/fetch-mock';
import { DESIGNER, differentialProposal, PROPOSAL_ID, STATUS_URL } from '../proposals/verification/verification-fixtures';
import { renderWithClient } from '../helpers/render';

// uPlot needs a canvas; jsdom has none. The chart is replaced by a stand-in that says how many measured points it got.
vi.mock('../../../web/src/features/measurements/components/plots/lazy-measurement-chart', () => ({
  MeasurementChart: ({ plot }: { plot: { measuredDb: (number | null)[] } }) => <div data-testid="measurement-chart">{plot.measuredDb.filter((v) => v !== null).length} measured points</div>,
}));

const LIST = `/api/proposals/${PROPOSAL_ID}/measurements`;

function decided(): Proposal {
  const proposal = differentialProposal();
  const topology = proposal.result.options[0].topology;
  const decision = { id: 11, proposalId: PROPOSAL_ID, kind: 'accept', topology, design: proposal.result.options[0].design, evaluation: null, reason: null, decidedById: 3, createdAt: '2026-11-03T10:00:00.000Z' } as unknown as Decision;
  return { ...proposal, status: 'decided', decisions: [decision] };
}

function summary(id: number, fileName: string, measuredDb: number, predictedDb: number): MeasurementSummary {
  return {
    id,
    proposalId: PROPOSAL_ID,
    decisionId: 11,
    topology: decided().decisions[0].topology,
    designSource: 'option',
    kind: 'cmrr',
    unit: 'dB',
    fileName,
    sha256: String(id).repeat(32).slice(0, 64),
    sizeBytes: 120,
    pointCount: 4,
    note: null,
    uploadedBy: { id: 3, displayName: 'Priya Valcourt' },
    uploadedAt: '2026-11-04T09:00:00.000Z',
    comparison: { kind: 'cmrr', atFrequencyHz: 2500, basis: 'spec', measuredDb, predictedDb, simulatedDb: null, differenceFromPredictedDb: measuredDb - predictedDb, differenceFromSimulatedDb: null, note: null },
  };
}

const withPoints = (m: MeasurementSummary, count: number): MeasurementView => ({
  ...m,
  pointCount: count,
  points: Array.from({ length: count }, (_, i) => ({ frequencyHz: 10 ** (i + 1), value: 100 - i })),
});

const NEWER = summary(22, 'board-2.csv', 96.5, 99.0);
const OLDER = summary(21, 'board-1.csv', 98.0, 99.0);

let fetchMock: ReturnType<typeof mockFetch>;
afterEach(() => {
  expect(fetchMock.unmocked).toEqual([]);
  vi.unstubAllGlobals();
});

function serve(total: number) {
  fetchMock = mockFetch({
    [`GET ${LIST}?page=1&pageSize=10`]: () => ({ body: { items: [NEWER, OLDER], total, page: 1, pageSize: 10 } }),
    [`GET ${LIST}?page=2&pageSize=10`]: () => ({ body: { items: [], total, page: 2, pageSize: 10 } }),
    [`GET ${LIST}/22`]: () => ({ body: withPoints(NEWER, 4) }),
    [`GET ${LIST}/21`]: () => ({ body: withPoints(OLDER, 3) }),
    [`GET ${STATUS_URL}`]: () => ({ body: { verification: null, monteCarlo: [] } }),
  });
}

const paths = () => fetchMock.calls.map((c) => c.path);

describe('MeasurementsPanel', () => {
  test('when the proposal has measurements, then one page is listed and only the newest one’s points are fetched and plotted; another’s when it is shown', async () => {
    serve(2);
    renderWithClient(<MeasurementsPanel proposal={decided()} user={DESIGNER} />);

    expect((await screen.findByTestId('measurement-chart')).textContent).toBe('4 measured points');
    expect(paths()).toContain(`${LIST}?page=1&pageSize=10`);
    expect(paths()).toContain(`${LIST}/22`);
    expect(paths()).not.toContain(`${LIST}/21`);
    const table = screen.getByRole('table', { name: 'Bench measurements of this proposal' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getAllByRole('cell')[0].textContent)).toEqual(['board-2.csv', 'board-1.csv']);
    // measured − predicted, from the list's comparison: 96.5 − 99.0 = −2.5 dB
    expect(within(rows[0]).getAllByRole('cell')[3].textContent).toBe('\u22122.5 dB');
    expect(screen.queryByRole('navigation', { name: 'Measurement pages' })).toBeNull();

    await userEvent.click(within(rows[1]).getByRole('button', { name: /Show/ }));

    await waitFor(() => expect(screen.getByTestId('measurement-chart').textContent).toBe('3 measured points'));
    expect(paths()).toContain(`${LIST}/21`);
  });

  test('when there are more measurements than a page, then page controls appear and Next asks for page 2', async () => {
    serve(12);
    renderWithClient(<MeasurementsPanel proposal={decided()} user={DESIGNER} />);
    const pages = await screen.findByRole('navigation', { name: 'Measurement pages' });
    expect(within(pages).getByText('1–10 of 12')).toBeTruthy();

    await userEvent.click(within(pages).getByRole('button', { name: /Next/ }));

    await waitFor(() => expect(paths()).toContain(`${LIST}?page=2&pageSize=10`));
  });
});
