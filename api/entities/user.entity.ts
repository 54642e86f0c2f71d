import { EntitySchema } from 'typeorm';
import type { AccountRole } from '../../shared/workflow/roles';
import { idColumn, shortTextColumn, timestampColumn } from './columns';

export interface User {
  id: number;
  email: string;
  displayName: string;
  /** Global: administrator or member; what a member may do in a project is the membership's role. */
  role: AccountRole;
  passwordHash: string;
  /** E-mail notifications about the workflow (on unless the person turns them off). */
  notify: boolean;
  createdAt: string;
  /** When an administrator disabled the account (it cannot sign in), or null. */
  disabledAt: string | null;
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
    disabledAt: { ...timestampColumn('disabled_at'), nullable: true },
  },
});
