/** The proposal's audit trail, oldest first, with actors and what changed. */
export function AuditTimeline(_props: { proposalId: number }) {
  return null;
}
