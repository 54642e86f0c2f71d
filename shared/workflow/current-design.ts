/**
 * The one current design of a proposal: the recommendation until someone decides, then the
 * latest decision's design (the ranked option accepted or chosen, or the designer's own values).
 * Every place that names "the design" (the proposal page, the project list, e-mails, the export,
 * the review report, the netlist download, approval) asks this function. Pure: no I/O.
 */
import type { RecommendOption, RecommendResult } from '../engine/recommend';
import type { Design } from '../engine/types';
import { topologyName } from '../engine/topologies';
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

/** Which design is current, without its values: what a list of proposals shows. */
export interface CurrentDesignSummary {
  /** `decision`: the latest decision settles it; `recommendation`: nobody has decided yet. */
  basis: 'decision' | 'recommendation';
  topology: string;
  /** The designer's own values (an override), not a ranked option. */
  ownValues: boolean;
  decisionId: number | null;
  decisionKind: DecisionKind | null;
  /** The engine's recommendation, for showing beside the design when they differ. */
  recommended: string | null;
  /** The current design is not the recommendation as ranked (another option, or own values). */
  differsFromRecommendation: boolean;
  /** Why it differs, in the designer's words (null when it does not, or none was given). */
  reason: string | null;
}

export interface CurrentDesign extends CurrentDesignSummary {
  /** The values that are simulated, exported and approved (null when the engine could not size it). */
  design: Design | null;
  /** The design as checked: the ranked option, or the server's evaluation of the own values. */
  option: RecommendOption | null;
}

/**
 * Which design is current, from the recommendation and the latest decision (if any); null when
 * nobody decided and nothing is recommended (no option passes every blocking check).
 */
export function currentDesignSummary(recommended: string | null, latest: Pick<DecisionLike, 'id' | 'kind' | 'topology' | 'reason'> | null | undefined): CurrentDesignSummary | null {
  if (latest) {
    const ownValues = latest.kind === 'override';
    const differs = ownValues || latest.topology !== recommended;
    return {
      basis: 'decision',
      topology: latest.topology,
      ownValues,
      decisionId: latest.id,
      decisionKind: latest.kind,
      recommended,
      differsFromRecommendation: differs,
      reason: differs ? latest.reason : null,
    };
  }
  if (!recommended) return null;
  return { basis: 'recommendation', topology: recommended, ownValues: false, decisionId: null, decisionKind: null, recommended, differsFromRecommendation: false, reason: null };
}

/** The current design with its values and checks, or null when there is none (see currentDesignSummary). */
export function currentDesign(result: RecommendResult, decisions: readonly DecisionLike[]): CurrentDesign | null {
  const decision = decisions.at(-1);
  const summary = currentDesignSummary(result.recommended ?? null, decision);
  if (!summary) return null;
  const option = summary.ownValues ? (decision?.evaluation ?? null) : (result.options.find((o) => o.topology === summary.topology) ?? null);
  return { ...summary, option, design: option?.design ?? decision?.design ?? null };
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
export function besideRecommendation(design: CurrentDesignSummary): string | null {
  if (!design.differsFromRecommendation) return null;
  const rec = design.recommended ? `The engine recommended the ${topologyName(design.recommended)}` : 'The engine recommended nothing (no option passes every blocking check)';
  const what = design.ownValues ? 'the designer decided own values' : `the designer chose the ${topologyName(design.topology)}`;
  return `${rec}; ${what}${design.reason ? ` because: ${design.reason}` : '.'}`;
}
