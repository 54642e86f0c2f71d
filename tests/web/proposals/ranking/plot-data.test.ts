import { describe, expect, test } from 'vitest';
import { formatQuantity } from '../../../../shared/units/format-quantity';
import { decadeTicksHz, tickLabels } from '../../../../web/src/lib/plot-axes';
import { histogramPlot, rejectionPlot, temperaturePlot } from '../../../../web/src/features/proposals/lib/plot-data';
import { histogramSummary, rejectionSummary, temperatureSummary } from '../../../../web/src/features/proposals/lib/plot-summaries';
import { strainBridge, studioLine } from './fixtures';

const REL = 1e-9;

describe('rejectionPlot', () => {
  const plot = rejectionPlot(strainBridge(), 'degenerated-mirror')!;

  test('the frequency grid is log-spaced, 4 points a decade, 1 Hz to 1 GHz', () => {
    const f = plot.frequencyHz;
    expect(f[0]).toBeCloseTo(1, 12);
    expect(f[f.length - 1] / 1e9).toBeCloseTo(1, 9);
    expect(f).toHaveLength(9 * 4 + 1);
    const ratios = f.slice(1).map((x, i) => x / f[i]);
    for (const r of ratios) expect(Math.abs(r / 10 ** 0.25 - 1)).toBeLessThan(REL * 1e3);
  });

  test('one series per solved option, aligned with the grid, then the selected mismatch curve', () => {
    expect(plot.series.map((s) => s.topology)).toEqual(['cascode', 'wilson', 'degenerated-mirror', 'widlar', 'simple-mirror', 'resistor']);
    expect(plot.data).toHaveLength(1 + 6 + 1);
    for (const column of plot.data) expect(column).toHaveLength(plot.frequencyHz.length);
    expect(plot.mismatch?.topology).toBe('degenerated-mirror');
  });

  test('target lines and the spec frequency come from the spec: 78 dB, 78 + 6 dB, 2.5 kHz', () => {
    expect(plot.requiredDb).toBe(78);
    expect(plot.requiredWithMarginDb).toBe(84);
    expect(plot.specFrequencyHz).toBe(2500);
  });

  test('the marker at the spec frequency is the worst-corner figure of the table', () => {
    const cascode = plot.series.find((s) => s.topology === 'cascode')!;
    expect(cascode.worstAtFrequencyDb).toBeCloseTo(101.78, 2);
    // Nominal curve at low frequency equals the DC figure of the option.
    expect(cascode.valuesDb[0]).toBeCloseTo(strainBridge().options[0].predicted!.cmrrDb.singleEnded, 3);
  });

  test('a single-ended output has no mismatch curve', () => {
    const single = rejectionPlot(studioLine(), 'cascode')!;
    expect(single.mismatch).toBeNull();
    expect(single.data).toHaveLength(1 + 6);
  });

  test('no solved option, no plot', () => {
    const result = strainBridge();
    expect(rejectionPlot({ ...result, options: result.options.map((o) => ({ ...o, curves: null, figures: null })) })).toBeNull();
  });

  test('summary names the best option with its worst-corner figure', () => {
    expect(rejectionSummary(plot)).toMatch(/^Cascode mirror keeps 101\.8 dB at 2\.5 kHz \(worst corner\); Resistor the least, 39\.3 dB\. 3 of 6 options reach 84 dB \(78 dB required \+ 6 dB margin\)\.$/);
  });
});

describe('histogramPlot', () => {
  const option = strainBridge().options.find((o) => o.topology === 'degenerated-mirror')!;
  const plot = histogramPlot(option)!;

  test('one bar per bin, contiguous, every sample counted once', () => {
    expect(plot.bars).toHaveLength(30);
    plot.bars.slice(1).forEach((bar, i) => expect(bar.fromDb).toBe(plot.bars[i].toDb));
    expect(plot.bars.reduce((sum, b) => sum + b.count, 0)).toBe(plot.samples);
    expect(plot.bars.map((b) => b.andAbove)).toEqual([...Array(29).fill(false), true]);
  });

  test('stepped data: the edges, and the counts with the last repeated to close the last bar', () => {
    const [x, y] = plot.data;
    expect(x).toEqual(option.monteCarlo!.histogram.binEdgesDb);
    expect(y).toEqual([...option.monteCarlo!.histogram.counts, option.monteCarlo!.histogram.counts.at(-1)]);
  });

  test('the x range holds both the required line and every bar', () => {
    expect(plot.requiredDb).toBe(78);
    expect(plot.rangeDb[0]).toBeLessThan(78);
    expect(plot.rangeDb[1]).toBeGreaterThan(plot.bars.at(-1)!.toDb);
  });

  test('single-ended outputs have no Monte Carlo histogram', () => {
    expect(histogramPlot(studioLine().options[0])).toBeNull();
  });

  test('summary gives yield, requirement and percentiles', () => {
    expect(histogramSummary('Degenerated mirror', plot, 99)).toMatch(/^Degenerated mirror: 100 % of 2000 Monte Carlo samples reach 78 dB \(99 % required\); 1st percentile 124\.4 dB, median 136\.6 dB\./);
  });
});

describe('temperaturePlot', () => {
  const option = strainBridge().options[0];
  const plot = temperaturePlot(option)!;

  test('the sweep over the spec range, gain as a magnitude', () => {
    expect(plot.temperatureC[0]).toBe(-20);
    expect(plot.temperatureC.at(-1)).toBe(65);
    expect(plot.data).toEqual([plot.temperatureC, plot.tailCurrentA, plot.gain]);
    for (const g of plot.gain) expect(g).toBeGreaterThan(0);
  });

  test('the span is max − min over the middle value, per cent', () => {
    const a = plot.tailCurrentA;
    expect(plot.tailCurrentSpanPercent).toBeCloseTo(((Math.max(...a) - Math.min(...a)) / a[3]) * 100, 9);
    expect(temperatureSummary('Cascode mirror', plot)).toMatch(/^Cascode mirror: from −20 °C to 65 °C the tail current goes from 944 µA to 9\d\d µA/);
  });

  test('an unsolved option has no sweep', () => {
    expect(temperaturePlot({ ...option, curves: null })).toBeNull();
  });
});

describe('log-axis helpers', () => {
  test.each([
    [1, 1e9, 10],
    [2.5, 950, 2],
    [0.5, 1, 1],
  ])('decadeTicksHz(%d, %d) has %d ticks', (min, max, count) => {
    const ticks = decadeTicksHz(min, max);
    expect(ticks).toHaveLength(count);
    for (const t of ticks) expect(Number(t.toExponential(0))).toBe(t);
  });
});

describe('tickLabels', () => {
  test('a tick left out for room (null, as uPlot passes it on a narrow log axis) gets no label, never "−∞ Hz"', () => {
    const labels = tickLabels([1, null, 100, null, 10_000], (v) => formatQuantity(v, 'Hz'));
    expect(labels).toEqual(['1 Hz', '', '100 Hz', '', '10 kHz']);
  });
});
