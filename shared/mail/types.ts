/** The admin mailbox as the API returns it (`GET /api/admin/mail`). */

/** One message the built-in local mail server received. */
export interface ReceivedMail {
  id: number;
  at: string;
  from: string | null;
  to: string[];
  subject: string;
  text: string;
  outboxId: number | null;
}

export interface Mailbox {
  items: ReceivedMail[];
  /** Messages stored in all (the list holds the newest 200). */
  total: number;
  /** Rows of the outbox by state: waiting to be sent, sent, given up. */
  outbox: { pending: number; sent: number; failed: number };
}
