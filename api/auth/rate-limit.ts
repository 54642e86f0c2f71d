/**
 * Sign-in limits. Per address over every account: at most PER_ADDRESS failed sign-ins (or
 * refused tries) in WINDOW_MS, then 429 until the window passes, so spraying one password over
 * many accounts goes nowhere; successful sign-ins do not count. Per account: growing delays, not
 * a lock (sign-in-throttle.ts). Counted in memory per app instance.
 */
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { RequestHandler } from 'express';
import { AppError } from '../errors';
import { accountKey, addressKey, type SignInThrottle } from './sign-in-throttle';

/** Window and limit per address (common practice for interactive sign-in). */
const WINDOW_MS = 15 * 60 * 1000;
export const PER_ADDRESS = 30;

const tooMany = { error: 'Too many sign-in attempts from your address: wait a few minutes and try again.', code: 'too-many-attempts', details: [] };

/** The per-address limit over all accounts. */
export function signInAddressLimit(): RequestHandler {
  return rateLimit({ windowMs: WINDOW_MS, limit: PER_ADDRESS, skipSuccessfulRequests: true, standardHeaders: 'draft-7', legacyHeaders: false, message: tooMany, keyGenerator: (req) => ipKeyGenerator(req.ip ?? '') });
}

/**
 * Refuses a try on `email` (read from the body by `emailOf`) while its account and address must
 * wait: 429 with Retry-After in seconds and the wait in the message.
 */
export function signInDelay(throttle: SignInThrottle, emailOf: (req: Parameters<RequestHandler>[0]) => unknown): RequestHandler {
  return (req, res, next) => {
    const verdict = throttle.check(accountKey(emailOf(req)), addressKey(req.ip));
    if (verdict.allowed) return next();
    const seconds = Math.max(1, Math.ceil(verdict.retryAfterMs / 1000));
    res.set('Retry-After', String(seconds));
    const whose = verdict.scope === 'pair' ? 'this account from your address' : 'this account';
    next(new AppError('too-many-attempts', 429, `Too many failed sign-ins for ${whose}: wait ${seconds} s and try again.`));
  };
}
