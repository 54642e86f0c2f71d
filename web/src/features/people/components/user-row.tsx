import { useState, type FormEvent } from 'react';
import { ACCOUNT_ROLES, ACCOUNT_ROLE_TITLES, type AccountRole } from '../../../../../shared/workflow/roles';
import { Button } from '../../../components/ui/button';
import type { User } from '../../../lib/api-types';
import { useUpdateUser } from '../api/user-mutations';
import { fieldErrors } from '../utils/field-errors';
import { formatDate } from '../../../lib/dates';

const td = 'border-b border-rule/70 px-2.5 py-1.5 align-middle dark:border-night-rule/70';
const soft = 'text-ink-soft dark:text-night-ink-soft';

/** One account: rename in place; a role change is confirmed first, and the server may still refuse it. */
export function UserRow({ user, isYou, onChanged }: { user: User; isYou: boolean; onChanged?: () => Promise<unknown> }) {
  const [renaming, setRenaming] = useState(false);
  const [name, setName] = useState(user.displayName);
  const [newRole, setNewRole] = useState<AccountRole | null>(null);
  const update = useUpdateUser(onChanged);
  const nameError = renaming ? fieldErrors(update.error, ['displayName'] as const) : {};
  const startRename = () => {
    update.reset();
    setNewRole(null);
    setName(user.displayName);
    setRenaming(true);
  };
  const cancelRename = () => {
    update.reset();
    setRenaming(false);
  };
  const onRename = (event: FormEvent) => {
    event.preventDefault();
    if (name.trim() === user.displayName) return setRenaming(false);
    update.mutate({ id: user.id, changes: { displayName: name.trim() } }, { onSuccess: () => setRenaming(false) });
  };
  const chooseRole = (role: AccountRole) => {
    update.reset();
    setRenaming(false);
    setNewRole(role === user.role ? null : role);
  };
  // Settled either way: the select shows the role the server holds; a refusal stays in words below.
  const confirmRole = () => newRole && update.mutate({ id: user.id, changes: { role: newRole } }, { onSettled: () => setNewRole(null) });
  const refusal = !renaming && !newRole && update.error ? update.error.message : null;
  return (
    <>
      <tr className="hover:bg-paper dark:hover:bg-night">
        <td className={td}>
          {renaming ? (
            <form onSubmit={onRename} className="flex items-center gap-1.5">
              <input
                aria-label={`New name for ${user.displayName}`}
                aria-invalid={nameError.displayName ? true : undefined}
                value={name}
                maxLength={120}
                autoFocus
                onChange={(e) => setName(e.target.value)}
                onKeyDown={(e) => e.key === 'Escape' && cancelRename()}
                className="w-44 rounded-md border border-rule bg-sheet px-2 py-1 dark:border-night-rule dark:bg-night"
              />
              <Button type="submit" className="px-2 py-1 text-xs" disabled={!name.trim() || update.isPending}>
                {update.isPending ? 'Saving…' : 'Save'}
              </Button>
              <Button variant="quiet" className="px-2 py-1 text-xs" onClick={cancelRename}>
                Cancel
              </Button>
            </form>
          ) : (
            <span className="font-medium whitespace-nowrap">
              {user.displayName}
              {isYou && <span className={`ml-1.5 text-xs font-normal ${soft}`}>(you)</span>}
            </span>
          )}
          {renaming && (nameError.displayName || nameError.form) && (
            <p role="alert" className="mt-1 text-xs text-short dark:text-short-bright">
              {nameError.displayName ? `The name ${nameError.displayName}` : nameError.form}
            </p>
          )}
        </td>
        <td className={`${td} ${soft}`}>{user.email}</td>
        <td className={td}>
          <select
            aria-label={`Role of ${user.displayName}`}
            value={newRole ?? user.role}
            onChange={(e) => chooseRole(e.target.value as AccountRole)}
            className="rounded-md border border-rule bg-sheet px-1.5 py-1 text-sm dark:border-night-rule dark:bg-night"
          >
            {ACCOUNT_ROLES.map((role) => (
              <option key={role} value={role}>
                {ACCOUNT_ROLE_TITLES[role]}
              </option>
            ))}
          </select>
        </td>
        <td className={`${td} ${soft} whitespace-nowrap`}>
          <time dateTime={user.createdAt}>{formatDate(user.createdAt)}</time>
        </td>
        <td className={`${td} text-right`}>
          {!renaming && (
            <Button variant="quiet" className="px-2 py-1 text-xs" onClick={startRename} aria-label={`Rename ${user.displayName}`}>
              Rename
            </Button>
          )}
        </td>
      </tr>
      {newRole && (
        <tr>
          <td colSpan={5} className="border-b border-rule/70 bg-note-soft/60 px-2.5 py-2 dark:border-night-rule/70 dark:bg-note/15">
            <div role="group" aria-label={`Confirm the role change of ${user.displayName}`} className="flex flex-wrap items-center gap-3 text-sm">
              <p>
                Change {isYou ? 'your own role' : `${user.displayName}’s role`} from <strong className="font-medium">{ACCOUNT_ROLE_TITLES[user.role]}</strong> to{' '}
                <strong className="font-medium">{ACCOUNT_ROLE_TITLES[newRole]}</strong>? What {isYou ? 'you' : 'they'} may do changes at once.
              </p>
              <div className="flex gap-2">
                <Button className="px-2.5 py-1 text-xs" disabled={update.isPending} onClick={confirmRole}>
                  {update.isPending ? 'Changing…' : 'Change role'}
                </Button>
                <Button variant="secondary" className="px-2.5 py-1 text-xs" onClick={() => chooseRole(user.role)}>
                  Cancel
                </Button>
              </div>
            </div>
          </td>
        </tr>
      )}
      {refusal && (
        <tr>
          <td colSpan={5} className="border-b border-rule/70 bg-short-soft/60 px-2.5 py-2 dark:border-night-rule/70 dark:bg-short/15">
            <div role="alert" className="flex flex-wrap items-center gap-3 text-sm text-short dark:text-short-bright">
              <p>
                <span aria-hidden="true">✕ </span>
                The role of {isYou ? 'your account' : user.displayName} was not changed: {refusal}
              </p>
              <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => update.reset()}>
                Dismiss
              </Button>
            </div>
          </td>
        </tr>
      )}
    </>
  );
}
