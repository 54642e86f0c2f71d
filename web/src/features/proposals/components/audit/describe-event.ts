/**
 * An event of one proposal's record in plain words: the one wording (shared/text/audit-words.ts),
 * given the decision or review the event recorded, found in the proposal itself.
 */
import type { AuditEvent } from '#shared/api/admin';
import type { Proposal } from '#shared/api/proposals';
import { describeEvent as eventWords, type EventWords } from '#shared/text/audit-words';

export type { EventWords };

export function describeEvent(event: AuditEvent, proposal: Proposal | undefined): EventWords {
  return eventWords(event, {
    decision: event.action === 'proposal.decided' ? proposal?.decisions.find((d) => d.id === event.entityId) : undefined,
    review: event.action === 'proposal.approved' || event.action === 'proposal.returned' ? proposal?.reviews.find((r) => r.id === event.entityId) : undefined,
    nothingRecommended: proposal ? !proposal.result.recommended : undefined,
  });
}
