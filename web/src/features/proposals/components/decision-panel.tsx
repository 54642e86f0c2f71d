import type { Proposal, User } from '../../../lib/api-types';

/** The designer's decision: accept, choose another option, or override with own values (with a live what-if). */
export function DecisionPanel(_props: { proposal: Proposal; user: User }) {
  return null;
}
