import { EntitySchema } from 'typeorm';
import { foreignKeyColumn, idColumn, shortTextColumn, timestampColumn } from './columns';

/**
 * A one-time password-reset link an administrator had sent to a person. Only the token's SHA-256
 * is kept; the link works once, before `expiresAt`, and a newer link replaces it.
 */
export interface PasswordReset {
  id: number;
  userId: number;
  /** Hex SHA-256 of the token in the link. */
  tokenHash: string;
  createdAt: string;
  expiresAt: string;
  /** When the link was used (or replaced by a newer one), or null while it is open. */
  usedAt: string | null;
  createdById: number | null;
}

export const PasswordResetEntity = new EntitySchema<PasswordReset>({
  name: 'PasswordReset',
  tableName: 'password_reset',
  columns: {
    id: idColumn,
    userId: foreignKeyColumn('user_id'),
    tokenHash: { ...shortTextColumn(64), name: 'token_hash', unique: true },
    createdAt: timestampColumn('created_at'),
    expiresAt: timestampColumn('expires_at'),
    usedAt: { ...timestampColumn('used_at'), nullable: true },
    createdById: foreignKeyColumn('created_by_id', true),
  },
});

/** The outbox kind of a reset message: its body holds the link, so it is blanked once sent. */
export const PASSWORD_RESET_MAIL = 'account.password-reset';
