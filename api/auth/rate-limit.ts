/**
 * Failed sign-in attempts are limited per address and per account, so neither spraying one
 * password over many accounts nor hammering one account goes far; successful sign-ins do not
 * count. Counted in memory per app instance.
 */
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { RequestHandler } from 'express';

/** Window and limits (common practice for interactive sign-in). */
const WINDOW_MS = 15 * 60 * 1000;
const PER_ADDRESS = 30;
const PER_ACCOUNT = 10;

const tooMany = { error: 'Too many sign-in attempts: wait a few minutes and try again.', code: 'too-many-attempts', details: [] };

export function signInRateLimits(): RequestHandler[] {
  return [
    rateLimit({ windowMs: WINDOW_MS, limit: PER_ADDRESS, skipSuccessfulRequests: true, standardHeaders: 'draft-7', legacyHeaders: false, message: tooMany, keyGenerator: (req) => ipKeyGenerator(req.ip ?? '') }),
    rateLimit({
      windowMs: WINDOW_MS,
      limit: PER_ACCOUNT,
      skipSuccessfulRequests: true,
      standardHeaders: 'draft-7',
      legacyHeaders: false,
      message: tooMany,
      keyGenerator: (req) => `account:${String((req.body as { email?: unknown })?.email ?? '').trim().toLowerCase()}`,
    }),
  ];
}
