import type { Proposal, User } from '../../../lib/api-types';

/** The reviewer's verdict on the latest decision: approve, or return with a comment. */
export function ReviewPanel(_props: { proposal: Proposal; user: User }) {
  return null;
}
