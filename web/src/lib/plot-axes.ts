/**
 * Axis data for the charts, without the chart library so it can be tested: uPlot takes aligned
 * arrays (x first, then one array per series, null where a series has no point).
 */
export type Aligned = [number[], ...(number | null)[][]];

/**
 * Labels for the ticks of an axis: on a narrow chart the chart library leaves some ticks out
 * for room and hands them over as null, which get no label (never "−∞ Hz").
 */
export function tickLabels(splits: readonly (number | null)[], format: (value: number) => string): string[] {
  return splits.map((v) => (v === null || !Number.isFinite(v) ? '' : format(v)));
}

/** Frequencies of a log axis worth a label: exact decades within the range. */
export function decadeTicksHz(minHz: number, maxHz: number): number[] {
  const ticks: number[] = [];
  for (let d = Math.ceil(Math.log10(minHz) - 1e-9); d <= Math.floor(Math.log10(maxHz) + 1e-9); d++) ticks.push(Number(`1e${d}`));
  return ticks;
}

/**
 * Room an axis needs beside the plot (uPlot's axis `size`, in CSS pixels): the widest tick label
 * as `measure` gives it, plus the tick and the gap between tick and label, never under `min`.
 * A fixed size lets a long label ("10 nV/√Hz") run into the axis title.
 */
export function axisSizeForLabels(labels: readonly (string | null)[], measure: (text: string) => number, { tick, gap, min }: { tick: number; gap: number; min: number }): number {
  const widest = labels.reduce((most, label) => (label ? Math.max(most, measure(label)) : most), 0);
  return Math.max(min, Math.ceil(widest + tick + gap));
}
