import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

/** One immutable version of a spec: the spec document as JSON text. */
export interface SpecVersion {
  id: number;
  specId: number;
  version: number;
  title: string;
  payload: string;
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
    payload: textColumn(),
    note: textColumn(true),
    createdById: foreignKeyColumn('created_by_id'),
    createdAt: timestampColumn('created_at'),
  },
  uniques: [{ name: 'uq_spec_version', columns: ['specId', 'version'] }],
});
