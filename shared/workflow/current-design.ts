/**
 * The one current design of a proposal: the recommendation until someone decides, then the
 * latest decision's design (the ranked option accepted or chosen, or the designer's own values).
 * Every place that names "the design" (the proposal page, the project list, e-mails, the export,
 * the review report, the netlist download, approval) asks this function. Pure: no I/O.
 */
import type { RecommendOption, RecommendResult } from '../engine/recommend';
import type { Design } from '../engine/types';
import { topologyName } from '../engine/topology-names';
import type { ProposalState } from './proposal-states';

export type DecisionKind = 'accept' | 'choose' | 'override';

/** What the function needs of a decision (the API's view, design and evaluation parsed). */
export interface DecisionLike {
  id: number;
  kind: DecisionKind;
  topology: string;
  design: Design;
  evaluation: RecommendOption | null;
  reason: string | null;
}

export interface CurrentDesign {
  /** `decision`: the latest decision settles it; `recommendation`: nobody has decided yet. */
  basis: 'decision' | 'recommendation';
  topology: string;
  /** The designer's own values (an override), not a ranked option. */
  ownValues: boolean;
  decisionId: number | null;
  decisionKind: DecisionKind | null;
  /** The values that are simulated, exported and approved (null when the engine could not size it). */
  design: Design | null;
  /** The design as checked: the ranked option, or the server's evaluation of the own values. */
  option: RecommendOption | null;
  /** The engine's recommendation, for showing beside the design when they differ. */
  recommended: string | null;
  /** The current design is not the recommendation as ranked (another option, or own values). */
  differsFromRecommendation: boolean;
  /** Why it differs, in the designer's words (null when it does not, or none was given). */
  reason: string | null;
}

/** The current design, or null when nobody decided and nothing is recommended (no option passes). */
export function currentDesign(result: RecommendResult, decisions: readonly DecisionLike[]): CurrentDesign | null {
  const decision = decisions.at(-1);
  const recommended = result.recommended ?? null;
  if (decision) {
    const ownValues = decision.kind === 'override';
    const option = ownValues ? decision.evaluation : (result.options.find((o) => o.topology === decision.topology) ?? null);
    const differs = ownValues || decision.topology !== recommended;
    return {
      basis: 'decision',
      topology: decision.topology,
      ownValues,
      decisionId: decision.id,
      decisionKind: decision.kind,
      design: option?.design ?? decision.design,
      option,
      recommended,
      differsFromRecommendation: differs,
      reason: differs ? decision.reason : null,
    };
  }
  if (!recommended) return null;
  const option = result.options.find((o) => o.topology === recommended) ?? null;
  return {
    basis: 'recommendation',
    topology: recommended,
    ownValues: false,
    decisionId: null,
    decisionKind: null,
    design: option?.design ?? null,
    option,
    recommended,
    differsFromRecommendation: false,
    reason: null,
  };
}

/** The design's name: "Cascode mirror", or "Cascode mirror, own values". */
export function currentDesignName(design: Pick<CurrentDesign, 'topology' | 'ownValues'>): string {
  return `${topologyName(design.topology)}${design.ownValues ? ', own values' : ''}`;
}

/** What the design is called in a heading, from its basis and the proposal's state. */
export function currentDesignRole(design: Pick<CurrentDesign, 'basis'>, status: ProposalState): string {
  if (design.basis === 'recommendation') return 'Recommended';
  if (status === 'approved') return 'Signed-off design';
  if (status === 'returned') return 'Decided, sent back for rework';
  return 'Decided design';
}

/** The word for the current side of a comparison ("simulated 10 kΩ, decided 12 kΩ"). */
export function currentDesignWord(design: Pick<CurrentDesign, 'basis'>): 'decided' | 'recommended' {
  return design.basis === 'decision' ? 'decided' : 'recommended';
}

/** One sentence on the recommendation beside the design, when they differ (null when they do not). */
export function besideRecommendation(design: CurrentDesign): string | null {
  if (!design.differsFromRecommendation) return null;
  const rec = design.recommended ? `The engine recommended the ${topologyName(design.recommended)}` : 'The engine recommended nothing (no option passes every blocking check)';
  const what = design.ownValues ? 'the designer decided own values' : `the designer chose the ${topologyName(design.topology)}`;
  return `${rec}; ${what}${design.reason ? ` because: ${design.reason}` : '.'}`;
}
