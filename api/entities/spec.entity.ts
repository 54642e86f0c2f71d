import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, timestampColumn } from './columns';

/** A requirement spec: its versions hold the content; `latestVersion` is the newest number. */
export interface Spec {
  id: number;
  projectId: number;
  title: string;
  latestVersion: number;
  createdById: number;
  createdAt: string;
  updatedAt: string;
}

export const SpecEntity = new EntitySchema<Spec>({
  name: 'Spec',
  tableName: 'spec',
  columns: {
    id: idColumn,
    projectId: foreignKeyColumn('project_id'),
    title: shortTextColumn(200),
    latestVersion: { type: 'integer', name: 'latest_version' },
    createdById: foreignKeyColumn('created_by_id'),
    createdAt: timestampColumn('created_at'),
    updatedAt: timestampColumn('updated_at'),
  },
});
