import { useQuery } from '@tanstack/react-query';
import { useId, useState, type FormEvent } from 'react';
import { ROLE_TITLES } from '../../../../../shared/workflow/roles';
import { Button } from '../../../components/ui/button';
import { ErrorPanel, Loading } from '../../../components/ui/feedback';
import type { User } from '../../../lib/api-types';
import { useAddMember, useRemoveMember } from '../api/member-mutations';
import { projectMembersQuery } from '../api/project-queries';

export interface MemberManagement {
  /** Every account, to choose a new member from; undefined while it loads. */
  allUsers: readonly User[] | undefined;
  allUsersError?: unknown;
}

/** Who works on a project, with their roles; an admin adds and removes people here. */
export function ProjectMembers({ projectId, manage }: { projectId: number; manage?: MemberManagement }) {
  const members = useQuery(projectMembersQuery(projectId));
  if (members.isPending) return <Loading what="Loading people" />;
  if (members.isError) return <ErrorPanel error={members.error} retry={() => void members.refetch()} />;
  const items = members.data.items;
  return (
    <div className="space-y-3">
      {items.length === 0 ? (
        <p className="text-sm text-ink-soft dark:text-night-ink-soft">Nobody is on this project yet.</p>
      ) : (
        <ul className="divide-y divide-rule/70 dark:divide-night-rule/70">
          {items.map((member) => (
            <MemberRow key={member.id} projectId={projectId} member={member} canRemove={manage !== undefined} />
          ))}
        </ul>
      )}
      {manage && <AddMember projectId={projectId} members={items} manage={manage} />}
    </div>
  );
}

function MemberRow({ projectId, member, canRemove }: { projectId: number; member: User; canRemove: boolean }) {
  const [confirming, setConfirming] = useState(false);
  const remove = useRemoveMember(projectId);
  const keep = () => {
    remove.reset();
    setConfirming(false);
  };
  return (
    <li className="py-1.5 text-sm">
      <div className="flex items-center justify-between gap-2">
        <span className="min-w-0">
          <span className="block truncate font-medium">{member.displayName}</span>
          <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{ROLE_TITLES[member.role]}</span>
        </span>
        {canRemove && !confirming && (
          <Button variant="quiet" className="px-2 py-1 text-xs" onClick={() => setConfirming(true)} aria-label={`Remove ${member.displayName}`}>
            Remove
          </Button>
        )}
      </div>
      {confirming && (
        <div role="group" aria-label={`Confirm removing ${member.displayName}`} className="mt-1.5 rounded-md bg-short-soft p-2 text-xs text-short dark:bg-short/20 dark:text-short-bright">
          <p>
            Take {member.displayName} off this project?{member.role === 'admin' ? '' : ' They will no longer see it.'}
          </p>
          <div className="mt-1.5 flex gap-2">
            <Button variant="danger" className="px-2 py-1 text-xs" disabled={remove.isPending} onClick={() => remove.mutate(member.id, { onSuccess: () => setConfirming(false) })}>
              {remove.isPending ? 'Removing…' : 'Remove'}
            </Button>
            <Button variant="secondary" className="px-2 py-1 text-xs" autoFocus onClick={keep}>
              Keep
            </Button>
          </div>
          {remove.error && <p role="alert" className="mt-1.5">{remove.error.message}</p>}
        </div>
      )}
    </li>
  );
}

function AddMember({ projectId, members, manage }: { projectId: number; members: readonly User[]; manage: MemberManagement }) {
  const selectId = useId();
  const [userId, setUserId] = useState('');
  const add = useAddMember(projectId);
  if (manage.allUsersError) return <ErrorPanel error={manage.allUsersError} />;
  if (!manage.allUsers) return <Loading what="Loading accounts" />;
  const memberIds = new Set(members.map((m) => m.id));
  const candidates = manage.allUsers.filter((u) => !memberIds.has(u.id));
  if (candidates.length === 0) return <p className="text-xs text-ink-soft dark:text-night-ink-soft">Everyone with an account is on this project.</p>;
  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    if (userId) add.mutate(Number(userId), { onSuccess: () => setUserId('') });
  };
  return (
    <form onSubmit={onSubmit} className="border-t border-rule pt-3 dark:border-night-rule">
      <label htmlFor={selectId} className="mb-1 block text-xs font-medium">
        Add a person
      </label>
      <div className="flex gap-2">
        <select
          id={selectId}
          value={userId}
          onChange={(e) => {
            setUserId(e.target.value);
            add.reset();
          }}
          className="min-w-0 flex-1 rounded-md border border-rule bg-sheet px-2 py-1.5 text-sm dark:border-night-rule dark:bg-night"
        >
          <option value="">Choose…</option>
          {candidates.map((u) => (
            <option key={u.id} value={u.id}>
              {u.displayName} — {ROLE_TITLES[u.role]}
            </option>
          ))}
        </select>
        <Button type="submit" variant="secondary" className="px-2.5 py-1.5" disabled={!userId || add.isPending}>
          {add.isPending ? 'Adding…' : 'Add'}
        </Button>
      </div>
      {add.error && (
        <p role="alert" className="mt-1.5 text-xs text-short dark:text-short-bright">
          {add.error.message}
        </p>
      )}
    </form>
  );
}
