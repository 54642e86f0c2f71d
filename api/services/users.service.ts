/**
 * Accounts: created and changed by admins, looked up for sign-in; a person's own password
 * change; an administrator's one-time reset link (through the mail outbox); disabling and
 * enabling. Changing, resetting or disabling ends the person's other sessions in the same
 * transaction as the change and its audit event.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { formatDateTime } from '#shared/text/dates';
import type { NewUser, PasswordChanged, PasswordChangeInput, PasswordResetDone, PasswordResetInput, PasswordResetIssued, PreferencesInput, SessionUser, User as PublicUser, UserChanges } from '#shared/api/users';
import { knownNoticesOff, type NoticeKind } from '#shared/workflow/notices';
import type { ProjectRoleOf } from '#shared/workflow/roles';
import { hashPassword, verifyPassword } from '../auth/password';
import { sqlParameter } from '../data-source';
import { checkPassword } from '../auth/password-policy';
import { endSessionsOf } from '../auth/session-store';
import { MailOutboxEntity } from '../entities/mail-outbox.entity';
import { PASSWORD_RESET_MAIL, PasswordResetEntity } from '../entities/password-reset.entity';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { UserEntity, type User } from '../entities/user.entity';
import { AppError, invalid, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { notificationSettings } from './notifications.service';
import { indexRecords } from './search-index.service';

/** An account as the API shows it (shared/api/users.ts): never its password hash. */
export type { PublicUser, SessionUser };

export function publicUser(user: User | PublicUser): PublicUser {
  const { id, email, displayName, role, notify, createdAt } = user;
  return { id, email, displayName, role, notify, noticesOff: knownNoticesOff(user.noticesOff), createdAt, disabledAt: user.disabledAt ?? null };
}

export async function listUsers(dataSource: DataSource): Promise<PublicUser[]> {
  return (await dataSource.getRepository(UserEntity).find({ order: { id: 'ASC' } })).map(publicUser);
}

export async function findUserById(dataSource: DataSource, id: number): Promise<PublicUser | null> {
  const user = await dataSource.getRepository(UserEntity).findOneBy({ id });
  return user ? publicUser(user) : null;
}

/** The signed-in person: the account and the role held in each project (read on every request, so a change applies at once). */
export async function sessionUser(dataSource: DataSource, user: PublicUser): Promise<SessionUser> {
  const memberships = await dataSource.getRepository(ProjectMemberEntity).find({ where: { userId: user.id }, order: { projectId: 'ASC' } });
  return { ...publicUser(user), projectRoles: memberships.map((m) => ({ projectId: m.projectId, role: m.role })) };
}

/** One row per membership (or one with no project when there is none), as findSessionUser reads them. */
interface SessionUserRow {
  id: number;
  email: string;
  display_name: string;
  role: User['role'];
  notify: boolean | number;
  /** JSON text (raw SQL sees the column as stored). */
  notices_off: string | null;
  created_at: string;
  disabled_at: string | null;
  project_id: number | null;
  project_role: ProjectRoleOf['role'];
}

/**
 * The signed-in person, read on every request: the account and its memberships in one statement
 * (the same fields as findUserById + sessionUser, which took two).
 */
export async function findSessionUser(dataSource: DataSource, id: number): Promise<SessionUser | null> {
  const rows: SessionUserRow[] = await dataSource.query(
    `SELECT u.id, u.email, u.display_name, u.role, u.notify, u.notices_off, u.created_at, u.disabled_at, m.project_id, m.role AS project_role
     FROM user_account u LEFT JOIN project_member m ON m.user_id = u.id
     WHERE u.id = ${sqlParameter(dataSource, 1)} ORDER BY m.project_id`,
    [id],
  );
  if (rows.length === 0) return null;
  const [first] = rows;
  return {
    ...publicUser({
      id: Number(first.id),
      email: first.email,
      displayName: first.display_name,
      role: first.role,
      notify: Boolean(first.notify),
      noticesOff: storedNoticesOff(first.notices_off),
      createdAt: first.created_at,
      disabledAt: first.disabled_at,
    }),
    projectRoles: rows.filter((r) => r.project_id !== null).map((r) => ({ projectId: Number(r.project_id), role: r.project_role })),
  };
}

/** The account with its password hash, for sign-in only. */
export async function findUserForSignIn(dataSource: DataSource, email: string): Promise<User | null> {
  return dataSource
    .getRepository(UserEntity)
    .createQueryBuilder('u')
    .addSelect('u.passwordHash')
    .where('u.email = :email', { email: email.trim().toLowerCase() })
    .getOne();
}

export async function createUser(dataSource: DataSource, actorId: number | null, input: NewUser): Promise<PublicUser> {
  const email = input.email.trim().toLowerCase();
  checkPassword(input.password, email);
  const passwordHash = await hashPassword(input.password);
  return dataSource.transaction(async (manager) => {
    const repository = manager.getRepository(UserEntity);
    if (await repository.existsBy({ email })) throw new AppError('email-taken', 409, 'An account with this e-mail address exists already.', [{ path: '/email', message: 'is taken' }]);
    const user = await repository.save({ email, displayName: input.displayName.trim(), role: input.role, passwordHash, createdAt: new Date().toISOString() });
    await recordEvent(manager, { actorId, action: 'user.created', entityType: 'user', entityId: user.id, afterId: user.id, details: { email, role: input.role } });
    await indexRecords(manager, 'person', [user.id]);
    return publicUser(user);
  });
}

export async function updateUser(dataSource: DataSource, actorId: number, id: number, changes: Omit<UserChanges, 'disabled'>): Promise<PublicUser> {
  return dataSource.transaction(async (manager) => {
    const repository = manager.getRepository(UserEntity);
    const user = await repository.findOneBy({ id });
    if (!user) throw notFound('user');
    if (id === actorId && changes.role !== undefined && changes.role !== 'admin') {
      throw new AppError('last-admin', 409, 'You cannot take the administrator role from yourself.');
    }
    const updated = { ...user, ...(changes.displayName !== undefined ? { displayName: changes.displayName.trim() } : {}), ...(changes.role !== undefined ? { role: changes.role } : {}) };
    await repository.update({ id }, { displayName: updated.displayName, role: updated.role });
    await recordEvent(manager, { actorId, action: 'user.updated', entityType: 'user', entityId: id, beforeId: id, afterId: id, details: { before: { displayName: user.displayName, role: user.role }, after: { displayName: updated.displayName, role: updated.role } } });
    if (updated.displayName !== user.displayName) await indexRecords(manager, 'person', [id]);
    return publicUser(updated);
  });
}

/** A stored `notices_off` text as the known kinds it lists (unreadable text: none off). */
function storedNoticesOff(text: string | null): NoticeKind[] {
  try {
    const value: unknown = text ? JSON.parse(text) : [];
    return knownNoticesOff(Array.isArray(value) ? value.filter((k): k is string => typeof k === 'string') : []);
  } catch {
    return [];
  }
}

/**
 * A person's own e-mail preferences: the master switch and / or the whole list of notice kinds
 * turned off (shared/workflow/notices.ts); a change is recorded with what it became. Returns the account.
 */
export async function updatePreferences(dataSource: DataSource, userId: number, changes: PreferencesInput): Promise<PublicUser> {
  return dataSource.transaction(async (manager) => {
    const repository = manager.getRepository(UserEntity);
    const user = await repository.findOneBy({ id: userId });
    if (!user) throw notFound('user');
    const before = { notify: user.notify, noticesOff: knownNoticesOff(user.noticesOff) };
    const after = { notify: changes.notify ?? before.notify, noticesOff: changes.noticesOff ? knownNoticesOff(changes.noticesOff) : before.noticesOff };
    const changed: Partial<typeof after> = {
      ...(after.notify !== before.notify ? { notify: after.notify } : {}),
      ...(after.noticesOff.join() !== before.noticesOff.join() ? { noticesOff: after.noticesOff } : {}),
    };
    if (Object.keys(changed).length > 0) {
      await repository.update({ id: userId }, changed);
      await recordEvent(manager, { actorId: userId, action: 'user.preferences-changed', entityType: 'user', entityId: userId, beforeId: userId, afterId: userId, details: changed });
    }
    return publicUser({ ...user, ...after });
  });
}

/** The account with its password hash (inside a transaction). */
function withHash(manager: EntityManager, id: number): Promise<User | null> {
  return manager.getRepository(UserEntity).createQueryBuilder('u').addSelect('u.passwordHash').where('u.id = :id', { id }).getOne();
}

/**
 * A person changes their own password: the current one must be right (400 at /currentPassword
 * otherwise), the new one must keep the rule (400 at /newPassword). Every other session of the
 * person ends; `keepSessionId` (the one asking) stays signed in.
 */
export async function changeOwnPassword(dataSource: DataSource, userId: number, keepSessionId: string, input: PasswordChangeInput): Promise<PasswordChanged> {
  const user = await withHash(dataSource.manager, userId);
  if (!user) throw notFound('user');
  if (!(await verifyPassword(input.currentPassword, user.passwordHash))) throw invalid([{ path: '/currentPassword', message: 'is not your current password' }], 'The current password is not right.');
  checkPassword(input.newPassword, user.email, '/newPassword');
  if (await verifyPassword(input.newPassword, user.passwordHash)) throw invalid([{ path: '/newPassword', message: 'must differ from the current password' }], 'The new password must differ from the current one.');
  const passwordHash = await hashPassword(input.newPassword);
  return dataSource.transaction(async (manager) => {
    await manager.getRepository(UserEntity).update({ id: userId }, { passwordHash });
    const endedSessions = await endSessionsOf(manager, userId, keepSessionId);
    await recordEvent(manager, { actorId: userId, action: 'user.password-changed', entityType: 'user', entityId: userId, beforeId: userId, afterId: userId, details: { endedSessions } });
    return { endedSessions };
  });
}

/** How long a reset link works, ms (24 hours: time to read the mail on the next working day). */
export const RESET_LINK_LIFETIME_MS = 24 * 60 * 60 * 1000;
const tokenHash = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** The reset message (plain text; the person's name is data on its own line, never a header). */
function resetMessage(displayName: string, link: string, expiresAt: string, adminName: string): { subject: string; text: string } {
  return {
    subject: 'Longtail: set a new password',
    text: [
      `Hello ${displayName.replace(/[\r\n\u0085\u2028\u2029]+/g, ' ')},`,
      '',
      `An administrator (${adminName.replace(/[\r\n\u0085\u2028\u2029]+/g, ' ')}) asked Longtail to let you set a new password. Open this link to choose it:`,
      '',
      link,
      '',
      `The link works once, until ${formatDateTime(expiresAt, { timeZone: 'UTC' })}. Setting the new password signs you out everywhere.`,
      'If you did not expect this, tell your administrator; your current password keeps working until the link is used.',
    ].join('\n'),
  };
}

/**
 * An administrator has a one-time reset link mailed to a person (through the outbox). Only the
 * token's SHA-256 is stored; a newer link closes the older open ones. Answers the link's expiry.
 */
export async function issuePasswordReset(dataSource: DataSource, actorId: number, userId: number): Promise<PasswordResetIssued> {
  const token = randomBytes(32).toString('base64url');
  const now = new Date();
  const expiresAt = new Date(now.getTime() + RESET_LINK_LIFETIME_MS).toISOString();
  return dataSource.transaction(async (manager) => {
    const users = manager.getRepository(UserEntity);
    const user = await users.findOneBy({ id: userId });
    if (!user) throw notFound('user');
    const admin = await users.findOneBy({ id: actorId });
    const resets = manager.getRepository(PasswordResetEntity);
    await manager.createQueryBuilder().update(PasswordResetEntity).set({ usedAt: now.toISOString() }).where('user_id = :userId AND used_at IS NULL', { userId }).execute();
    const reset = await resets.save({ userId, tokenHash: tokenHash(token), createdAt: now.toISOString(), expiresAt, usedAt: null, createdById: actorId });
    const { subject, text } = resetMessage(user.displayName, `${notificationSettings().baseUrl}/password-reset#${token}`, expiresAt, admin?.displayName ?? 'an administrator');
    await manager.getRepository(MailOutboxEntity).save({
      createdAt: now.toISOString(),
      kind: PASSWORD_RESET_MAIL,
      projectId: null,
      proposalId: null,
      userId,
      toAddress: user.email,
      toName: user.displayName,
      subject,
      body: text,
      status: 'pending',
      attempts: 0,
      nextAttemptAt: now.toISOString(),
      lastError: null,
      sentAt: null,
    });
    await recordEvent(manager, { actorId, action: 'user.password-reset-sent', entityType: 'user', entityId: userId, afterId: reset.id, details: { expiresAt } });
    return { expiresAt };
  });
}


const linkRefused = () => new AppError('reset-link-invalid', 400, 'This password link is not valid any more (used, replaced by a newer one, or expired): ask an administrator for a new one.', [{ path: '/token', message: 'is not an open reset link' }]);

/**
 * The person behind a reset link sets a new password: the link must be open (unused, not
 * replaced, not expired); it is used up, the password replaced, and every session of the person
 * ends. Answers the account's e-mail (the page signs in with it).
 */
export async function completePasswordReset(dataSource: DataSource, input: PasswordResetInput): Promise<PasswordResetDone> {
  const hash = tokenHash(input.token);
  const open = await dataSource.getRepository(PasswordResetEntity).findOneBy({ tokenHash: hash });
  if (!open || open.usedAt !== null || Date.parse(open.expiresAt) <= Date.now()) throw linkRefused();
  const user = await dataSource.getRepository(UserEntity).findOneBy({ id: open.userId });
  if (!user) throw linkRefused();
  checkPassword(input.newPassword, user.email, '/newPassword');
  const passwordHash = await hashPassword(input.newPassword);
  return dataSource.transaction(async (manager) => {
    // Used up only if still open: of two requests with one link, one wins.
    const now = new Date().toISOString();
    const claimed = await manager.createQueryBuilder().update(PasswordResetEntity).set({ usedAt: now }).where('id = :id AND used_at IS NULL', { id: open.id }).execute();
    if (claimed.affected !== 1) throw linkRefused();
    await manager.getRepository(UserEntity).update({ id: user.id }, { passwordHash });
    const endedSessions = await endSessionsOf(manager, user.id);
    await recordEvent(manager, { actorId: user.id, action: 'user.password-reset', entityType: 'user', entityId: user.id, beforeId: open.id, afterId: user.id, details: { endedSessions } });
    return { email: user.email };
  });
}

/**
 * An administrator disables or enables an account. A disabled account cannot sign in and every
 * session of it ends at once; enabling lets it sign in again. Nobody disables their own account.
 */
export async function setAccountDisabled(dataSource: DataSource, actorId: number, userId: number, disabled: boolean): Promise<PublicUser> {
  if (disabled && userId === actorId) throw new AppError('own-account', 409, 'You cannot disable your own account.');
  return dataSource.transaction(async (manager) => {
    const repository = manager.getRepository(UserEntity);
    const user = await repository.findOneBy({ id: userId });
    if (!user) throw notFound('user');
    if ((user.disabledAt !== null) === disabled) return publicUser(user);
    const disabledAt = disabled ? new Date().toISOString() : null;
    await repository.update({ id: userId }, { disabledAt });
    const endedSessions = disabled ? await endSessionsOf(manager, userId) : 0;
    await recordEvent(manager, { actorId, action: disabled ? 'user.disabled' : 'user.enabled', entityType: 'user', entityId: userId, beforeId: userId, afterId: userId, details: disabled ? { endedSessions } : {} });
    return publicUser({ ...user, disabledAt });
  });
}
