/**
 * Cross-site request forgery protection by double submit: `GET /api/auth/csrf` answers a random
 * token and sets it in a cookie; every state-changing request must echo it in `X-CSRF-Token`.
 * A page on another site can make the browser send the cookie but cannot read it to set the header.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler } from 'express';
import { AppError } from '../errors';

export const CSRF_COOKIE = 'longtail.csrf';
export const CSRF_HEADER = 'x-csrf-token';
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** `GET /api/auth/csrf`: a token in the body and the cookie. */
export const issueCsrfToken: RequestHandler = (req, res) => {
  const existing = req.cookies?.[CSRF_COOKIE];
  const token = typeof existing === 'string' && existing.length === 64 ? existing : randomBytes(32).toString('hex');
  res.cookie(CSRF_COOKIE, token, { httpOnly: true, sameSite: 'lax', secure: req.secure, path: '/' });
  res.json({ token });
};

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

/** Refuses a state-changing request whose header does not match its cookie (403). */
export const requireCsrfToken: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  const cookie = req.cookies?.[CSRF_COOKIE];
  const header = req.get(CSRF_HEADER);
  if (typeof cookie !== 'string' || typeof header !== 'string' || !sameToken(cookie, header)) {
    return next(new AppError('csrf-failed', 403, 'Missing or wrong X-CSRF-Token header: fetch one from GET /api/auth/csrf.'));
  }
  next();
};
