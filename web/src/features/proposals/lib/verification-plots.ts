/**
 * Data for the SPICE check's plots, prepared without the chart library so it can be tested:
 * the simulated rejection curve over the predicted one, and the simulated and closed-form Monte
 * Carlo histograms on their shared bins.
 */
import type { MonteCarloVerificationResult, OptionVerification } from '#shared/verification/types';
import type { Aligned } from '../../../lib/plot-axes';

export interface RejectionComparisonPlot {
  frequencyHz: number[];
  simulatedDb: number[];
  /** null past the end of the engine's curve. */
  predictedDb: (number | null)[];
  /** Largest |predicted − simulated| where both exist, dB, and where; null when no point has both. */
  largestGap: { db: number; atHz: number } | null;
  /** Frequencies with a simulated point only. */
  simulatedOnlyFromHz: number | null;
  data: Aligned;
}

/** An option's simulated rejection beside the engine's, sorted by frequency; null when it has no curve. */
export function rejectionComparisonPlot(option: Pick<OptionVerification, 'rejectionCurve'>): RejectionComparisonPlot | null {
  const points = option.rejectionCurve.filter((p) => p.frequencyHz > 0 && Number.isFinite(p.simulatedDb)).sort((a, b) => a.frequencyHz - b.frequencyHz);
  if (points.length === 0) return null;
  const frequencyHz = points.map((p) => p.frequencyHz);
  const simulatedDb = points.map((p) => p.simulatedDb);
  const predictedDb = points.map((p) => (p.predictedDb !== null && Number.isFinite(p.predictedDb) ? p.predictedDb : null));
  let largestGap: { db: number; atHz: number } | null = null;
  for (let i = 0; i < points.length; i++) {
    const predicted = predictedDb[i];
    if (predicted === null) continue;
    const gap = Math.abs(predicted - simulatedDb[i]);
    if (largestGap === null || gap > largestGap.db) largestGap = { db: gap, atHz: frequencyHz[i] };
  }
  const firstMissing = predictedDb.findIndex((v) => v === null);
  return {
    frequencyHz,
    simulatedDb,
    predictedDb,
    largestGap,
    simulatedOnlyFromHz: firstMissing === -1 ? null : frequencyHz[firstMissing],
    data: [frequencyHz, predictedDb, simulatedDb],
  };
}

export interface MonteCarloPlot {
  binEdgesDb: number[];
  simulatedCounts: number[];
  predictedCounts: number[];
  requiredDb: number;
  /** x range holding every bin and the required line, dB. */
  rangeDb: [number, number];
  /** The tallest bin of either histogram. */
  mostCount: number;
  /** Stepped data: bin left edges then the last right edge; each count list repeats its last bin to close it. */
  data: Aligned;
}

/** Both histograms of a SPICE Monte Carlo on their shared bins; null when there are no bins. */
export function monteCarloPlot(result: MonteCarloVerificationResult): MonteCarloPlot | null {
  const { binEdgesDb: edges, simulatedCounts, predictedCounts } = result.histogram;
  if (edges.length < 2) return null;
  const bins = edges.length - 1;
  const fit = (counts: number[]) => Array.from({ length: bins }, (_, i) => counts[i] ?? 0);
  const simulated = fit(simulatedCounts);
  const predicted = fit(predictedCounts);
  const lowDb = Math.min(edges[0], result.requiredDb);
  const highDb = Math.max(edges[bins], result.requiredDb);
  const padDb = (highDb - lowDb) * 0.04 || 1;
  return {
    binEdgesDb: [...edges],
    simulatedCounts: simulated,
    predictedCounts: predicted,
    requiredDb: result.requiredDb,
    rangeDb: [lowDb - padDb, highDb + padDb],
    mostCount: Math.max(1, ...simulated, ...predicted),
    data: [[...edges], [...simulated, simulated[bins - 1]], [...predicted, predicted[bins - 1]]],
  };
}
