/**
 * Where the decision form starts: a fresh ranking starts from the recommendation; a returned
 * proposal starts from the decision the reviewer sent back, so the designer revises rather
 * than retypes.
 */
import type { Design, TopologyId } from '#shared/engine/types';
import type { Decision, OptionEvaluation, Proposal } from '#shared/api/proposals';
import { latestDecision } from './decided-option';
import { draftFromDesign, type OverrideDraft } from './override-draft';

export type DecisionKind = Decision['kind'];

export interface DecisionStart {
  kind: DecisionKind;
  chosen: TopologyId | '';
  draft: OverrideDraft | null;
}

/** Ranked options other than the recommendation, with a sized design, in rank order. */
export function choosableOptions(proposal: Proposal): OptionEvaluation[] {
  return proposal.result.options.filter((o) => o.topology !== proposal.result.recommended);
}

/** The design to start an override from: the preferred topology's, else the recommendation's, else the best ranked with a design. */
export function startingDesign(proposal: Proposal, prefer?: string): Design | null {
  const options = proposal.result.options;
  const pick = (topology: string | null | undefined) => options.find((o) => o.topology === topology && o.design)?.design ?? null;
  return pick(prefer) ?? pick(proposal.result.recommended) ?? options.find((o) => o.design)?.design ?? null;
}

export function decisionStart(proposal: Proposal): DecisionStart {
  const previous = proposal.status === 'returned' ? latestDecision(proposal) : null;
  const firstChoosable = choosableOptions(proposal).find((o) => o.design)?.topology ?? '';
  if (previous?.kind === 'override') return { kind: 'override', chosen: firstChoosable, draft: draftFromDesign(previous.design) };
  if (previous?.kind === 'choose') return { kind: 'choose', chosen: previous.topology as TopologyId, draft: null };
  const kind: DecisionKind = proposal.result.recommended ? 'accept' : 'choose';
  return { kind, chosen: firstChoosable, draft: null };
}
