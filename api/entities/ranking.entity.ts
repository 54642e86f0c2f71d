import { EntitySchema } from 'typeorm';
import { idColumn, shortTextColumn, textColumn, timestampColumn } from './columns';

/**
 * One distinct engine output (`recommend`), stored once and referenced by every proposal that
 * carries it. Keyed by the SHA-256 of its JSON text: the text names the engine and rule-set
 * versions and holds every figure of every option, so two proposals share a row only when their
 * rankings are the same byte for byte (never one design's figures under another's spec).
 */
export interface Ranking {
  id: number;
  /** SHA-256 of `result`, hex. */
  contentHash: string;
  /** The whole `recommend` output, JSON text, kept as written (answered as it is, not re-serialised). */
  result: string;
  createdAt: string;
}

export const RankingEntity = new EntitySchema<Ranking>({
  name: 'Ranking',
  tableName: 'ranking',
  columns: {
    id: idColumn,
    contentHash: { ...shortTextColumn(64), name: 'content_hash', unique: true },
    result: textColumn(),
    createdAt: timestampColumn('created_at'),
  },
});
