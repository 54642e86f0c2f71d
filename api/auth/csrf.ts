/**
 * Cross-site request forgery protection by a token bound to the session: the token is an HMAC
 * (SHA-256) of the session id with the session secret. `GET /api/auth/csrf` answers it (and
 * starts a short session for a visitor who has none, so the sign-in form has one to be bound
 * to); every state-changing request must echo it in `X-CSRF-Token`. Sign-in gives a new session
 * id, so a new token (in the sign-in answer, and from `GET /api/auth/csrf`); sign-out ends it.
 * A page on another site can make the browser send the session cookie but cannot read the token,
 * and cannot compute one without the secret. A request authenticated by a personal API token
 * (`Authorization: Bearer`, api/auth/bearer.ts) needs none.
 */
import { createHmac, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { AppError } from '../errors';
import { viaApiToken } from './bearer';

export const CSRF_HEADER = 'x-csrf-token';
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
/** How long a visitor's session (before sign-in) lasts, ms; signing in starts a full one. */
export const VISITOR_SESSION_MAX_AGE_MS = 60 * 60 * 1000;

declare module 'express-session' {
  interface SessionData {
    /** When GET /api/auth/csrf started this session for a visitor (ms since the epoch). */
    visitorSince?: number;
  }
}

/** The CSRF token of a session: base64url HMAC-SHA256 of its id with the session secret. */
export function csrfTokenFor(secret: string, sessionId: string): string {
  return createHmac('sha256', secret).update(`longtail-csrf\n${sessionId}`).digest('base64url');
}

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

export interface CsrfProtection {
  /** `GET /api/auth/csrf`: the session's token (a visitor without a session gets a short one). */
  issue: RequestHandler;
  /** Refuses a state-changing request whose header is not its session's token (403 csrf-failed). */
  require: RequestHandler;
  /** The token of the request's current session (after sign-in: the new one). */
  tokenOf(req: Request): string;
}

export function csrfProtection(secret: string): CsrfProtection {
  const tokenOf = (req: Request) => csrfTokenFor(secret, req.sessionID);
  return {
    tokenOf,
    issue: (req, res) => {
      // A session nobody has stored yet: mark it, so express-session saves it and sets the cookie.
      if (!req.user && req.session.visitorSince === undefined) {
        req.session.visitorSince = Date.now();
        req.session.cookie.maxAge = VISITOR_SESSION_MAX_AGE_MS;
      }
      res.set('Cache-Control', 'no-store');
      res.json({ token: tokenOf(req) });
    },
    require: (req, _res, next) => {
      // A personal API token carries its own proof (api/auth/bearer.ts): no cookie, so nothing to forge.
      if (SAFE_METHODS.has(req.method) || viaApiToken(req)) return next();
      const header = req.get(CSRF_HEADER);
      if (typeof header !== 'string' || !req.sessionID || !sameToken(header, tokenOf(req))) {
        return next(new AppError('csrf-failed', 403, 'Missing or wrong X-CSRF-Token header: fetch one from GET /api/auth/csrf (it changes when you sign in).'));
      }
      next();
    },
  };
}
