/** Administration on the wire: the audit trail's events and the built-in mailbox (GET /api/admin/mail). */
export type { Mailbox, ReceivedMail } from '../mail/types';

/** One event of the append-only audit trail (GET /api/proposals/:id/audit): who, what, when, and the records before and after. */
export interface AuditEvent {
  id: number;
  at: string;
  actorId: number | null;
  /** e.g. "spec.version-created", "proposal.decided". */
  action: string;
  entityType: string;
  entityId: number;
  projectId: number | null;
  proposalId: number | null;
  beforeId: number | null;
  afterId: number | null;
  /** What a reader needs (new status, reason excerpt...). */
  details: Record<string, unknown>;
}
