/**
 * Projects and memberships. Everybody sees only the projects they belong to (an admin sees
 * all); any other project answers 404, so its existence is never revealed. Each membership
 * carries the role the person holds in that project, and `projectFor` with an action is where
 * every write checks it.
 */
import { DataSource, In, type EntityManager } from 'typeorm';
import { mayIn, ROLE_TITLES, type Action, type ProjectRole, type ProjectRoleOf } from '#shared/workflow/roles';
import { ProjectMemberEntity, type ProjectMember } from '../entities/project-member.entity';
import { ProjectEntity, type Project } from '../entities/project.entity';
import { UserEntity } from '../entities/user.entity';
import { AppError, forbidden, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { indexRecords } from './search-index.service';
import { publicUser, type PublicUser } from './users.service';
import type { NewProject, ProjectMember as ProjectMemberView } from '#shared/api/projects';

/** Who asks; a signed-in request's user also carries the roles held in each project (read at the start of the request). */
type Viewer = Pick<PublicUser, 'id' | 'role'> & { projectRoles?: readonly ProjectRoleOf[] };

/** The refusal when the role held in the record's project may not take the action. */
function forbiddenInProject(role: ProjectRole | null, action: Action) {
  return forbidden(role ? `Your role in this project (${ROLE_TITLES[role]}) cannot do this (${action}).` : `You hold no role in this project that can do this (${action}).`);
}

/**
 * The project if the viewer may see it, else a 404; with an action, also a 403 unless the role
 * the viewer holds in this project (or the administrator role) may take it.
 */
export async function projectFor(manager: EntityManager | DataSource, viewer: Viewer, projectId: number, action?: Action): Promise<Project> {
  const project = await manager.getRepository(ProjectEntity).findOneBy({ id: projectId });
  if (!project) throw notFound('project');
  // The request's own reading of the viewer's memberships, when there is one and no transaction
  // needs a reading of its own (inside one, the row is read again under its locks).
  const membership =
    viewer.projectRoles && manager instanceof DataSource
      ? viewer.projectRoles.find((m) => m.projectId === projectId)
      : await manager.getRepository(ProjectMemberEntity).findOneBy({ projectId, userId: viewer.id });
  if (!membership && !mayIn(viewer.role, null, 'projects:read-all')) throw notFound('project');
  if (action && !mayIn(viewer.role, membership?.role, action)) throw forbiddenInProject(membership?.role ?? null, action);
  return project;
}

export async function listProjects(dataSource: DataSource, viewer: Viewer): Promise<Project[]> {
  const repository = dataSource.getRepository(ProjectEntity);
  if (mayIn(viewer.role, null, 'projects:read-all')) return repository.find({ order: { id: 'ASC' } });
  const memberships = await dataSource.getRepository(ProjectMemberEntity).findBy({ userId: viewer.id });
  return repository.find({ where: { id: In(memberships.map((m) => m.projectId)) }, order: { id: 'ASC' } });
}

export async function createProject(dataSource: DataSource, actorId: number, input: NewProject): Promise<Project> {
  return dataSource.transaction(async (manager) => {
    const project = await manager.getRepository(ProjectEntity).save({
      name: input.name.trim(),
      description: (input.description ?? '').trim(),
      createdById: actorId,
      createdAt: new Date().toISOString(),
    });
    await recordEvent(manager, { actorId, action: 'project.created', entityType: 'project', entityId: project.id, projectId: project.id, afterId: project.id, details: { name: project.name } });
    await indexRecords(manager, 'project', [project.id]);
    return project;
  });
}

/** A member of a project: the account, and the role held in this project (shared/api/projects.ts). */
export type { ProjectMemberView };

export async function listMembers(dataSource: DataSource, viewer: Viewer, projectId: number): Promise<ProjectMemberView[]> {
  await projectFor(dataSource, viewer, projectId);
  const memberships = await dataSource.getRepository(ProjectMemberEntity).findBy({ projectId });
  const roleOf = new Map(memberships.map((m) => [m.userId, m.role]));
  const users = await dataSource.getRepository(UserEntity).find({ where: { id: In([...roleOf.keys()]) }, order: { id: 'ASC' } });
  return users.map((user) => ({ ...publicUser(user), projectRole: roleOf.get(user.id) ?? null }));
}

/** Adds the person to the project with the role they hold in it, or changes that role when they are a member already. */
export async function addMember(dataSource: DataSource, actor: Viewer, projectId: number, userId: number, role: ProjectRole): Promise<ProjectMember> {
  return dataSource.transaction(async (manager) => {
    await projectFor(manager, actor, projectId, 'members:manage');
    if (!(await manager.getRepository(UserEntity).existsBy({ id: userId }))) throw new AppError('user-not-found', 400, 'No such user.', [{ path: '/userId', message: 'names no account' }]);
    const repository = manager.getRepository(ProjectMemberEntity);
    const existing = await repository.findOneBy({ projectId, userId });
    if (existing) {
      if (existing.role === role) return existing;
      await repository.update({ id: existing.id }, { role });
      await recordEvent(manager, { actorId: actor.id, action: 'project.member-role-changed', entityType: 'project-member', entityId: existing.id, projectId, beforeId: existing.id, afterId: existing.id, details: { userId, before: existing.role, after: role } });
      return { ...existing, role };
    }
    const member = await repository.save({ projectId, userId, role, createdAt: new Date().toISOString() });
    await recordEvent(manager, { actorId: actor.id, action: 'project.member-added', entityType: 'project-member', entityId: member.id, projectId, afterId: member.id, details: { userId, role } });
    return member;
  });
}

export async function removeMember(dataSource: DataSource, actor: Viewer, projectId: number, userId: number): Promise<void> {
  await dataSource.transaction(async (manager) => {
    await projectFor(manager, actor, projectId, 'members:manage');
    const repository = manager.getRepository(ProjectMemberEntity);
    const member = await repository.findOneBy({ projectId, userId });
    if (!member) throw notFound('member');
    await repository.delete({ id: member.id });
    await recordEvent(manager, { actorId: actor.id, action: 'project.member-removed', entityType: 'project-member', entityId: member.id, projectId, beforeId: member.id, details: { userId, role: member.role } });
  });
}
