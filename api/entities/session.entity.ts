import { EntitySchema } from 'typeorm';
import { shortTextColumn, textColumn } from './columns';

/** A sign-in session (express-session's store lives in the same database). */
export interface SessionRecord {
  id: string;
  /** Expiry, milliseconds since the epoch. */
  expiresAtMs: number;
  data: string;
  /** The signed-in account, or null for a visitor (so a person's sessions can be ended). */
  userId: number | null;
}

export const SessionEntity = new EntitySchema<SessionRecord>({
  name: 'Session',
  tableName: 'session',
  columns: {
    id: { ...shortTextColumn(128), primary: true },
    expiresAtMs: { type: 'bigint', name: 'expires_at_ms', transformer: { to: (v: number) => v, from: (v: string | number) => Number(v) } },
    data: textColumn(),
    userId: { type: 'integer', name: 'user_id', nullable: true },
  },
});
