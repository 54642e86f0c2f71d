import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

export interface Project {
  id: number;
  name: string;
  description: string;
  createdById: number;
  createdAt: string;
}

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
