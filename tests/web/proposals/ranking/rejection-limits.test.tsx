// @vitest-environment jsdom
/**
 * What limits the rejection at the spec frequency, in the option detail: the parts with their
 * elements and values, shares and the rejection without each (figures read from the engine's
 * ranking in the fixtures or written by hand here, never copied from the code under test).
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, test, vi } from 'vitest';
import type { RejectionLimits } from '#shared/engine/rejection-limits';
import { RankingView } from '../../../../web/src/features/proposals/components/ranking-view';
import { rejectionLimitView } from '../../../../web/src/features/proposals/lib/rejection-limits';
import { proposalOf, studioLine } from './fixtures';

vi.mock('../../../../web/src/features/proposals/components/ranking/plots/charts', () => ({
  RejectionChart: () => <div data-testid="rejection-chart" />,
  HistogramChart: () => <div data-testid="histogram-chart" />,
  TemperatureChart: () => <div data-testid="temperature-chart" />,
}));

afterEach(cleanup);

/** Hand-made limits of a cascode at 100 kHz: tail CJC, wiring, CJS, Rout, a small base–emitter part, the pair's CJC against. */
const LIMITS: RejectionLimits = {
  frequencyHz: 1e5,
  output: 'single-ended',
  conditionLabel: 'ICM −6.5 V, 55 °C',
  rejectionDb: 67.33,
  limits: [
    { part: 'tail-base-collector', elements: [{ name: 'Q6', capacitanceF: 1.48e-12 }], sharePercent: 48.9, sensitivity: 1.2, rejectionWithoutDb: 79.13 },
    { part: 'tail-wiring', elements: [{ name: 'CT', capacitanceF: 2.2e-12 }], sharePercent: 36.5, sensitivity: 0.9, rejectionWithoutDb: 74.56 },
    { part: 'tail-collector-substrate', elements: [{ name: 'Q6', capacitanceF: 0.748e-12 }], sharePercent: 12.4, sensitivity: 0.3, rejectionWithoutDb: 69.21 },
    { part: 'tail-resistance', elements: [{ name: 'tail', resistanceOhm: 12.99e6 }], sharePercent: 1.9, sensitivity: 0.05, rejectionWithoutDb: null },
    { part: 'tail-base-emitter', elements: [{ name: 'Q6', capacitanceF: 29.8e-12 }], sharePercent: 0.3, sensitivity: 0.007, rejectionWithoutDb: 67.37 },
  ],
  offsetting: [{ part: 'pair-base-collector', elements: [{ name: 'Q1', capacitanceF: 1.06e-12 }], sharePercent: -35.2, sensitivity: -0.86, rejectionWithoutDb: 63.5 }],
};

describe('rejectionLimitView', () => {
  test('each part named with its elements and values, its share and the rejection without it; parts under 1 % in one row', () => {
    const view = rejectionLimitView(LIMITS, '100 kHz')!;
    expect(view.heading).toBe('At 100 kHz and ICM −6.5 V, 55 °C (the condition that governs it) the single-ended rejection is 67.3 dB.');
    // the largest parts until they hold 60 %
    expect(view.lead).toBe('Mostly tail transistor CJC (Q6 1.48 pF), 49 % and tail wiring capacitance (CT 2.2 pF), 37 %.');
    expect(view.rows.map((r) => [r.name, r.elements, r.share, r.without])).toEqual([
      ['Tail transistor CJC', 'Q6 1.48 pF', '49 %', '79.1 dB (+11.8 dB)'],
      ['Tail wiring capacitance', 'CT 2.2 pF', '37 %', '74.6 dB (+7.2 dB)'],
      ['Tail transistor CJS', 'Q6 748 fF', '12 %', '69.2 dB (+1.9 dB)'],
      ['Tail output resistance', '13 MΩ', '2 %', ''],
      ['Tail transistor CJE + TF', '', '< 1 %', ''],
    ]);
    expect(view.offsetting).toEqual(['Pair CJC (Q1 1.06 pF) works against the common mode (−35 %); without it the rejection would be 63.5 dB.']);
  });

  test('nothing to show for an option without them (unsolved, or ranked before they existed)', () => {
    expect(rejectionLimitView(null, '1 kHz')).toBeNull();
    expect(rejectionLimitView(undefined, '1 kHz')).toBeNull();
  });
});

describe('the option detail', () => {
  test('shows what limits the selected option’s rejection at the spec frequency, with the engine’s parts', () => {
    const result = studioLine();
    const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(
      <QueryClientProvider client={client}>
        <RankingView proposal={proposalOf(result, 'studio')} />
      </QueryClientProvider>,
    );
    const detail = document.getElementById('option-detail')!;
    const selected = result.options.find((o) => o.topology === result.recommended) ?? result.options[0];
    const section = within(detail).getByRole('heading', { name: 'What limits the rejection at the spec frequency' }).parentElement!;
    const table = within(section).getByRole('table', { name: /What limits the rejection/ });
    const rows = within(table).getAllByRole('row').slice(1);
    const shown = selected.rejectionLimits!.limits.filter((l) => l.sharePercent >= 1);
    expect(rows.length).toBeGreaterThanOrEqual(shown.length);
    expect(within(rows[0]).getByText(shown[0].part === 'tail-wiring' ? 'Tail wiring capacitance' : 'Tail output resistance')).toBeTruthy();
    expect(screen.getAllByText(/confirm by simulation and bench measurement/).length).toBeGreaterThan(0);
  });
});
