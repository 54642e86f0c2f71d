import { EntitySchema } from 'typeorm';
import type { ProjectRole } from '#shared/workflow/roles';
import { foreignKeyColumn, idColumn, shortTextColumn, timestampColumn } from './columns';

export interface ProjectMember {
  id: number;
  projectId: number;
  userId: number;
  /** The role the person holds in this project; null for an administrator's membership from before roles per project. */
  role: ProjectRole | null;
  createdAt: string;
}

export const ProjectMemberEntity = new EntitySchema<ProjectMember>({
  name: 'ProjectMember',
  tableName: 'project_member',
  columns: {
    id: idColumn,
    projectId: foreignKeyColumn('project_id'),
    userId: foreignKeyColumn('user_id'),
    role: shortTextColumn(20, true),
    createdAt: timestampColumn('created_at'),
  },
  uniques: [{ name: 'uq_project_member', columns: ['projectId', 'userId'] }],
});
