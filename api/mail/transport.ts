/**
 * The nodemailer SMTP transport: to the real server when one is configured, else to the
 * built-in local mail server on 127.0.0.1 (plain SMTP, no TLS: it never leaves the machine).
 */
import { createTransport, type Transporter } from 'nodemailer';
import type { SmtpSettings } from '../config';

/** Connection, greeting and socket timeouts, ms: a stuck server fails the attempt, and the worker retries later. */
const TIMEOUTS = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

export type MailTarget = SmtpSettings | { localPort: number };

export function createMailTransport(target: MailTarget): Transporter {
  if ('localPort' in target) return createTransport({ host: '127.0.0.1', port: target.localPort, secure: false, ignoreTLS: true, ...TIMEOUTS });
  if ('url' in target) return createTransport({ url: target.url, ...TIMEOUTS });
  return createTransport({
    host: target.host,
    port: target.port,
    secure: target.secure,
    ...(target.user !== undefined ? { auth: { user: target.user, pass: target.pass ?? '' } } : {}),
    ...TIMEOUTS,
  });
}

/** Where mail goes, for the start-up log (no credentials). */
export function describeMailTarget(target: MailTarget): string {
  if ('localPort' in target) return `the built-in local mail server on 127.0.0.1:${target.localPort}`;
  if ('url' in target) {
    const url = new URL(target.url);
    return `${url.protocol}//${url.host}`;
  }
  return `${target.secure ? 'smtps' : 'smtp'}://${target.host}:${target.port}`;
}
