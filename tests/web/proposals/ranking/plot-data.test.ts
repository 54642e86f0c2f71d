import { describe, expect, test } from 'vitest';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatDb, formatPercent, formatTargetDb } from '#shared/units/figures';
import { decadeTicksHz, tickLabels } from '../../../../web/src/lib/plot-axes';
import { histogramPlot, rejectionPlot, temperaturePlot } from '../../../../web/src/features/proposals/lib/plot-data';
import { histogramSummary, rejectionSummary, temperatureSummary } from '../../../../web/src/features/proposals/lib/plot-summaries';
import { specOf, strainBridge, studioLine } from './fixtures';

const SPEC = specOf('strain');

describe('rejectionPlot', () => {
  const result = strainBridge();
  const plot = rejectionPlot(result, 'degenerated-mirror')!;

  test("the frequency grid is the engine's, once each and ascending, however the options' grids differ", () => {
    expect(plot.frequencyHz).toEqual(result.options[0].curves!.cmrrVsFrequency.map((p) => p.frequencyHz));
    // Hand-made grids: the first option on 10 Hz and 1 kHz, the second on 100 Hz and 1 kHz.
    const curve = (hz: number[]) => ({ ...result.options[0].curves!, cmrrVsFrequency: hz.map((frequencyHz) => ({ frequencyHz, singleEndedDb: 90, differentialWorstCaseDb: null })) });
    const merged = rejectionPlot({ ...result, options: [{ ...result.options[0], curves: curve([10, 1000]) }, { ...result.options[1], curves: curve([100, 1000]) }] })!;
    expect(merged.frequencyHz).toEqual([10, 100, 1000]);
    expect(merged.series.map((s) => s.valuesDb)).toEqual([
      [90, null, 90],
      [null, 90, 90],
    ]);
  });

  test('one series per solved option, aligned with the grid, then the selected mismatch curve', () => {
    expect(plot.series.map((s) => s.topology)).toEqual(result.options.map((o) => o.topology));
    expect(plot.data).toHaveLength(1 + 6 + 1);
    for (const column of plot.data) expect(column).toHaveLength(plot.frequencyHz.length);
    expect(plot.mismatch?.topology).toBe('degenerated-mirror');
  });

  test('target lines and the spec frequency come from the spec: required, required + margin, frequency', () => {
    expect(plot.requiredDb).toBe(SPEC.cmrr.minDb);
    expect(plot.requiredWithMarginDb).toBe(SPEC.cmrr.minDb + SPEC.cmrr.marginDb);
    expect(plot.specFrequencyHz).toBe(SPEC.cmrr.atFrequencyHz);
  });

  test('the marker at the spec frequency is the worst-corner figure of the table', () => {
    const cascode = plot.series.find((s) => s.topology === 'cascode')!;
    const option = result.options.find((o) => o.topology === 'cascode')!;
    expect(cascode.worstAtFrequencyDb).toBe(option.figures!.cmrrAtFrequencyDb);
    expect(cascode.valuesDb).toEqual(option.curves!.cmrrVsFrequency.map((p) => p.singleEndedDb));
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

  test('summary names the best and the least option with their worst-corner figures, and how many reach the target', () => {
    const byFigure = [...plot.series].sort((a, b) => b.worstAtFrequencyDb! - a.worstAtFrequencyDb!);
    const [best, least] = [byFigure[0], byFigure.at(-1)!];
    const reaching = plot.series.filter((s) => s.worstAtFrequencyDb! >= plot.requiredWithMarginDb).length;
    expect(rejectionSummary(plot)).toBe(
      `${best.name} keeps ${formatDb(best.worstAtFrequencyDb!)} at ${formatQuantity(SPEC.cmrr.atFrequencyHz, 'Hz')} (worst corner); ${least.name} the least, ${formatDb(least.worstAtFrequencyDb!)}. ` +
        `${reaching} of 6 options reach ${formatTargetDb(plot.requiredWithMarginDb)} (${formatTargetDb(SPEC.cmrr.minDb)} required + ${formatTargetDb(SPEC.cmrr.marginDb)} margin).`,
    );
  });

  test('summary on hand-made figures: 101.75 dB best, 39.3 dB least, 1 of 2 at 84 dB or more', () => {
    const two = { ...plot, requiredDb: 78, requiredWithMarginDb: 84, specFrequencyHz: 2500, series: [
      { ...plot.series[0], name: 'Resistor', worstAtFrequencyDb: 39.3 },
      { ...plot.series[1], name: 'Cascode mirror', worstAtFrequencyDb: 101.75 },
    ] };
    expect(rejectionSummary(two)).toBe('Cascode mirror keeps 101.8 dB at 2.5 kHz (worst corner); Resistor the least, 39.3 dB. 1 of 2 options reach 84 dB (78 dB required + 6 dB margin).');
  });
});

describe('histogramPlot', () => {
  const option = strainBridge().options.find((o) => o.topology === 'degenerated-mirror')!;
  const plot = histogramPlot(option)!;

  test('one bar per bin, contiguous, every sample counted once, the last bar open above', () => {
    const bins = option.monteCarlo!.histogram.counts.length;
    expect(plot.bars).toHaveLength(bins);
    plot.bars.slice(1).forEach((bar, i) => expect(bar.fromDb).toBe(plot.bars[i].toDb));
    expect(plot.bars.reduce((sum, b) => sum + b.count, 0)).toBe(plot.samples);
    expect(plot.bars.map((b) => b.andAbove)).toEqual([...Array(bins - 1).fill(false), true]);
  });

  test('stepped data: the edges, and the counts with the last repeated to close the last bar', () => {
    const [x, y] = plot.data;
    expect(x).toEqual(option.monteCarlo!.histogram.binEdgesDb);
    expect(y).toEqual([...option.monteCarlo!.histogram.counts, option.monteCarlo!.histogram.counts.at(-1)]);
  });

  test('the x range holds both the required line and every bar', () => {
    expect(plot.requiredDb).toBe(SPEC.cmrr.minDb);
    expect(plot.rangeDb[0]).toBeLessThan(SPEC.cmrr.minDb);
    expect(plot.rangeDb[1]).toBeGreaterThan(plot.bars.at(-1)!.toDb);
  });

  test('single-ended outputs have no Monte Carlo histogram', () => {
    expect(histogramPlot(studioLine().options[0])).toBeNull();
  });

  test('summary gives yield, requirement and percentiles', () => {
    const mc = option.monteCarlo!;
    expect(histogramSummary('Degenerated mirror', plot, SPEC.cmrr.minYieldPercent)).toBe(
      `Degenerated mirror: ${formatPercent(mc.yieldPercent)} of ${SPEC.monteCarlo.samples} Monte Carlo samples reach ${formatTargetDb(SPEC.cmrr.minDb)} ` +
        `(${formatPercent(SPEC.cmrr.minYieldPercent)} required); 1st percentile ${formatDb(mc.percentilesDb.p1)}, median ${formatDb(mc.percentilesDb.p50)}. The last bar also counts every sample above its range.`,
    );
  });
});

describe('temperaturePlot', () => {
  const option = strainBridge().options[0];
  const plot = temperaturePlot(option)!;

  test('the sweep over the spec range, gain as a magnitude', () => {
    expect(plot.temperatureC[0]).toBe(SPEC.temperatureC.min);
    expect(plot.temperatureC.at(-1)).toBe(SPEC.temperatureC.max);
    expect(plot.data).toEqual([plot.temperatureC, plot.tailCurrentA, plot.gain]);
    for (const g of plot.gain) expect(g).toBeGreaterThan(0);
  });

  test('the span is max − min over the middle value, per cent', () => {
    const a = plot.tailCurrentA;
    expect(plot.tailCurrentSpanPercent).toBeCloseTo(((Math.max(...a) - Math.min(...a)) / a[3]) * 100, 9);
    const [first, last] = [option.curves!.temperatureSweep[0], option.curves!.temperatureSweep.at(-1)!];
    expect(temperatureSummary('Cascode mirror', plot)).toMatch(
      new RegExp(`^Cascode mirror: from ${formatQuantity(SPEC.temperatureC.min, '°C')} to ${formatQuantity(SPEC.temperatureC.max, '°C')} the tail current goes from ${formatQuantity(first.tailCurrentA, 'A')} to ${formatQuantity(last.tailCurrentA, 'A')} `),
    );
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
