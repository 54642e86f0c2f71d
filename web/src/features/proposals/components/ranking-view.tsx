import type { Proposal } from '../../../lib/api-types';

/** The ranked options: cautions and notice, the table, the selected option's detail, the plots. */
export function RankingView(_props: { proposal: Proposal }) {
  return null;
}
