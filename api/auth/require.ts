/**
 * Access checks at the route: signed in (401), and the permission (403) from the shared table.
 * An administrator's action needs the administrator role; an action on a project's records needs
 * a role that may take it in at least one of the person's projects, and the service then checks
 * the role held in the project the record belongs to (`projectFor` with the action: 404 outside
 * your projects, 403 when your role there may not).
 */
import type { RequestHandler } from 'express';
import type {} from 'passport';
import { mayAnywhere, type Action } from '#shared/workflow/roles';
import type { User } from '../entities/user.entity';
import type { SessionUser } from '#shared/api/users';
import { AppError, forbidden } from '../errors';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // Passport's user is the signed-in person as the API shows it: the account and the role held
    // in each project (loaded with the session; a disabled account's session is not restored).
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

export const requireSignIn: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(new AppError('not-signed-in', 401, 'Sign in first.'));
  next();
};

/** Signed in, and a role the person holds may take `action` (the project's own role is checked by the service). */
export function requirePermission(action: Action): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(new AppError('not-signed-in', 401, 'Sign in first.'));
    if (!mayAnywhere(req.user.role, req.user.projectRoles ?? [], action)) return next(forbidden(`None of your roles can do this (${action}).`));
    next();
  };
}

/** The signed-in user of a request (after requireSignIn). */
export function currentUser(req: { user?: Express.User }): Omit<User, 'passwordHash'> {
  if (!req.user) throw new AppError('not-signed-in', 401, 'Sign in first.');
  return req.user;
}
