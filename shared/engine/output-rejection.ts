/**
 * The rejection that matters for the spec's output, and the target it is held to (the
 * rejection target's rule, rules/cmrr-target.json): for a single-ended output, the tail-limited
 * CMRR at the spec frequency (worst corner), for a differential output the mismatch-limited
 * worst case, each against the required figure plus its margin.
 * The one reading of "the option's rejection" for the ranking, the page, the report and the
 * CSV files, so none of them can set one figure against another's target. Pure.
 */
import type { OptionFacts } from './types';

export type RejectionKind = 'single-ended' | 'differential';

export interface OutputRejection {
  kind: RejectionKind;
  /** dB; null when the figure is missing (an unsolved option). */
  valueDb: number | null;
  /** The target the figure is held to, dB. */
  requiredDb: number;
}

/** Words for each kind, as the ranking, the report and the CSV files write them. */
export const REJECTION_KIND_WORDS: Record<RejectionKind, string> = {
  'single-ended': 'single-ended, worst corner',
  differential: 'differential, mismatch worst case',
};

type RejectionFacts = Pick<OptionFacts, 'isDifferentialOutput' | 'cmrrAtFrequencyDb' | 'cmrrDifferentialWorstCaseDb' | 'cmrrRequiredDb' | 'cmrrMarginRequiredDb'>;

export function outputRejection(facts: RejectionFacts): OutputRejection {
  if (facts.isDifferentialOutput) {
    return { kind: 'differential', valueDb: facts.cmrrDifferentialWorstCaseDb, requiredDb: facts.cmrrRequiredDb + facts.cmrrMarginRequiredDb };
  }
  return { kind: 'single-ended', valueDb: facts.cmrrAtFrequencyDb, requiredDb: facts.cmrrRequiredDb + facts.cmrrMarginRequiredDb };
}
