/**
 * Projects and memberships. Everybody sees only the projects they belong to (an admin sees
 * all); any other project answers 404, so its existence is never revealed.
 */
import { In, type DataSource, type EntityManager } from 'typeorm';
import { may } from '../../shared/workflow/roles';
import { ProjectMemberEntity } from '../entities/project-member.entity';
import { ProjectEntity, type Project } from '../entities/project.entity';
import { UserEntity } from '../entities/user.entity';
import { AppError, notFound } from '../errors';
import { recordEvent } from './audit.service';
import { publicUser, type PublicUser } from './users.service';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/** The project if the viewer may see it, else a 404. */
export async function projectFor(manager: EntityManager | DataSource, viewer: Viewer, projectId: number): Promise<Project> {
  const project = await manager.getRepository(ProjectEntity).findOneBy({ id: projectId });
  if (!project) throw notFound('project');
  if (may(viewer.role, 'projects:read-all')) return project;
  const member = await manager.getRepository(ProjectMemberEntity).existsBy({ projectId, userId: viewer.id });
  if (!member) throw notFound('project');
  return project;
}

export async function listProjects(dataSource: DataSource, viewer: Viewer): Promise<Project[]> {
  const repository = dataSource.getRepository(ProjectEntity);
  if (may(viewer.role, 'projects:read-all')) return repository.find({ order: { id: 'ASC' } });
  const memberships = await dataSource.getRepository(ProjectMemberEntity).findBy({ userId: viewer.id });
  return repository.find({ where: { id: In(memberships.map((m) => m.projectId)) }, order: { id: 'ASC' } });
}

export async function createProject(dataSource: DataSource, actorId: number, input: { name: string; description?: string }): Promise<Project> {
  return dataSource.transaction(async (manager) => {
    const project = await manager.getRepository(ProjectEntity).save({
      name: input.name.trim(),
      description: (input.description ?? '').trim(),
      createdById: actorId,
      createdAt: new Date().toISOString(),
    });
    await recordEvent(manager, { actorId, action: 'project.created', entityType: 'project', entityId: project.id, projectId: project.id, afterId: project.id, details: { name: project.name } });
    return project;
  });
}

export async function listMembers(dataSource: DataSource, viewer: Viewer, projectId: number): Promise<PublicUser[]> {
  await projectFor(dataSource, viewer, projectId);
  const memberships = await dataSource.getRepository(ProjectMemberEntity).findBy({ projectId });
  const users = await dataSource.getRepository(UserEntity).find({ where: { id: In(memberships.map((m) => m.userId)) }, order: { id: 'ASC' } });
  return users.map(publicUser);
}

export async function addMember(dataSource: DataSource, actor: Viewer, projectId: number, userId: number): Promise<{ projectId: number; userId: number; id: number }> {
  return dataSource.transaction(async (manager) => {
    await projectFor(manager, actor, projectId);
    if (!(await manager.getRepository(UserEntity).existsBy({ id: userId }))) throw new AppError('user-not-found', 400, 'No such user.', [{ path: '/userId', message: 'names no account' }]);
    const repository = manager.getRepository(ProjectMemberEntity);
    const existing = await repository.findOneBy({ projectId, userId });
    if (existing) return existing;
    const member = await repository.save({ projectId, userId, createdAt: new Date().toISOString() });
    await recordEvent(manager, { actorId: actor.id, action: 'project.member-added', entityType: 'project-member', entityId: member.id, projectId, afterId: member.id, details: { userId } });
    return member;
  });
}

export async function removeMember(dataSource: DataSource, actor: Viewer, projectId: number, userId: number): Promise<void> {
  await dataSource.transaction(async (manager) => {
    await projectFor(manager, actor, projectId);
    const repository = manager.getRepository(ProjectMemberEntity);
    const member = await repository.findOneBy({ projectId, userId });
    if (!member) throw notFound('member');
    await repository.delete({ id: member.id });
    await recordEvent(manager, { actorId: actor.id, action: 'project.member-removed', entityType: 'project-member', entityId: member.id, projectId, beforeId: member.id, details: { userId } });
  });
}
