import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

/** pending: waiting for (another) attempt; sent: handed to the SMTP server; failed: attempts exhausted. */
export type OutboxStatus = 'pending' | 'sent' | 'failed';

/**
 * One e-mail to one person, written in the same transaction as the workflow change it tells
 * about, and sent later by the outbox worker (api/mail/outbox-worker.ts) with retries.
 */
export interface MailOutbox {
  id: number;
  createdAt: string;
  /** What happened: a notice kind (shared/workflow/notices.ts, e.g. "proposal.ready", "verification.ended"), or "account.password-reset". */
  kind: string;
  projectId: number | null;
  proposalId: number | null;
  /** The addressee's account (null once it no longer exists). */
  userId: number | null;
  toAddress: string;
  toName: string;
  subject: string;
  body: string;
  status: OutboxStatus;
  attempts: number;
  /** When the worker may try (again); also the lease while one attempt is under way. */
  nextAttemptAt: string;
  lastError: string | null;
  sentAt: string | null;
  /** Held to go out in one digest with the person's other held rows (more than a few within a minute). */
  digest: boolean;
  /** The page the message points to (the proposal), listed by a digest. */
  link: string | null;
}

export const MailOutboxEntity = new EntitySchema<MailOutbox>({
  name: 'MailOutbox',
  tableName: 'mail_outbox',
  columns: {
    id: idColumn,
    createdAt: timestampColumn('created_at'),
    kind: shortTextColumn(40),
    projectId: foreignKeyColumn('project_id', true),
    proposalId: foreignKeyColumn('proposal_id', true),
    userId: foreignKeyColumn('user_id', true),
    toAddress: { ...shortTextColumn(254), name: 'to_address' },
    toName: { ...shortTextColumn(120), name: 'to_name' },
    subject: shortTextColumn(300),
    body: textColumn(),
    status: shortTextColumn(20),
    attempts: { type: 'integer', default: 0 },
    nextAttemptAt: timestampColumn('next_attempt_at'),
    lastError: { ...textColumn(true), name: 'last_error' },
    sentAt: { ...timestampColumn('sent_at'), nullable: true },
    digest: { type: 'boolean', default: false },
    link: shortTextColumn(500, true),
  },
});
