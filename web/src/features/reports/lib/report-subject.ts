/**
 * Which design the report is about: the latest decision's (accepted, chosen or the designer's own
 * values), or while undecided the recommendation, or with neither the top-ranked option. Pure.
 */
import type { Design } from '../../../../../shared/engine/types';
import type { Decision, OptionEvaluation, Proposal } from '../../../lib/api-types';
import { decidedOption, latestDecision } from '../../proposals/components/decision/decided-option';

export type SubjectBasis = 'decision' | 'recommendation' | 'top-ranked' | 'none';

export interface ReportSubject {
  basis: SubjectBasis;
  decision: Decision | null;
  topology: string | null;
  /** The checked option: the ranked one, or the server's evaluation of an override (null if none was kept). */
  option: OptionEvaluation | null;
  design: Design | null;
}

export function reportSubject(proposal: Proposal): ReportSubject {
  const decision = latestDecision(proposal);
  if (decision) {
    const option = decidedOption(proposal, decision);
    return { basis: 'decision', decision, topology: decision.topology, option, design: decision.design };
  }
  const result = proposal.result;
  const recommended = result.recommended ? (result.options.find((o) => o.topology === result.recommended) ?? null) : null;
  const option = recommended ?? result.options[0] ?? null;
  if (!option) return { basis: 'none', decision: null, topology: null, option: null, design: null };
  return { basis: recommended ? 'recommendation' : 'top-ranked', decision: null, topology: option.topology, option, design: option.design };
}

/** The ranked options other than the subject (an override's own values are not a ranked option, so every ranked option is "other" then). */
export function otherOptions(proposal: Proposal, subject: ReportSubject): OptionEvaluation[] {
  return proposal.result.options.filter((o) => o !== subject.option);
}
