/**
 * A project's activity: the audit events of its specs and proposals, grouped into kinds a reader
 * filters by. Pure data, read by the server's query and the app's filter.
 */

export const ACTIVITY_KINDS = ['specs', 'rankings', 'decisions', 'reviews', 'comments', 'spice', 'bench'] as const;
export type ActivityKind = (typeof ACTIVITY_KINDS)[number];

/** The audit actions of each kind (api/services write them with recordEvent). */
export const ACTIVITY_ACTIONS: Record<ActivityKind, readonly string[]> = {
  specs: ['spec.created', 'spec.version-created', 'specs.imported'],
  rankings: ['proposal.ranked', 'proposal.superseded', 'proposal.withdrawn'],
  decisions: ['proposal.decided'],
  reviews: ['proposal.approved', 'proposal.returned'],
  comments: ['proposal.commented', 'proposal.comment-replied', 'proposal.comment-resolved', 'proposal.comment-reopened'],
  spice: ['proposal.verification-requested', 'proposal.monte-carlo-requested', 'proposal.verification-withdrawn'],
  bench: ['measurement.uploaded'],
};

/** Each kind's name in the filter. */
export const ACTIVITY_KIND_WORDS: Record<ActivityKind, string> = {
  specs: 'Specs and versions',
  rankings: 'Rankings asked for and closed',
  decisions: 'Decisions',
  reviews: 'Sign-offs and send-backs',
  comments: 'Comments',
  spice: 'SPICE checks',
  bench: 'Bench measurements',
};

/** The kind an action belongs to (null: an event of the project outside these kinds, listed only unfiltered). */
export function activityKindOf(action: string): ActivityKind | null {
  return ACTIVITY_KINDS.find((kind) => ACTIVITY_ACTIONS[kind].includes(action)) ?? null;
}
