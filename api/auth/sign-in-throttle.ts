/**
 * Growing delays after failed sign-ins, instead of a lock: nobody can shut an account's owner out
 * by failing on purpose.
 *
 * - Per account and address (the pair): the first FREE_PAIR_FAILURES failures cost nothing; after
 *   each further one the pair waits 1 s, then 2 s, 4 s, … up to MAX_DELAY_MS before its next try.
 * - Per account (every address together): past FREE_ACCOUNT_FAILURES failures the account's wait
 *   grows the same way, but it applies only to addresses that have failed on this account
 *   themselves at least NEW_ADDRESS_GRACE times. An address new to the account (the owner at
 *   their own desk while someone floods from elsewhere) always gets its first tries, so the right
 *   password from a new address signs in.
 * - The per-address limit over all accounts stays in rate-limit.ts (express-rate-limit).
 *
 * A try during a wait is answered 429 with Retry-After and is not checked (it costs no scrypt and
 * teaches nothing). A record is forgotten WINDOW_MS after its last failure; a successful sign-in
 * clears its pair. Counted in memory per app instance, bounded to MAX_ENTRIES records per map.
 */
import { ipKeyGenerator } from 'express-rate-limit';

/** A record is forgotten this long after its last failure, ms. */
export const WINDOW_MS = 15 * 60 * 1000;
/** Failures one address may make on one account before delays start. */
export const FREE_PAIR_FAILURES = 5;
/** Failures an account may collect from every address together before its own delay starts. */
export const FREE_ACCOUNT_FAILURES = 10;
/** Failures an address must itself have made on an account before the account-wide delay applies to it. */
export const NEW_ADDRESS_GRACE = 3;
/** The first delay, ms; each further failure doubles it. */
const FIRST_DELAY_MS = 1000;
/** The longest delay, ms (10 minutes). */
export const MAX_DELAY_MS = 10 * 60 * 1000;
/** Records kept per map before the oldest are dropped (bounds the memory an address spray can take). */
const MAX_ENTRIES = 100_000;

interface Failures {
  count: number;
  lastMs: number;
}

/** The wait after `count` failures with `free` of them free, ms (0 while still free). */
export function delayAfter(count: number, free: number): number {
  if (count < free) return 0;
  return Math.min(MAX_DELAY_MS, FIRST_DELAY_MS * 2 ** Math.min(30, count - free));
}

/** The answer to "may this address try this account now?". */
export type ThrottleVerdict = { allowed: true } | { allowed: false; retryAfterMs: number; scope: 'pair' | 'account' };

/** The account key: the e-mail address as sign-in reads it (trimmed, lower case). */
export const accountKey = (email: unknown) => String(email ?? '').trim().toLowerCase();
/** The address key: express-rate-limit's (an IPv6 address counts by its /56 network). */
export const addressKey = (ip: string | undefined) => ipKeyGenerator(ip ?? '');

export class SignInThrottle {
  private readonly pairs = new Map<string, Failures>();
  private readonly accounts = new Map<string, Failures>();

  constructor(private readonly now: () => number = Date.now) {}

  private read(map: Map<string, Failures>, key: string): Failures | null {
    const entry = map.get(key);
    if (!entry) return null;
    if (this.now() - entry.lastMs > WINDOW_MS) {
      map.delete(key);
      return null;
    }
    return entry;
  }

  private bump(map: Map<string, Failures>, key: string): void {
    const entry = this.read(map, key);
    map.delete(key); // re-inserted last: the map's order is oldest-failure first
    map.set(key, { count: (entry?.count ?? 0) + 1, lastMs: this.now() });
    while (map.size > MAX_ENTRIES) map.delete(map.keys().next().value as string);
  }

  /** Whether `address` may try `account` now, and if not, for how long it must wait. */
  check(account: string, address: string): ThrottleVerdict {
    const now = this.now();
    const pair = this.read(this.pairs, `${account}\n${address}`);
    if (pair) {
      const waitMs = pair.lastMs + delayAfter(pair.count, FREE_PAIR_FAILURES) - now;
      if (waitMs > 0) return { allowed: false, retryAfterMs: waitMs, scope: 'pair' };
    }
    if ((pair?.count ?? 0) >= NEW_ADDRESS_GRACE) {
      const whole = this.read(this.accounts, account);
      if (whole) {
        const waitMs = whole.lastMs + delayAfter(whole.count, FREE_ACCOUNT_FAILURES) - now;
        if (waitMs > 0) return { allowed: false, retryAfterMs: waitMs, scope: 'account' };
      }
    }
    return { allowed: true };
  }

  /** A wrong password (or an unknown account: the same answer, the same count). */
  recordFailure(account: string, address: string): void {
    this.bump(this.pairs, `${account}\n${address}`);
    this.bump(this.accounts, account);
  }

  /** The right password: this address starts afresh on this account (the account-wide count stays). */
  recordSuccess(account: string, address: string): void {
    this.pairs.delete(`${account}\n${address}`);
  }
}
