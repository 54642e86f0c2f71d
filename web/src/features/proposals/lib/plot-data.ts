/**
 * Data for the ranking's plots, prepared without the chart library so it can be tested: uPlot
 * takes aligned arrays (x first, then one array per series, null where a series has no point).
 */
import type { RecommendOption, RecommendResult } from '#shared/engine/recommend';
import type { TopologyId } from '#shared/engine/types';
import type { Aligned } from '../../../lib/plot-axes';
import { topologyName } from '../../../lib/topology-names';

export interface RejectionSeries {
  topology: TopologyId;
  name: string;
  passes: boolean;
  /** Nominal-condition curve, dB, aligned with the frequency grid. */
  valuesDb: (number | null)[];
  /** Worst-corner rejection at the spec frequency (the table's figure), dB. */
  worstAtFrequencyDb: number | null;
  /** Line width and dash in place of the selection's and the topology's (a side-by-side comparison draws two sides apart). */
  width?: number;
  dash?: number[];
}

export interface RejectionPlot {
  frequencyHz: number[];
  series: RejectionSeries[];
  /** The selected option's mismatch-limited worst case (differential outputs), or null. */
  mismatch: { topology: TopologyId; name: string; valuesDb: (number | null)[] } | null;
  requiredDb: number;
  requiredWithMarginDb: number;
  specFrequencyHz: number;
  data: Aligned;
}

/** Rejection against frequency for every solved option on one log-spaced grid (the engine's). */
export function rejectionPlot(result: RecommendResult, selected?: TopologyId): RejectionPlot | null {
  const solved = result.options.filter((o) => o.curves && o.figures);
  if (solved.length === 0) return null;
  const grid = [...new Set(solved.flatMap((o) => o.curves!.cmrrVsFrequency.map((p) => p.frequencyHz)))].sort((a, b) => a - b);
  const at = (o: RecommendOption, pick: (p: { singleEndedDb: number; differentialWorstCaseDb: number | null }) => number | null) => {
    const byFrequency = new Map(o.curves!.cmrrVsFrequency.map((p) => [p.frequencyHz, pick(p)]));
    return grid.map((f) => byFrequency.get(f) ?? null);
  };
  const series = solved.map((o) => ({
    topology: o.topology,
    name: topologyName(o.topology),
    passes: o.passes,
    valuesDb: at(o, (p) => p.singleEndedDb),
    worstAtFrequencyDb: o.figures!.cmrrAtFrequencyDb,
  }));
  const facts = solved[0].figures!;
  const chosen = solved.find((o) => o.topology === selected);
  const mismatch =
    chosen && facts.isDifferentialOutput
      ? { topology: chosen.topology, name: topologyName(chosen.topology), valuesDb: at(chosen, (p) => p.differentialWorstCaseDb) }
      : null;
  const data: Aligned = [grid, ...series.map((s) => s.valuesDb), ...(mismatch ? [mismatch.valuesDb] : [])];
  return {
    frequencyHz: grid,
    series,
    mismatch,
    requiredDb: facts.cmrrRequiredDb,
    requiredWithMarginDb: facts.cmrrRequiredDb + facts.cmrrMarginRequiredDb,
    specFrequencyHz: facts.cmrrFrequencyHz,
    data,
  };
}

export interface HistogramBar {
  fromDb: number;
  toDb: number;
  count: number;
  /** The engine's last bin also holds every sample above it (from its 99th percentile up). */
  andAbove: boolean;
}

export interface HistogramPlot {
  bars: HistogramBar[];
  samples: number;
  requiredDb: number;
  yieldPercent: number;
  percentilesDb: { p1: number; p5: number; p50: number; p95: number };
  /** x range that holds both the bars and the required line, dB. */
  rangeDb: [number, number];
  /** Stepped data: bin left edges then the last right edge; counts repeat the last bin to close it. */
  data: Aligned;
}

/** The Monte Carlo histogram of one option as bars, with the required rejection; null when single-ended. */
export function histogramPlot(option: RecommendOption): HistogramPlot | null {
  const mc = option.monteCarlo;
  if (!mc) return null;
  const { binEdgesDb: edges, counts } = mc.histogram;
  const bars = counts.map((count, i) => ({ fromDb: edges[i], toDb: edges[i + 1], count, andAbove: i === counts.length - 1 }));
  const lowDb = Math.min(edges[0], mc.requiredDb);
  const highDb = Math.max(edges[edges.length - 1], mc.requiredDb);
  const padDb = (highDb - lowDb) * 0.04;
  return {
    bars,
    samples: mc.samples,
    requiredDb: mc.requiredDb,
    yieldPercent: mc.yieldPercent,
    percentilesDb: mc.percentilesDb,
    rangeDb: [lowDb - padDb, highDb + padDb],
    data: [[...edges], [...counts, counts[counts.length - 1] ?? 0]],
  };
}

export interface TemperaturePlot {
  temperatureC: number[];
  tailCurrentA: number[];
  gain: number[];
  /** Tail-current change across the sweep, per cent of the value at the middle of the range. */
  tailCurrentSpanPercent: number;
  data: Aligned;
}

/** Tail current and gain of one option over the spec's temperature range; null when unsolved. */
export function temperaturePlot(option: RecommendOption): TemperaturePlot | null {
  const sweep = option.curves?.temperatureSweep ?? [];
  if (sweep.length === 0) return null;
  const temperatureC = sweep.map((p) => p.temperatureC);
  const tailCurrentA = sweep.map((p) => p.tailCurrentA);
  const gain = sweep.map((p) => Math.abs(p.gain));
  const midA = tailCurrentA[Math.floor(tailCurrentA.length / 2)];
  const spanPercent = ((Math.max(...tailCurrentA) - Math.min(...tailCurrentA)) / midA) * 100;
  return { temperatureC, tailCurrentA, gain, tailCurrentSpanPercent: spanPercent, data: [temperatureC, tailCurrentA, gain] };
}
