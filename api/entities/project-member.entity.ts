import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, timestampColumn } from './columns';

export interface ProjectMember {
  id: number;
  projectId: number;
  userId: number;
  createdAt: string;
}

export const ProjectMemberEntity = new EntitySchema<ProjectMember>({
  name: 'ProjectMember',
  tableName: 'project_member',
  columns: {
    id: idColumn,
    projectId: foreignKeyColumn('project_id'),
    userId: foreignKeyColumn('user_id'),
    createdAt: timestampColumn('created_at'),
  },
  uniques: [{ name: 'uq_project_member', columns: ['projectId', 'userId'] }],
});
