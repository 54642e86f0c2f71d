import type { User } from '#shared/api/users';
import { UserRow } from './user-row';

const th = 'border-b border-rule px-2.5 py-1.5 text-left text-xs font-medium tracking-wide whitespace-nowrap text-ink-soft uppercase dark:border-night-rule dark:text-night-ink-soft';

/** Every account; each row renames its person or changes their role. */
export function UsersTable({ users, currentUserId, onUserChanged }: { users: readonly User[]; currentUserId: number; onUserChanged?: () => Promise<unknown> }) {
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Accounts</caption>
        <thead>
          <tr>
            <th scope="col" className={th}>
              Name
            </th>
            <th scope="col" className={th}>
              E-mail
            </th>
            <th scope="col" className={th}>
              Account
            </th>
            <th scope="col" className={th}>
              Created
            </th>
            <th scope="col" className={th}>
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {users.map((user) => (
            <UserRow key={user.id} user={user} isYou={user.id === currentUserId} onChanged={onUserChanged} />
          ))}
        </tbody>
      </table>
    </div>
  );
}
