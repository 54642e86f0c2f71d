/**
 * Ranking and the recommendation: options passing every blocking check first, then by the
 * tail's impedance at the spec frequency from highest; the recommendation follows the policy.
 */
import { TOPOLOGIES, type SelectionPolicy, type TopologyId } from './types';

export interface Rankable {
  topology: TopologyId;
  passes: boolean;
  /** |Rout ∥ 1/(jωCt)| at the spec frequency, ohms (0 when the option could not be solved). */
  tailImpedanceAtFrequencyOhm: number;
  /** The rejection that matters for the spec's output, dB (−Infinity when unknown). */
  rejectionDb: number;
}

const simplicity = (t: TopologyId) => TOPOLOGIES.indexOf(t);

/** Sorts options: passing first, then higher tail impedance, then simpler topology. */
export function rankOptions<T extends Rankable>(options: T[]): T[] {
  return [...options].sort(
    (a, b) =>
      Number(b.passes) - Number(a.passes) ||
      b.tailImpedanceAtFrequencyOhm - a.tailImpedanceAtFrequencyOhm ||
      simplicity(a.topology) - simplicity(b.topology),
  );
}

/**
 * "simplest-sufficient": the simplest passing option (passing includes clearing the rejection
 * target with its margin); "highest-rejection": the passing option with the highest rejection.
 * Null when no option passes.
 */
export function recommendedTopology(options: Rankable[], policy: SelectionPolicy): TopologyId | null {
  const passing = options.filter((o) => o.passes);
  if (passing.length === 0) return null;
  if (policy === 'simplest-sufficient') {
    // Stryker disable next-line EqualityOperator: equivalent, equal simplicity means the same topology, so either is the answer
    return passing.reduce((a, b) => (simplicity(b.topology) < simplicity(a.topology) ? b : a)).topology;
  }
  return passing.reduce((a, b) => (b.rejectionDb > a.rejectionDb ? b : a)).topology;
}
