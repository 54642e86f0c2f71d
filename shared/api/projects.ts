/** Projects on the wire: /api/projects and their members. */
import type { ProjectRole } from '../workflow/roles';
import type { User } from './users';

export interface Project {
  id: number;
  name: string;
  description: string;
  createdById: number;
  createdAt: string;
}

/** POST /api/projects. */
export interface NewProject {
  name: string;
  description?: string;
}

/** A project's member (GET /api/projects/:id/members): the account and the role held in that project. */
export interface ProjectMember extends User {
  projectRole: ProjectRole | null;
}

/** POST /api/projects/:id/members: add the person with the role they hold in this project (or change it). */
export interface MembershipInput {
  userId: number;
  role: ProjectRole;
}
