/**
 * Data for the bench measurement plot, prepared without the chart library so it can be tested:
 * the measured curve over the decided design's predicted (and simulated) rejection on one
 * frequency grid (the union of theirs), null where a curve has no point; uPlot spans the gaps.
 */
import type { DbPoint, MeasurementReference } from '#shared/measurements/comparison';
import { measuredDbCurve } from '#shared/measurements/comparison';
import type { MeasurementView } from '#shared/measurements/types';
import type { Aligned } from '../../../lib/plot-axes';

export interface MeasurementPlot {
  kind: MeasurementView['kind'];
  frequencyHz: number[];
  measuredDb: (number | null)[];
  /** Rejection only: the engine's curve; null for a gain. */
  predictedDb: (number | null)[] | null;
  /** Rejection only, when a verification finished. */
  simulatedDb: (number | null)[] | null;
  /** Gain only: the predicted gain at low frequency, dB (a horizontal line). */
  predictedGainDb: number | null;
  data: Aligned;
}

function onGrid(grid: number[], curve: readonly DbPoint[]): (number | null)[] {
  const byFrequency = new Map(curve.map((p) => [p.frequencyHz, p.db]));
  return grid.map((f) => byFrequency.get(f) ?? null);
}

export function measurementPlot(measurement: Pick<MeasurementView, 'kind' | 'unit' | 'points'>, reference: MeasurementReference | null): MeasurementPlot {
  const measured = measuredDbCurve(measurement.points, measurement.unit);
  const rejection = measurement.kind === 'cmrr';
  const predicted = rejection && reference ? reference.predictedCurve : null;
  const simulated = rejection && reference?.simulatedCurve ? reference.simulatedCurve : null;
  const grid = [...new Set([...measured, ...(predicted ?? []), ...(simulated ?? [])].map((p) => p.frequencyHz))].sort((a, b) => a - b);
  const measuredDb = onGrid(grid, measured);
  const predictedDb = predicted ? onGrid(grid, predicted) : null;
  const simulatedDb = simulated ? onGrid(grid, simulated) : null;
  return {
    kind: measurement.kind,
    frequencyHz: grid,
    measuredDb,
    predictedDb,
    simulatedDb,
    predictedGainDb: rejection ? null : (reference?.predictedGainDb ?? null),
    data: [grid, ...(predictedDb ? [predictedDb] : []), ...(simulatedDb ? [simulatedDb] : []), measuredDb],
  };
}
