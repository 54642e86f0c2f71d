/**
 * Which design the report is about: the latest decision's (accepted, chosen or the designer's own
 * values), or while undecided the recommendation, or with neither the top-ranked option. Pure.
 */
import type { Design } from '#shared/engine/types';
import type { Decision, OptionEvaluation, Proposal } from '#shared/api/proposals';
import { currentDesign } from '#shared/workflow/current-design';

export type SubjectBasis = 'decision' | 'recommendation' | 'top-ranked' | 'none';

export interface ReportSubject {
  basis: SubjectBasis;
  decision: Decision | null;
  topology: string | null;
  /** The checked option: the ranked one, or the server's evaluation of an override (null if none was kept). */
  option: OptionEvaluation | null;
  design: Design | null;
}

/** The proposal's current design (shared/workflow/current-design.ts); with none, the top-ranked option is shown for reference. */
export function reportSubject(proposal: Proposal): ReportSubject {
  const current = currentDesign(proposal.result, proposal.decisions);
  if (current) {
    const decision = current.decisionId === null ? null : (proposal.decisions.find((d) => d.id === current.decisionId) ?? null);
    return { basis: current.basis, decision, topology: current.topology, option: current.option, design: current.design };
  }
  const option = proposal.result.options[0] ?? null;
  if (!option) return { basis: 'none', decision: null, topology: null, option: null, design: null };
  return { basis: 'top-ranked', decision: null, topology: option.topology, option, design: option.design };
}

/** The ranked options other than the subject (an override's own values are not a ranked option, so every ranked option is "other" then). */
export function otherOptions(proposal: Proposal, subject: ReportSubject): OptionEvaluation[] {
  return proposal.result.options.filter((o) => o !== subject.option);
}
