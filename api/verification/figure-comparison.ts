/**
 * One simulated figure set beside the engine's stored prediction: the difference in the figure's
 * delta unit, the tolerance it is held to, and the verdict (shared/verification/types.ts).
 */
import type { FigureGroup, VerifiedFigure } from '#shared/verification/types';

/** A figure's name, unit and (in the nominal table) group. */
export interface FigureName {
  key: string;
  label: string;
  unit: string;
  group?: FigureGroup;
}

const named = ({ key, label, unit, group }: FigureName) => ({ key, label, unit, ...(group ? { group } : {}) });

const comparable = (predicted: number | null, simulated: number | null): [number, number] | null =>
  predicted !== null && simulated !== null && Number.isFinite(predicted) && Number.isFinite(simulated) ? [predicted, simulated] : null;

/** Held to a percentage of |simulated|. */
export function percentFigure(name: FigureName, predicted: number | null, simulated: number | null, tolerance: number): VerifiedFigure {
  const both = comparable(predicted, simulated);
  const delta = both && both[1] !== 0 ? ((both[0] - both[1]) / Math.abs(both[1])) * 100 : null;
  return { ...named(name), predicted, simulated, delta, deltaKind: 'percent', tolerance, agrees: delta === null ? null : Math.abs(delta) <= tolerance };
}

/** Held to an absolute difference in dB or volts. */
export function absoluteFigure(name: FigureName, predicted: number | null, simulated: number | null, tolerance: number, kind: 'db' | 'volts'): VerifiedFigure {
  const both = comparable(predicted, simulated);
  const delta = both ? both[0] - both[1] : null;
  return { ...named(name), predicted, simulated, delta, deltaKind: kind, tolerance, agrees: delta === null ? null : Math.abs(delta) <= tolerance };
}

/**
 * Held to a percentage of |simulated| or a floor in the figure's own unit, whichever is larger
 * (the contract's offset and drift tolerances): the difference and the tolerance worked out are
 * stated in the unit, and `basis` says how the tolerance was set.
 */
export function flooredFigure(name: FigureName, predicted: number | null, simulated: number | null, percent: number, floor: number, basis: string): VerifiedFigure {
  const both = comparable(predicted, simulated);
  const delta = both ? both[0] - both[1] : null;
  const tolerance = Math.max(((simulated !== null && Number.isFinite(simulated) ? Math.abs(simulated) : 0) * percent) / 100, floor);
  return { ...named(name), predicted, simulated, delta, deltaKind: 'absolute', tolerance, toleranceBasis: basis, agrees: delta === null ? null : Math.abs(delta) <= tolerance };
}

/** A figure listed without a verdict, and why (see `NotCompared`). */
export function notCompared(figure: VerifiedFigure, why: NonNullable<VerifiedFigure['notCompared']>): VerifiedFigure {
  return { ...figure, delta: null, agrees: null, notCompared: why };
}
