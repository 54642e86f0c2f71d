import { useState, type FormEvent } from 'react';
import { ACCOUNT_ROLES, ACCOUNT_ROLE_TITLES, type AccountRole } from '#shared/workflow/roles';
import { Button } from '../../../components/ui/button';
import type { User } from '#shared/api/users';
import { useSendPasswordReset, useUpdateUser } from '../api/user-mutations';
import { fieldErrors } from '../../../lib/field-errors';
import { formatDate, formatDateTime } from '../../../lib/dates';

const td = 'border-b border-rule/70 px-2.5 py-1.5 align-middle dark:border-night-rule/70';
const soft = 'text-ink-soft dark:text-night-ink-soft';
const noteRow = 'border-b border-rule/70 px-2.5 py-2 dark:border-night-rule/70';
/** A note row's content stays in the visible part of the table when a phone scrolls it sideways. */
const pinned = 'sticky left-2.5 max-w-[calc(100vw-5rem)]';

/**
 * One account: rename in place; a role change is confirmed first, and the server may still
 * refuse it. Account controls: mail a one-time password link; disable (confirmed first: the
 * person is signed out at once and cannot sign in) or enable again.
 */
export function UserRow({ user, isYou, onChanged }: { user: User; isYou: boolean; onChanged?: () => Promise<unknown> }) {
  const [renaming, setRenaming] = useState(false);
  const [name, setName] = useState(user.displayName);
  const [newRole, setNewRole] = useState<AccountRole | null>(null);
  const update = useUpdateUser(onChanged);
  const access = useUpdateUser(onChanged);
  const resetLink = useSendPasswordReset();
  const [confirmDisable, setConfirmDisable] = useState(false);
  const disabled = Boolean(user.disabledAt);
  const setDisabled = (value: boolean) => access.mutate({ id: user.id, changes: { disabled: value } }, { onSettled: () => setConfirmDisable(false) });
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
              {disabled && (
                <span className="ml-1.5 rounded-full border border-short/50 px-1.5 py-px text-xs font-normal text-short dark:border-short-bright/50 dark:text-short-bright">
                  <span aria-hidden="true">⊘ </span>Disabled
                </span>
              )}
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
          <div className="flex flex-wrap justify-end gap-1">
            {!renaming && (
              <Button variant="quiet" className="px-2 py-1 text-xs" onClick={startRename} aria-label={`Rename ${user.displayName}`}>
                Rename
              </Button>
            )}
            <Button variant="quiet" className="px-2 py-1 text-xs whitespace-nowrap" disabled={resetLink.isPending} onClick={() => resetLink.mutate(user.id)} aria-label={`Mail ${user.displayName} a password link`}>
              {resetLink.isPending ? 'Sending…' : 'Password link'}
            </Button>
            {!isYou &&
              (disabled ? (
                <Button variant="quiet" className="px-2 py-1 text-xs" disabled={access.isPending} onClick={() => setDisabled(false)} aria-label={`Enable ${user.displayName}`}>
                  {access.isPending ? 'Enabling…' : 'Enable'}
                </Button>
              ) : (
                <Button variant="quiet" className="px-2 py-1 text-xs" onClick={() => setConfirmDisable(true)} aria-label={`Disable ${user.displayName}`}>
                  Disable
                </Button>
              ))}
          </div>
        </td>
      </tr>
      {newRole && (
        <tr>
          <td colSpan={5} className="border-b border-rule/70 bg-note-soft/60 px-2.5 py-2 dark:border-night-rule/70 dark:bg-note/15">
            <div role="group" aria-label={`Confirm the role change of ${user.displayName}`} className={`${pinned} flex flex-wrap items-center gap-3 text-sm`}>
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
      {confirmDisable && (
        <tr>
          <td colSpan={5} className={`${noteRow} bg-note-soft/60 dark:bg-note/15`}>
            <div role="group" aria-label={`Confirm disabling ${user.displayName}`} className={`${pinned} flex flex-wrap items-center gap-3 text-sm`}>
              <p>
                Disable {user.displayName}? They are signed out at once and cannot sign in until an administrator enables the account again. Their specs, decisions and reviews stay.
              </p>
              <div className="flex gap-2">
                <Button className="px-2.5 py-1 text-xs" disabled={access.isPending} onClick={() => setDisabled(true)}>
                  {access.isPending ? 'Disabling…' : 'Disable account'}
                </Button>
                <Button variant="secondary" className="px-2.5 py-1 text-xs" onClick={() => setConfirmDisable(false)}>
                  Cancel
                </Button>
              </div>
            </div>
          </td>
        </tr>
      )}
      {resetLink.isSuccess && (
        <tr>
          <td colSpan={5} className={noteRow}>
            <div role="status" className={`${pinned} flex flex-wrap items-center gap-3 text-sm`}>
              <p>
                <span aria-hidden="true">✓ </span>A one-time link to set a new password is on its way to {user.email}. It works once, until{' '}
                <time dateTime={resetLink.data.expiresAt}>{formatDateTime(resetLink.data.expiresAt)}</time>; a newer link replaces it. The current password works until the link is used.
              </p>
              <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => resetLink.reset()}>
                Dismiss
              </Button>
            </div>
          </td>
        </tr>
      )}
      {(resetLink.error || access.error) && (
        <tr>
          <td colSpan={5} className={`${noteRow} bg-short-soft/60 dark:bg-short/15`}>
            <div role="alert" className={`${pinned} flex flex-wrap items-center gap-3 text-sm text-short dark:text-short-bright`}>
              <p>
                <span aria-hidden="true">✕ </span>
                {resetLink.error ? `No link was sent: ${resetLink.error.message}` : `The account was not changed: ${access.error?.message}`}
              </p>
              <Button
                variant="secondary"
                className="px-2 py-1 text-xs"
                onClick={() => {
                  resetLink.reset();
                  access.reset();
                }}
              >
                Dismiss
              </Button>
            </div>
          </td>
        </tr>
      )}
      {refusal && (
        <tr>
          <td colSpan={5} className="border-b border-rule/70 bg-short-soft/60 px-2.5 py-2 dark:border-night-rule/70 dark:bg-short/15">
            <div role="alert" className={`${pinned} flex flex-wrap items-center gap-3 text-sm text-short dark:text-short-bright`}>
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
