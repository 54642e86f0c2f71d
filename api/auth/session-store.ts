/**
 * express-session's store over the Session entity, in the app's own database (connect-typeorm
 * does not install beside TypeORM 1.x). Expired rows are pruned on a timer and never returned.
 */
import session from 'express-session';
import { LessThan, type DataSource, type EntityManager } from 'typeorm';
import { sqlParameter } from '../data-source';
import { SessionEntity } from '../entities/session.entity';

/** Session lifetime when the cookie has none, ms (one working day). */
const DEFAULT_MAX_AGE_MS = 12 * 60 * 60 * 1000;
/** A session's expiry is moved forward at most this often, ms: one write a minute, not one per request. */
const TOUCH_INTERVAL_MS = 60 * 1000;
/** How often expired sessions are deleted, ms. */
const PRUNE_INTERVAL_MS = 15 * 60 * 1000;

type Callback<T = void> = (error?: unknown, value?: T) => void;

/** The account a session is signed in as (passport keeps its id in the session data), or null. */
function signedInUser(data: session.SessionData): number | null {
  const user = (data as { passport?: { user?: unknown } }).passport?.user;
  return typeof user === 'number' && Number.isInteger(user) ? user : null;
}

/**
 * Ends sessions of one account (all, or all but `exceptSessionId`): the next request of each is
 * anonymous. Runs in the caller's transaction when given its manager.
 */
export async function endSessionsOf(manager: EntityManager, userId: number, exceptSessionId?: string): Promise<number> {
  const query = manager.createQueryBuilder().delete().from(SessionEntity).where('user_id = :userId', { userId });
  if (exceptSessionId) query.andWhere('id <> :keep', { keep: exceptSessionId });
  return (await query.execute()).affected ?? 0;
}

export class TypeormSessionStore extends session.Store {
  private readonly dataSource: DataSource;
  private readonly pruneTimer: NodeJS.Timeout | undefined;
  private readonly lastTouchMs = new Map<string, number>();

  /** `prune: false` for a second store over the same table (one timer is enough). */
  constructor(dataSource: DataSource, options: { prune?: boolean } = {}) {
    super();
    this.dataSource = dataSource;
    if (options.prune !== false) {
      this.pruneTimer = setInterval(() => void this.prune(), PRUNE_INTERVAL_MS);
      this.pruneTimer.unref();
    }
  }

  private get repository() {
    return this.dataSource.getRepository(SessionEntity);
  }

  private expiry(data: session.SessionData): number {
    const expires = data.cookie?.expires;
    return expires ? new Date(expires).getTime() : Date.now() + DEFAULT_MAX_AGE_MS;
  }

  /** Deletes expired sessions. */
  async prune(): Promise<void> {
    if (!this.dataSource.isInitialized) return;
    await this.repository.delete({ expiresAtMs: LessThan(Date.now()) });
    const staleMs = Date.now() - DEFAULT_MAX_AGE_MS;
    for (const [sid, at] of this.lastTouchMs) if (at < staleMs) this.lastTouchMs.delete(sid);
  }

  override get(sid: string, callback: Callback<session.SessionData | null>): void {
    // Read on every request: a plain statement, not a built query and a hydrated entity
    (this.dataSource.query(`SELECT data, expires_at_ms FROM "session" WHERE id = ${sqlParameter(this.dataSource, 1)}`, [sid]) as Promise<{ data: string; expires_at_ms: string | number }[]>)
      .then(([row]) => callback(undefined, row && Number(row.expires_at_ms) > Date.now() ? (JSON.parse(row.data) as session.SessionData) : null))
      .catch((error) => callback(error));
  }

  override set(sid: string, data: session.SessionData, callback?: Callback): void {
    // One statement (INSERT ... ON CONFLICT DO UPDATE), not a read then a write: two app
    // instances, or two requests of one browser, may save the same session at the same time.
    this.repository
      .upsert({ id: sid, expiresAtMs: this.expiry(data), data: JSON.stringify(data), userId: signedInUser(data) }, { conflictPaths: ['id'], skipUpdateIfNoValuesChanged: false })
      .then(() => callback?.())
      .catch((error) => callback?.(error));
  }

  override destroy(sid: string, callback?: Callback): void {
    this.lastTouchMs.delete(sid);
    this.repository
      .delete({ id: sid })
      .then(() => callback?.())
      .catch((error) => callback?.(error));
  }

  override touch(sid: string, data: session.SessionData, callback?: Callback): void {
    const now = Date.now();
    if (now - (this.lastTouchMs.get(sid) ?? 0) < TOUCH_INTERVAL_MS) {
      callback?.();
      return;
    }
    this.lastTouchMs.set(sid, now);
    this.repository
      .update({ id: sid }, { expiresAtMs: this.expiry(data) })
      .then(() => callback?.())
      .catch((error) => callback?.(error));
  }

  /** Stops the prune timer (tests, shutdown). */
  close(): void {
    clearInterval(this.pruneTimer);
  }
}
