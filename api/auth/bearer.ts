/**
 * Bearer authentication by a personal API token (`Authorization: Bearer ltk_…`): the request acts
 * as the token's owner, with the owner's account and project roles as a session would load them,
 * and its use is recorded (api/services/api-tokens.service.ts). A request so authenticated needs
 * no CSRF token: a page on another site cannot make a browser send this header (no CORS is
 * allowed), and no cookie is involved. A request with a bad token is refused (401), never served
 * as the session's person instead. Managing tokens needs a session: a token cannot make more.
 */
import type { Request, RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import { AppError } from '../errors';
import { authenticateApiToken } from '../services/api-tokens.service';

const BY_TOKEN = new WeakSet<Request>();

/** Whether the request was authenticated by an API token (not a session cookie). */
export const viaApiToken = (req: Request): boolean => BY_TOKEN.has(req);

/** Longest path kept in a use's audit event. */
const MAX_RECORDED_PATH = 300;

export function bearerAuthentication(dataSource: DataSource): RequestHandler {
  return (req, _res, next) => {
    const header = req.get('authorization');
    if (header === undefined) return next();
    const match = /^Bearer +(\S+) *$/i.exec(header);
    if (!match) return next(new AppError('token-invalid', 401, 'The Authorization header must be "Bearer " and a personal API token.'));
    const path = req.originalUrl.split('?')[0].slice(0, MAX_RECORDED_PATH);
    authenticateApiToken(dataSource, match[1], { method: req.method, path }).then(({ user }) => {
      req.user = user;
      BY_TOKEN.add(req);
      next();
    }, next);
  };
}

/** Refuses a request authenticated by an API token: the action needs the person's signed-in session. */
export const requireSession: RequestHandler = (req, _res, next) => {
  if (viaApiToken(req)) return next(new AppError('session-required', 403, 'Sign in on the web app for this: an API token cannot manage API tokens.'));
  next();
};
