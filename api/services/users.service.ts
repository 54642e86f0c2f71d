/** Accounts: created and changed by admins, looked up for sign-in. */
import type { DataSource } from 'typeorm';
import type { AccountRole, ProjectRoleOf } from '../../shared/workflow/roles';
import { hashPassword } from '../auth/password';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { UserEntity, type User } from '../entities/user.entity';
import { AppError, notFound } from '../errors';
import { recordEvent } from './audit.service';

export type PublicUser = Omit<User, 'passwordHash'>;

export function publicUser(user: User | PublicUser): PublicUser {
  const { id, email, displayName, role, notify, createdAt } = user;
  return { id, email, displayName, role, notify, createdAt };
}

export async function listUsers(dataSource: DataSource): Promise<PublicUser[]> {
  return (await dataSource.getRepository(UserEntity).find({ order: { id: 'ASC' } })).map(publicUser);
}

export async function findUserById(dataSource: DataSource, id: number): Promise<PublicUser | null> {
  const user = await dataSource.getRepository(UserEntity).findOneBy({ id });
  return user ? publicUser(user) : null;
}

/** The signed-in person: the account and the role held in each project (read on every request, so a change applies at once). */
export type SessionUser = PublicUser & { projectRoles: ProjectRoleOf[] };

export async function sessionUser(dataSource: DataSource, user: PublicUser): Promise<SessionUser> {
  const memberships = await dataSource.getRepository(ProjectMemberEntity).find({ where: { userId: user.id }, order: { projectId: 'ASC' } });
  return { ...publicUser(user), projectRoles: memberships.map((m) => ({ projectId: m.projectId, role: m.role })) };
}

export async function findSessionUser(dataSource: DataSource, id: number): Promise<SessionUser | null> {
  const user = await findUserById(dataSource, id);
  return user ? sessionUser(dataSource, user) : null;
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

export interface NewUser {
  email: string;
  displayName: string;
  role: AccountRole;
  password: string;
}

export async function createUser(dataSource: DataSource, actorId: number | null, input: NewUser): Promise<PublicUser> {
  const email = input.email.trim().toLowerCase();
  const passwordHash = await hashPassword(input.password);
  return dataSource.transaction(async (manager) => {
    const repository = manager.getRepository(UserEntity);
    if (await repository.existsBy({ email })) throw new AppError('email-taken', 409, 'An account with this e-mail address exists already.', [{ path: '/email', message: 'is taken' }]);
    const user = await repository.save({ email, displayName: input.displayName.trim(), role: input.role, passwordHash, createdAt: new Date().toISOString() });
    await recordEvent(manager, { actorId, action: 'user.created', entityType: 'user', entityId: user.id, afterId: user.id, details: { email, role: input.role } });
    return publicUser(user);
  });
}

export async function updateUser(dataSource: DataSource, actorId: number, id: number, changes: { displayName?: string; role?: AccountRole }): Promise<PublicUser> {
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
    return publicUser(updated);
  });
}

/** A person's own preferences (today: e-mail notifications on or off); returns the account. */
export async function updatePreferences(dataSource: DataSource, userId: number, changes: { notify: boolean }): Promise<PublicUser> {
  return dataSource.transaction(async (manager) => {
    const repository = manager.getRepository(UserEntity);
    const user = await repository.findOneBy({ id: userId });
    if (!user) throw notFound('user');
    if (user.notify !== changes.notify) {
      await repository.update({ id: userId }, { notify: changes.notify });
      await recordEvent(manager, { actorId: userId, action: 'user.preferences-changed', entityType: 'user', entityId: userId, beforeId: userId, afterId: userId, details: { notify: changes.notify } });
    }
    return publicUser({ ...user, notify: changes.notify });
  });
}
