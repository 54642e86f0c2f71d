import { EntitySchema } from 'typeorm';
import type { Project } from '#shared/api/projects';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

/** A project row is what the API shows (shared/api/projects.ts). */
export type { Project };

export const ProjectEntity = new EntitySchema<Project>({
  name: 'Project',
  tableName: 'project',
  columns: {
    id: idColumn,
    name: shortTextColumn(160),
    description: textColumn(),
    createdById: foreignKeyColumn('created_by_id'),
    createdAt: timestampColumn('created_at'),
  },
});
