/**
 * One sentence under the ranking table when its first row is not the recommendation: the table
 * orders by one measure, the recommendation follows the spec's policy. Pure.
 */
import type { RecommendResult } from '#shared/engine/recommend';
import type { SelectionPolicy } from '#shared/engine/types';
import { topologyName } from '../../../lib/topology-names';
import { checkTitle } from '../../../lib/checks';

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

/**
 * When no option passes: which blocking checks hold the options back (so the reader sees at once
 * which requirements to look at, not a broken page), most often short first, and the ways on:
 * revise the spec, or decide anyway with a reason. Null when something passes or nothing was solved.
 */
export function noPassingExplanation(result: Pick<RecommendResult, 'recommended' | 'options'>): string | null {
  if (result.recommended) return null;
  const solved = result.options.filter((option) => option.figures);
  if (solved.length === 0) return null;
  const shortCount = new Map<string, number>();
  const titles = new Map<string, string>();
  for (const option of solved) {
    const short = option.checks.filter((check) => check.severity === 'blocking' && !check.passed);
    for (const check of short) titles.set(check.rule, checkTitle(check));
    for (const rule of new Set(short.map((check) => check.rule))) shortCount.set(rule, (shortCount.get(rule) ?? 0) + 1);
  }
  const titleOf = (rule: string) => titles.get(rule) as string;
  const ranked = [...shortCount.entries()].sort((a, b) => b[1] - a[1]);
  const ways = 'To go on, revise that requirement in the spec, or decide on an option anyway and say why (a sign-off of a design short on a blocking check needs a comment too).';
  const common = ranked.filter(([, count]) => count === solved.length).map(([rule]) => `“${titleOf(rule)}”`);
  if (common.length > 0) {
    const listed = common.length === 1 ? common[0] : `${common.slice(0, -1).join(', ')} and ${common.at(-1)}`;
    return `Every option falls short on ${common.length === 1 ? 'the same blocking check' : 'the same blocking checks'}: ${listed}; each option’s checks say by how much and why. ${common.length === 1 ? ways : ways.replace('that requirement', 'those requirements')}`;
  }
  const listed = ranked.slice(0, 3).map(([rule, count]) => `“${titleOf(rule)}” (${count} of ${solved.length})`);
  return `No one blocking check holds every option back; most often short: ${listed.join(', ')}. Each option’s checks say by how much and why. ${ways.replace('that requirement', 'those requirements')}`;
}
