/**
 * The built-in local mail server: an SMTP server on 127.0.0.1 (smtp-server) that accepts every
 * message, parses it (mailparser) and stores it in the `mail_message` table, where admins read
 * it (GET /api/admin/mail, the Mail page). Started by server.ts when no real SMTP server is
 * configured, and by the tests on a free port. Messages survive a restart (they are rows).
 */
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import type { DataSource } from 'typeorm';
import { MailMessageEntity } from '../entities/mail-message.entity';

/** Largest message accepted, bytes (notifications are a few kB). */
const MAX_MESSAGE_BYTES = 1024 * 1024;

export interface LocalSmtpOptions {
  dataSource: DataSource;
  /** 0 = any free port. */
  port: number;
  host?: string;
  log?: (message: string) => void;
}

export interface LocalSmtp {
  /** The port it listens on (the chosen one when asked for 0). */
  port: number;
  close(): Promise<void>;
}

export async function startLocalSmtp(options: LocalSmtpOptions): Promise<LocalSmtp> {
  const { dataSource, log = () => {} } = options;
  const server = new SMTPServer({
    name: 'longtail.local',
    banner: 'Longtail local mail server (messages are kept for the admin Mail page)',
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    disableReverseLookup: true,
    size: MAX_MESSAGE_BYTES,
    closeTimeout: 2000,
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          if (stream.sizeExceeded) throw Object.assign(new Error('Message too large'), { responseCode: 552 });
          const outboxHeader = parsed.headers.get('x-longtail-outbox-id');
          const outboxId = Number(typeof outboxHeader === 'string' ? outboxHeader : NaN);
          await dataSource.getRepository(MailMessageEntity).save({
            receivedAt: new Date().toISOString(),
            mailFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
            recipients: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            textBody: parsed.text ?? '',
            messageId: parsed.messageId?.slice(0, 300) ?? null,
            outboxId: Number.isInteger(outboxId) && outboxId > 0 ? outboxId : null,
          });
        })
        .then(
          () => callback(),
          (error: unknown) => {
            log(`Local mail server: message not stored: ${error instanceof Error ? error.message : String(error)}`);
            callback(error instanceof Error ? error : new Error(String(error)));
          },
        );
    },
  });
  server.on('error', (error) => log(`Local mail server: ${error.message}`));
  await new Promise<void>((resolve, reject) => {
    const onError = (error: Error) => reject(error);
    server.server.once('error', onError);
    server.listen(options.port, options.host ?? '127.0.0.1', () => {
      server.server.off('error', onError);
      resolve();
    });
  });
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
