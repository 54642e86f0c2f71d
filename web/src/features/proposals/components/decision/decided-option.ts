import type { Decision, OptionEvaluation, Proposal } from '#shared/api/proposals';

/** Plain words for a decision's kind. */
const DECISION_KIND_WORDS: Record<Decision['kind'], string> = {
  accept: 'accepted the recommendation',
  choose: 'chose another ranked option',
  override: 'used own values',
};

/** A decision's kind in words for this proposal: choosing an option is "another" only beside a recommendation. */
export function decisionKindWords(kind: Decision['kind'], proposal: Pick<Proposal, 'result'> | undefined): string {
  if (kind === 'choose' && proposal && !proposal.result.recommended) return 'chose a ranked option (none was recommended)';
  return DECISION_KIND_WORDS[kind];
}

export function latestDecision(proposal: Proposal): Decision | null {
  return proposal.decisions.at(-1) ?? null;
}

/**
 * The option a decision settled on, as checked: the ranked option for accept and choose, the
 * server's own evaluation for an override (null if the server kept none).
 */
export function decidedOption(proposal: Proposal, decision: Decision): OptionEvaluation | null {
  if (decision.kind === 'override') return decision.evaluation;
  return proposal.result.options.find((o) => o.topology === decision.topology) ?? null;
}

/** The ranked option of a topology, if the ranking has one. */
export function rankedOption(proposal: Proposal, topology: string): OptionEvaluation | null {
  return proposal.result.options.find((o) => o.topology === topology) ?? null;
}

/** How many blocking checks an option fails. */
export function blockingFailures(option: OptionEvaluation): number {
  return option.checks.filter((c) => !c.passed && c.severity === 'blocking').length;
}
