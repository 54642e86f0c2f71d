/** One or two sentences per plot, for the caption and for screen readers. */
import { formatQuantity } from '#shared/units/format-quantity';
import { formatDb, formatPercent, formatTargetDb } from '#shared/units/figures';
import type { HistogramPlot, RejectionPlot, TemperaturePlot } from './plot-data';

/** "Cascode mirror keeps 101.8 dB at 2.5 kHz (worst corner); Resistor 62.1 dB. 4 of 6 options reach 84 dB (78 dB + 6 dB margin)." */
export function rejectionSummary(plot: RejectionPlot): string {
  const ranked = plot.series.filter((s) => s.worstAtFrequencyDb !== null).sort((a, b) => b.worstAtFrequencyDb! - a.worstAtFrequencyDb!);
  if (ranked.length === 0) return 'No option could be solved, so there is no curve to show.';
  const f = formatQuantity(plot.specFrequencyHz, 'Hz');
  const best = ranked[0];
  const worst = ranked[ranked.length - 1];
  const reaching = ranked.filter((s) => s.worstAtFrequencyDb! >= plot.requiredWithMarginDb).length;
  const margin = formatTargetDb(plot.requiredWithMarginDb - plot.requiredDb);
  const lowest = ranked.length > 1 ? `; ${worst.name} the least, ${formatDb(worst.worstAtFrequencyDb!)}` : '';
  return (
    `${best.name} keeps ${formatDb(best.worstAtFrequencyDb!)} at ${f} (worst corner)${lowest}. ` +
    `${reaching} of ${ranked.length} options reach ${formatTargetDb(plot.requiredWithMarginDb)} (${formatTargetDb(plot.requiredDb)} required + ${margin} margin).`
  );
}

/** "100 % of 2000 samples reach 78 dB (99 % required); 1st percentile 129.3 dB, median 141.4 dB." */
export function histogramSummary(name: string, plot: HistogramPlot, requiredYieldPercent: number): string {
  return (
    `${name}: ${formatPercent(plot.yieldPercent)} of ${plot.samples} Monte Carlo samples reach ${formatTargetDb(plot.requiredDb)} ` +
    `(${formatPercent(requiredYieldPercent)} required); 1st percentile ${formatDb(plot.percentilesDb.p1)}, median ${formatDb(plot.percentilesDb.p50)}. The last bar also counts every sample above its range.`
  );
}

/** "From −20 °C to 65 °C the tail current goes from 943 µA to 964 µA (2.2 % span) and the gain from 49.2 to 37.9 V/V." */
export function temperatureSummary(name: string, plot: TemperaturePlot): string {
  const last = plot.temperatureC.length - 1;
  const t = (i: number) => formatQuantity(plot.temperatureC[i], '°C');
  const a = (i: number) => formatQuantity(plot.tailCurrentA[i], 'A');
  const g = (i: number) => formatQuantity(plot.gain[i], 'V/V');
  return (
    `${name}: from ${t(0)} to ${t(last)} the tail current goes from ${a(0)} to ${a(last)} (${formatPercent(plot.tailCurrentSpanPercent)} span) ` +
    `and the gain from ${g(0)} to ${g(last)}.`
  );
}
