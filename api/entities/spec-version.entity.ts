import { EntitySchema } from 'typeorm';
import type { SpecVersion } from '#shared/api/specs';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

/** One immutable version of a spec: the wire shape itself (the document is JSON text in the row, as validated when written). */
export type { SpecVersion };

export const SpecVersionEntity = new EntitySchema<SpecVersion>({
  name: 'SpecVersion',
  tableName: 'spec_version',
  columns: {
    id: idColumn,
    specId: foreignKeyColumn('spec_id'),
    version: { type: 'integer' },
    title: shortTextColumn(200),
    payload: jsonColumn(),
    note: textColumn(true),
    createdById: foreignKeyColumn('created_by_id'),
    createdAt: timestampColumn('created_at'),
  },
  uniques: [{ name: 'uq_spec_version', columns: ['specId', 'version'] }],
});
