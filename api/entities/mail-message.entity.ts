import { EntitySchema } from 'typeorm';
import { idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

/** A message the built-in local mail server (api/mail/local-smtp.ts) received: the demo mailbox. */
export interface MailMessage {
  id: number;
  receivedAt: string;
  /** The envelope sender. */
  mailFrom: string | null;
  /** The envelope recipients (JSON text in the row: an array of addresses). */
  recipients: string[];
  subject: string;
  textBody: string;
  messageId: string | null;
  /** The outbox row it was sent from (X-Longtail-Outbox-Id), when it came from this app. */
  outboxId: number | null;
}

export const MailMessageEntity = new EntitySchema<MailMessage>({
  name: 'MailMessage',
  tableName: 'mail_message',
  columns: {
    id: idColumn,
    receivedAt: timestampColumn('received_at'),
    mailFrom: { ...shortTextColumn(254, true), name: 'mail_from' },
    recipients: jsonColumn(),
    subject: textColumn(),
    textBody: { ...textColumn(), name: 'text_body' },
    messageId: { ...shortTextColumn(300, true), name: 'message_id' },
    outboxId: { type: 'integer', name: 'outbox_id', nullable: true },
  },
});
