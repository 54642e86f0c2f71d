import { EntitySchema } from 'typeorm';
import type { Spec as SpecDocument } from '../../shared/engine/types';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';
import { jsonColumn } from './json-column';

/** One immutable version of a spec: the spec document (JSON text in the row) as validated when written. */
export interface SpecVersion {
  id: number;
  specId: number;
  version: number;
  title: string;
  payload: SpecDocument;
  /** What changed and why, in the author's words (optional). */
  note: string | null;
  createdById: number;
  createdAt: string;
}

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
