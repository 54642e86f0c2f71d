import { EntitySchema } from 'typeorm';
import type { User as Account } from '#shared/api/users';
import { idColumn, shortTextColumn, timestampColumn } from './columns';
import { jsonTransformer } from './json-column';

/** An account row: what the API shows of it (shared/api/users.ts) and the password hash, read only for sign-in. */
export interface User extends Account {
  passwordHash: string;
}

export const UserEntity = new EntitySchema<User>({
  name: 'User',
  tableName: 'user_account',
  columns: {
    id: idColumn,
    email: { ...shortTextColumn(254), unique: true },
    displayName: { ...shortTextColumn(120), name: 'display_name' },
    role: shortTextColumn(20),
    passwordHash: { ...shortTextColumn(200), name: 'password_hash', select: false },
    createdAt: timestampColumn('created_at'),
    notify: { type: 'boolean', default: true },
    /**
     * The notice kinds turned off (JSON list of names, shared/workflow/notices.ts); `[]` for a new
     * account. After an insert TypeORM hands the column's default back through `from` once as
     * text and once already read, so a list is taken as it is.
     */
    noticesOff: { type: 'text', name: 'notices_off', default: '[]', transformer: { to: jsonTransformer.to, from: (stored: unknown) => (Array.isArray(stored) ? stored : typeof stored === 'string' && stored !== '' ? jsonTransformer.from(stored) : []) } },
    disabledAt: { ...timestampColumn('disabled_at'), nullable: true },
  },
});
