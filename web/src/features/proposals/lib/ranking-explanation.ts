/**
 * One sentence under the ranking table when its first row is not the recommendation: the table
 * orders by one measure, the recommendation follows the spec's policy. Pure.
 */
import type { RecommendResult } from '../../../../../shared/engine/recommend';
import type { SelectionPolicy } from '../../../../../shared/engine/types';
import { topologyName } from '../../../lib/topology-names';

/** What each policy picks, in our words. */
const POLICY_WORDS: Record<SelectionPolicy, { name: string; picks: string }> = {
  'simplest-sufficient': { name: 'simplest sufficient', picks: 'the simplest option that passes every blocking check' },
  'highest-rejection': { name: 'highest rejection', picks: 'the passing option with the most rejection for the spec’s output' },
};

/** Null when the first ranked option is the recommendation (or nothing is recommended). */
export function rankingExplanation(result: Pick<RecommendResult, 'policy' | 'recommended' | 'options'>): string | null {
  const first = result.options[0]?.topology;
  if (!result.recommended || !first || first === result.recommended) return null;
  const policy = POLICY_WORDS[result.policy];
  const place = result.options.findIndex((o) => o.topology === result.recommended) + 1;
  return `Ranked by tail impedance at the spec’s frequency, passing options first, so ${topologyName(first)} heads the table; recommended by the policy “${policy.name}”, which picks ${policy.picks}: ${topologyName(result.recommended)} (row ${place}).`;
}
