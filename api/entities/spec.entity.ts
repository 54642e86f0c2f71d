import { EntitySchema } from 'typeorm';
import type { Spec } from '#shared/api/specs';
import { foreignKeyColumn, idColumn, shortTextColumn, timestampColumn } from './columns';

/** A requirement spec row is what the API shows (shared/api/specs.ts): its versions hold the content; `latestVersion` is the newest number. */
export type { Spec };

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
