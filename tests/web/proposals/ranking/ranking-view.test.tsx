// @vitest-environment jsdom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, test, vi } from 'vitest';
import { RankingView } from '../../../../web/src/features/proposals/components/ranking-view';
import type { Proposal } from '#shared/api/proposals';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatMargin } from '#shared/units/figures';
import { blockingShortCount } from '../../../../web/src/features/proposals/lib/option-rows';
import { rejectionPlot } from '../../../../web/src/features/proposals/lib/plot-data';
import { rejectionSummary } from '../../../../web/src/features/proposals/lib/plot-summaries';
import { topologyName } from '../../../../web/src/lib/topology-names';
import { proposalOf, strainBridge, studioLine } from './fixtures';

// uPlot needs a canvas; jsdom has none. The lazy chart module is replaced by stand-ins.
vi.mock('../../../../web/src/features/proposals/components/ranking/plots/charts', () => ({
  RejectionChart: ({ selected }: { selected: string }) => <div data-testid="rejection-chart">{selected}</div>,
  HistogramChart: () => <div data-testid="histogram-chart" />,
  TemperatureChart: () => <div data-testid="temperature-chart" />,
}));

afterEach(cleanup);

function renderView(proposal: Proposal) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={client}>
      <RankingView proposal={proposal} />
    </QueryClientProvider>,
  );
  return userEvent.setup();
}

const detail = () => document.getElementById('option-detail')!;

describe('RankingView', () => {
  test('summary with the readable name, and the estimates notice; no caution block without cautions', () => {
    const result = strainBridge();
    renderView(proposalOf(result));
    expect(screen.queryByRole('alert')).toBeNull();
    expect(screen.getByText(topologyName(result.recommended!), { selector: 'span' })).toBeTruthy();
    expect(screen.getByText(`— ${result.summary}`)).toBeTruthy();
    expect(screen.getByText(/confirm them by SPICE simulation and bench measurement/)).toBeTruthy();
  });

  test('cautions show in an alert, with a glyph and words', () => {
    const result = strainBridge();
    result.cautions = ['Caution: the input is patient-connected. Medical electrical equipment falls under IEC 60601-1.'];
    renderView(proposalOf(result));
    const alert = screen.getByRole('alert');
    expect(alert.textContent).toContain('⚠');
    expect(alert.textContent).toContain('Caution');
    expect(within(alert).getByText(/^The input is patient-connected\. Medical electrical equipment falls under IEC 60601-1\.$/)).toBeTruthy();
  });

  test('no recommendation is said plainly', () => {
    const result = { ...strainBridge(), recommended: null, summary: 'None of the 6 options passes every blocking check; the ranking shows what each one lacks.' };
    renderView(proposalOf(result));
    expect(screen.getByText('No recommendation')).toBeTruthy();
    // The detail then opens on the first-ranked option.
    expect(within(detail()).getByRole('heading', { level: 2 }).textContent).toBe(topologyName(result.options.find((o) => o.rank === 1)!.topology));
  });

  test('the detail opens on the recommendation: schematic, sized values, checks with their margins, corners, notes', () => {
    const result = strainBridge();
    expect(result.recommended).toBe('degenerated-mirror');
    const option = result.options.find((o) => o.topology === 'degenerated-mirror')!;
    renderView(proposalOf(result));
    const panel = within(detail());
    expect(panel.getByRole('heading', { level: 2 }).textContent).toBe('Degenerated mirror');
    expect(panel.getByRole('img').getAttribute('aria-label')).toContain('degenerated mirror tail');
    const emitter = panel.getByRole('rowheader', { name: 'RE3, RE4' }).closest('tr')!;
    expect(emitter.textContent).toContain(formatQuantity(option.design!.tail.topology === 'degenerated-mirror' ? option.design!.tail.emitterResistanceOhm : NaN, 'Ohm'));
    expect(panel.getAllByText(/E96, ±1\s%/).length).toBe(3);
    expect(panel.getByRole('rowheader', { name: /Monte Carlo yield/ })).toBeTruthy();
    const target = option.checks.find((c) => c.rule === 'cmrr-target')!;
    expect(panel.getAllByText(formatMargin(target.margin!, target.marginUnit)).length).toBeGreaterThan(0);
    expect(panel.getByText('governs rejection').closest('tr')!.textContent).toContain(option.figures!.worstCmrrCorner);
    expect(option.sizingNotes.length).toBeGreaterThan(0);
    for (const note of option.sizingNotes) expect(panel.getByText(note)).toBeTruthy();
  });

  test('selecting another row changes the detail and the highlighted curve', async () => {
    const user = renderView(proposalOf(strainBridge()));
    await user.click(screen.getByRole('button', { name: 'Wilson mirror' }));
    const panel = within(detail());
    expect(panel.getByRole('heading', { level: 2 }).textContent).toBe('Wilson mirror');
    expect([...detail().querySelectorAll('[data-device]')].map((g) => g.getAttribute('data-device')).sort()).toEqual(['Q1', 'Q2', 'Q3', 'Q4', 'Q5']);
    expect((await screen.findByTestId('rejection-chart')).textContent).toBe('wilson');
  });

  test('failing checks come first, each with its verdict and reason', async () => {
    const result = strainBridge();
    const resistor = result.options.find((o) => o.topology === 'resistor')!;
    expect(blockingShortCount(resistor)).toBeGreaterThan(1);
    const user = renderView(proposalOf(result));
    await user.click(screen.getByRole('button', { name: 'Resistor' }));
    const rows = within(detail()).getAllByRole('row');
    const checkRows = rows.filter((r) => r.closest('table')?.querySelector('caption')?.textContent?.startsWith('Checks'));
    expect(checkRows[1].textContent).toMatch(/^✕Short/);
    expect(within(detail()).getByText(`Short on ${blockingShortCount(resistor)} blocking checks`, { exact: false })).toBeTruthy();
  });

  test('plots load lazily, each with a summary caption', async () => {
    const result = strainBridge();
    renderView(proposalOf(result));
    expect(await screen.findByTestId('rejection-chart')).toBeTruthy();
    expect(await screen.findByTestId('histogram-chart')).toBeTruthy();
    expect(await screen.findByTestId('temperature-chart')).toBeTruthy();
    const figure = screen.getByRole('figure', { name: 'Rejection against frequency, every option' });
    expect(figure.getAttribute('aria-describedby')).toBeTruthy();
    expect(document.getElementById(figure.getAttribute('aria-describedby')!)!.textContent).toContain(rejectionSummary(rejectionPlot(result, result.recommended!)!));
  });

  test('a single-ended spec says why there is no Monte Carlo histogram', async () => {
    renderView(proposalOf(studioLine(), 'studio'));
    expect(await screen.findByTestId('temperature-chart')).toBeTruthy();
    expect(screen.queryByTestId('histogram-chart')).toBeNull();
    expect(screen.getByText(/single-ended output, so rejection is set by the tail/)).toBeTruthy();
    expect(within(detail()).getByRole('rowheader', { name: 'RE1, RE2' })).toBeTruthy();
  });
});

describe('RankingView: the current design first', () => {
  const decided = (kind: 'choose' | 'override', status: Proposal['status'] = 'approved'): Proposal => {
    const proposal = proposalOf(strainBridge());
    const cascode = proposal.result.options.find((o) => o.topology === 'cascode')!;
    const design = kind === 'override' ? { ...cascode.design!, collectorResistanceOhm: 12_000 } : cascode.design!;
    return {
      ...proposal,
      status,
      decisions: [
        { id: 21, proposalId: 7, kind, topology: 'cascode', design, evaluation: kind === 'override' ? { ...cascode, design } : null, reason: 'Highest rejection margin for the long cable.', decidedById: 3, createdAt: '2026-01-02T00:00:00.000Z' },
      ],
    };
  };

  test('when a chosen cascode is signed off, then the summary, the highlighted row and the netlist download name it, with the recommendation and the reason beside it', () => {
    renderView(decided('choose'));
    const summary = document.querySelector('[data-current-design]')!;
    expect(summary.getAttribute('data-current-design')).toBe('cascode');
    expect(summary.textContent).toMatch(/^Signed-off designCascode mirror/);
    expect(summary.textContent).toContain(`The engine recommended the ${topologyName(strainBridge().recommended!)}; the designer chose the Cascode mirror because: Highest rejection margin for the long cable.`);
    const row = document.querySelector('tr[data-current]')!;
    expect(within(row as HTMLElement).getByRole('button', { name: 'Cascode mirror' })).toBeTruthy();
    expect(row.getAttribute('data-selected')).toBe('true');
    expect(within(detail()).getByRole('heading', { level: 2 }).textContent).toBe('Cascode mirror');
    const netlist = screen.getByRole('link', { name: 'Signed-off design as SPICE netlist' });
    expect(netlist.getAttribute('href')).toBe('/api/proposals/7/netlist.cir?source=decision&drive=differential');
  });

  test('when own values are decided, then no ranked row is marked as the design, the table says where it is, and the download is of the own values', () => {
    renderView(decided('override', 'decided'));
    expect(document.querySelector('[data-current-design]')!.textContent).toMatch(/^Decided designCascode mirror, own values/);
    expect(document.querySelector('tr[data-current]')).toBeNull();
    expect(screen.getByText(/The decided design is the designer’s own values \(Cascode mirror\), not a ranked option/)).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Decided design as SPICE netlist (own values)' }).getAttribute('href')).toBe('/api/proposals/7/netlist.cir?source=decision&drive=differential');
  });
});
