/**
 * Accounts on the wire: /api/auth (sign-in, the signed-in person, own password and preferences)
 * and /api/users (administrators). Bodies are checked by the schemas in api/validation/bodies.ts,
 * which the compiler holds to these shapes.
 */
import type { NoticeKind } from '../workflow/notices';
import type { AccountRole, ProjectRoleOf } from '../workflow/roles';

/** An account as the API shows it (never its password hash). */
export interface User {
  id: number;
  email: string;
  displayName: string;
  /** The account's own role: administrator or member (what a member may do is per project). */
  role: AccountRole;
  /** E-mail notices about the workflow, the master switch (on unless the person turns it off). */
  notify: boolean;
  /** The kinds of notice turned off one by one (shared/workflow/notices.ts); the rest come while `notify` is on. */
  noticesOff: NoticeKind[];
  createdAt: string;
  /** When an administrator disabled the account (it cannot sign in), or null. */
  disabledAt: string | null;
}

/** The signed-in person (sign-in and GET /api/auth/me): the account and the role held in each project. */
export interface SessionUser extends User {
  projectRoles: ProjectRoleOf[];
}

/** POST /api/auth/login. */
export interface LoginInput {
  email: string;
  password: string;
}

/** POST /api/users (administrators). */
export interface NewUser {
  email: string;
  displayName: string;
  role: AccountRole;
  password: string;
}

/** PATCH /api/users/:id: rename, another account role, or disable / enable (at least one field). */
export interface UserChanges {
  displayName?: string;
  role?: AccountRole;
  disabled?: boolean;
}

/** POST /api/users/:id/password-reset answers when the mailed one-time link stops working. */
export interface PasswordResetIssued {
  expiresAt: string;
}

/** POST /api/auth/password: the signed-in person's own password change. */
export interface PasswordChangeInput {
  currentPassword: string;
  newPassword: string;
}

/** POST /api/auth/password-reset: a new password through a one-time link's token. */
export interface PasswordResetInput {
  token: string;
  newPassword: string;
}

/** PATCH /api/auth/me: the signed-in person's own preferences (at least one field; `noticesOff` replaces the whole list). */
export interface PreferencesInput {
  notify?: boolean;
  noticesOff?: NoticeKind[];
}

/** The answer of sign-in: the person and the session's CSRF token (the session rotates it). */
export interface SignedIn {
  user: SessionUser;
  csrfToken: string;
}

/** GET and PATCH /api/auth/me: the signed-in person. */
export interface Me {
  user: SessionUser;
}

/** POST /api/auth/password answers how many of the person's other sessions it ended. */
export interface PasswordChanged {
  endedSessions: number;
}

/** POST /api/auth/password-reset answers the account's e-mail (the page signs in with it). */
export interface PasswordResetDone {
  email: string;
}

/** POST /api/auth/tokens: the name of a new personal API token (what it is for). */
export interface ApiTokenInput {
  name: string;
}

/** A personal API token as its owner's list shows it: never the token, only its first characters. */
export interface ApiToken {
  id: number;
  name: string;
  /** The token's first characters (`ltk_` and 6 more). */
  start: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** The answer to POST /api/auth/tokens: the token itself, shown this once (only its SHA-256 is kept). */
export interface NewApiToken extends ApiToken {
  token: string;
}
