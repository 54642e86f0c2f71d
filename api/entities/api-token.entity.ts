import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, timestampColumn } from './columns';

/**
 * A personal API token: a person's own key for scripts and CI, acting as that person (their
 * account role and project roles at each request). Only the token's SHA-256 is kept; the token
 * itself is shown once, when it is made.
 */
export interface ApiTokenRow {
  id: number;
  userId: number;
  /** The person's own name for it ("CI on the bench rig"). */
  name: string;
  /** Hex SHA-256 of the whole token. */
  tokenHash: string;
  /** The token's first characters (`ltk_` and 6 more), to tell tokens apart in the list. */
  tokenStart: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

export const ApiTokenEntity = new EntitySchema<ApiTokenRow>({
  name: 'ApiToken',
  tableName: 'api_token',
  columns: {
    id: idColumn,
    userId: foreignKeyColumn('user_id'),
    name: shortTextColumn(120),
    tokenHash: { ...shortTextColumn(64), name: 'token_hash', unique: true },
    tokenStart: { ...shortTextColumn(16), name: 'token_start' },
    createdAt: timestampColumn('created_at'),
    lastUsedAt: { ...timestampColumn('last_used_at'), nullable: true },
    revokedAt: { ...timestampColumn('revoked_at'), nullable: true },
  },
});
