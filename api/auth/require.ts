/**
 * Access checks in one place: signed in (401), and the role's permission (403) from the shared
 * permission table. Project visibility (404 outside your projects) lives in the services.
 */
import type { RequestHandler } from 'express';
import type {} from 'passport';
import { may, type Action } from '../../shared/workflow/roles';
import type { User } from '../entities/user.entity';
import { AppError, forbidden } from '../errors';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // Passport's user is our account record.
    interface User {
      id: number;
      email: string;
      displayName: string;
      role: import('../../shared/workflow/roles').Role;
      notify: boolean;
      createdAt: string;
      /** Set when an administrator disabled the account (such a session is not restored). */
      disabledAt: string | null;
    }
  }
}

export const requireSignIn: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(new AppError('not-signed-in', 401, 'Sign in first.'));
  next();
};

/** Signed in, and the role may take `action`. */
export function requirePermission(action: Action): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(new AppError('not-signed-in', 401, 'Sign in first.'));
    if (!may(req.user.role, action)) return next(forbidden(`The ${req.user.role} role cannot do this (${action}).`));
    next();
  };
}

/** The signed-in user of a request (after requireSignIn). */
export function currentUser(req: { user?: Express.User }): Omit<User, 'passwordHash'> {
  if (!req.user) throw new AppError('not-signed-in', 401, 'Sign in first.');
  return req.user;
}
