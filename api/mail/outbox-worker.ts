/**
 * The outbox worker: sends the pending rows of `mail_outbox` through an SMTP transport, one
 * message per row, oldest due first. A failed attempt records the error, counts the attempt and
 * schedules the next one with exponential backoff; after `maxAttempts` the row is marked failed
 * (and stays in the table). A sent row is marked sent with the time. Each row is claimed before
 * sending by moving `next_attempt_at` forward (a lease), so two workers, or a tick and an explicit
 * run, never send the same row twice: on SQLite (one server) with a conditional update per row;
 * on PostgreSQL (several app instances) the due rows are selected `FOR UPDATE SKIP LOCKED` and
 * leased in one short transaction, so each instance takes rows no other instance holds.
 *
 * Rows held for a digest (api/mail/compose.ts: more than DIGEST_AFTER messages to one person within
 * DIGEST_WINDOW_MS) go out together: one e-mail per person listing each held message with its
 * project, spec and link, claimed, sent and marked as one. Headers carry only our words, numbers and the address:
 * names, titles and comments stay in the body.
 *
 * Started by server.ts (never by createApp); tests start it explicitly.
 */
import { In, LessThanOrEqual, type DataSource } from 'typeorm';
import type { SendMailOptions } from 'nodemailer';
import { isPostgres } from '../data-source';
import { MailOutboxEntity, type MailOutbox } from '../entities/mail-outbox.entity';
import { aboutOf, composeDigest, summaryOf } from './compose';
import { PASSWORD_RESET_MAIL } from '../entities/password-reset.entity';

/** What the worker needs of a nodemailer transport. */
export interface MailSender {
  sendMail(message: SendMailOptions): Promise<unknown>;
  close?(): void;
}

export interface OutboxWorkerOptions {
  dataSource: DataSource;
  transport: MailSender;
  /** The From header of every message. */
  from: string;
  /** Pause between runs, ms. */
  pollMs?: number;
  /** Rows per run. */
  batchSize?: number;
  /** Delay after the first failure, ms; doubled after each further one ... */
  retryBaseMs?: number;
  /** ... up to this, ms. */
  retryMaxMs?: number;
  /** Attempts before a row is marked failed. */
  maxAttempts?: number;
  /** How long a claimed row is left alone while its attempt runs, ms (longer than the transport's timeouts). */
  leaseMs?: number;
  log?: (message: string) => void;
}

export interface OutboxRun {
  sent: number;
  failed: number;
}

export interface OutboxWorker {
  /** Sends every row due now (one batch); a call during a run waits for that run and starts another. */
  runOnce(): Promise<OutboxRun>;
  /** Starts polling (runs at once, then every pollMs). */
  start(): void;
  /** Stops polling, waits for a run under way, closes the transport. */
  stop(): Promise<void>;
}

export const OUTBOX_DEFAULTS = {
  pollMs: 3000,
  batchSize: 20,
  retryBaseMs: 30_000,
  retryMaxMs: 60 * 60 * 1000,
  maxAttempts: 20,
  leaseMs: 5 * 60 * 1000,
} as const;

/** Delay before attempt `attempts + 1`, after `attempts` failures. */
export function retryDelayMs(attempts: number, baseMs: number, maxMs: number): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, attempts - 1));
}

const iso = (ms: number) => new Date(ms).toISOString();
/** The profile page beside a message's link (same site): where a person turns these e-mails off. */
const profileLinkOf = (link: string | null) => {
  try {
    return link ? `${new URL(link).origin}/profile` : '/profile';
  } catch {
    return '/profile';
  }
};
const errorText = (error: unknown) => (error instanceof Error ? error.message : String(error)).slice(0, 1000);

export function createOutboxWorker(options: OutboxWorkerOptions): OutboxWorker {
  const settings = { ...OUTBOX_DEFAULTS, ...Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) } as Required<OutboxWorkerOptions>;
  const { dataSource, transport, from } = options;
  const log = options.log ?? (() => {});
  const domain = /@([^>\s]+)/.exec(from)?.[1] ?? 'longtail.local';
  const repository = () => dataSource.getRepository(MailOutboxEntity);
  let running: Promise<OutboxRun> | null = null;
  let timer: NodeJS.Timeout | null = null;
  let stopped = false;

  /** Claims the row (if nobody else did; unless already leased) and sends it. */
  async function attempt(row: MailOutbox, leased: boolean): Promise<'sent' | 'failed' | 'skipped'> {
    if (!leased) {
      const claimed = await repository().update({ id: row.id, status: 'pending', nextAttemptAt: row.nextAttemptAt }, { nextAttemptAt: iso(Date.now() + settings.leaseMs) });
      if (!claimed.affected) return 'skipped';
    }
    try {
      await transport.sendMail({
        from,
        to: row.toAddress,
        subject: row.subject,
        text: row.body,
        // The same id on every attempt: a receiver can drop a repeat after an unclear failure.
        messageId: `<outbox-${row.id}.${Date.parse(row.createdAt)}@${domain}>`,
        headers: { 'X-Longtail-Outbox-Id': String(row.id) },
      });
    } catch (error) {
      const attempts = row.attempts + 1;
      const gaveUp = attempts >= settings.maxAttempts;
      await repository().update(
        { id: row.id },
        { attempts, lastError: errorText(error), status: gaveUp ? 'failed' : 'pending', nextAttemptAt: iso(Date.now() + retryDelayMs(attempts, settings.retryBaseMs, settings.retryMaxMs)) },
      );
      log(`Mail to ${row.toAddress} (outbox #${row.id}) not sent, attempt ${attempts}${gaveUp ? ', giving up' : ''}: ${errorText(error)}`);
      return 'failed';
    }
    // A sent reset message's link is not kept in the outbox (the person has it in their mail).
    const body = row.kind === PASSWORD_RESET_MAIL ? { body: '(one-time password link: removed once sent)' } : {};
    await repository().update({ id: row.id }, { status: 'sent', sentAt: iso(Date.now()), attempts: row.attempts + 1, lastError: null, ...body });
    return 'sent';
  }

  /** Claims the held rows (those nobody else took; all of them when already leased) and sends them as one digest. */
  async function attemptDigest(rows: MailOutbox[], leased: boolean): Promise<{ sent: number; failed: number }> {
    const mine: MailOutbox[] = [];
    for (const row of rows) {
      if (leased) mine.push(row);
      else if ((await repository().update({ id: row.id, status: 'pending', nextAttemptAt: row.nextAttemptAt }, { nextAttemptAt: iso(Date.now() + settings.leaseMs) })).affected) mine.push(row);
    }
    if (mine.length === 0) return { sent: 0, failed: 0 };
    const ids = mine.map((row) => row.id);
    const first = mine[0];
    // A digest of one held message is that message, as written ("1 workflow updates" would say less).
    const { subject, text } =
      mine.length === 1
        ? { subject: first.subject, text: first.body }
        : composeDigest(
            mine.map((row) => ({ subject: row.subject, summary: summaryOf(row.body), about: aboutOf(row.body), link: row.link })),
            first.toName,
            profileLinkOf(mine.find((row) => row.link)?.link ?? null),
          );
    const attempts = Math.max(...mine.map((row) => row.attempts)) + 1;
    try {
      await transport.sendMail({
        from,
        to: first.toAddress,
        subject,
        text,
        messageId: `<outbox-digest-${ids.join('-')}.${Date.parse(first.createdAt)}@${domain}>`,
        headers: { 'X-Longtail-Outbox-Id': String(first.id), 'X-Longtail-Digest-Of': ids.join(',') },
      });
    } catch (error) {
      const gaveUp = attempts >= settings.maxAttempts;
      await repository().update(
        { id: In(ids) },
        { attempts, lastError: errorText(error), status: gaveUp ? 'failed' : 'pending', nextAttemptAt: iso(Date.now() + retryDelayMs(attempts, settings.retryBaseMs, settings.retryMaxMs)) },
      );
      log(`Digest to ${first.toAddress} (outbox #${ids.join(', #')}) not sent, attempt ${attempts}${gaveUp ? ', giving up' : ''}: ${errorText(error)}`);
      return { sent: 0, failed: mine.length };
    }
    await repository().update({ id: In(ids) }, { status: 'sent', sentAt: iso(Date.now()), attempts, lastError: null });
    return { sent: mine.length, failed: 0 };
  }

  /**
   * PostgreSQL: the due rows no other transaction holds, locked, leased and committed at once;
   * rows another instance is leasing are skipped rather than waited for.
   */
  function leaseDueRows(): Promise<MailOutbox[]> {
    return dataSource.transaction(async (manager) => {
      const rows = await manager
        .getRepository(MailOutboxEntity)
        .createQueryBuilder('row')
        .where('row.status = :status', { status: 'pending' })
        .andWhere('row.nextAttemptAt <= :now', { now: iso(Date.now()) })
        .orderBy('row.nextAttemptAt', 'ASC')
        .addOrderBy('row.id', 'ASC')
        .limit(settings.batchSize)
        .setLock('pessimistic_write')
        .setOnLocked('skip_locked')
        .getMany();
      if (rows.length > 0) await manager.getRepository(MailOutboxEntity).update({ id: In(rows.map((r) => r.id)) }, { nextAttemptAt: iso(Date.now() + settings.leaseMs) });
      return rows;
    });
  }

  async function run(): Promise<OutboxRun> {
    const leased = isPostgres(dataSource);
    const due = leased
      ? await leaseDueRows()
      : await repository().find({
          where: { status: 'pending', nextAttemptAt: LessThanOrEqual(iso(Date.now())) },
          order: { nextAttemptAt: 'ASC', id: 'ASC' },
          take: settings.batchSize,
        });
    const counts: OutboxRun = { sent: 0, failed: 0 };
    // One unit per single message, one per person's held rows (their digest), oldest first.
    const units: MailOutbox[][] = [];
    const digests = new Map<string, MailOutbox[]>();
    for (const row of due) {
      if (!row.digest) units.push([row]);
      else {
        const key = row.userId === null ? `address:${row.toAddress}` : `user:${row.userId}`;
        if (!digests.has(key)) units.push(digests.set(key, []).get(key)!);
        digests.get(key)!.push(row);
      }
    }
    for (const [index, unit] of units.entries()) {
      if (stopped) {
        // Leased rows not tried: give them back at once rather than after the lease.
        if (leased) await repository().update({ id: In(units.slice(index).flat().map((r) => r.id)), status: 'pending' }, { nextAttemptAt: iso(Date.now()) }).catch(() => undefined);
        break;
      }
      if (unit[0].digest) {
        const outcome = await attemptDigest(unit, leased);
        counts.sent += outcome.sent;
        counts.failed += outcome.failed;
        continue;
      }
      const outcome = await attempt(unit[0], leased);
      if (outcome !== 'skipped') counts[outcome] += 1;
    }
    return counts;
  }

  function runOnce(): Promise<OutboxRun> {
    const next = (running ?? Promise.resolve()).catch(() => undefined).then(run);
    const current = next.finally(() => {
      if (running === current) running = null;
    });
    running = current;
    return current;
  }

  function schedule(delayMs: number): void {
    if (stopped) return;
    timer = setTimeout(() => {
      timer = null;
      runOnce()
        .catch((error: unknown) => log(`Outbox run failed: ${errorText(error)}`))
        .finally(() => schedule(settings.pollMs));
    }, delayMs);
    timer.unref();
  }

  return {
    runOnce,
    start() {
      stopped = false;
      if (!timer) schedule(0);
    },
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      timer = null;
      await running?.catch(() => undefined);
      transport.close?.();
    },
  };
}

/** Creates the worker and starts polling. */
export function startOutboxWorker(options: OutboxWorkerOptions): OutboxWorker {
  const worker = createOutboxWorker(options);
  worker.start();
  return worker;
}
