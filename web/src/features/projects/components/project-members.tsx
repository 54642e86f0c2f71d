import { useQuery } from '@tanstack/react-query';
import { useId, useState, type FormEvent } from 'react';
import { ACCOUNT_ROLE_TITLES, PROJECT_ROLES, ROLE_TITLES, type ProjectRole } from '#shared/workflow/roles';
import { Button } from '../../../components/ui/button';
import { ErrorPanel, Loading } from '../../../components/ui/feedback';
import type { ProjectMember } from '#shared/api/projects';
import type { User } from '#shared/api/users';
import { useAddMember, useRemoveMember } from '../api/member-mutations';
import { projectMembersQuery } from '../api/project-queries';

export interface MemberManagement {
  /** Every account, to choose a new member from; undefined while it loads. */
  allUsers: readonly User[] | undefined;
  allUsersError?: unknown;
}

/** Who works on a project, with the role each holds in it; an admin adds people with a role, changes roles and removes people here. */
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
            <MemberRow key={member.id} projectId={projectId} member={member} canManage={manage !== undefined} />
          ))}
        </ul>
      )}
      {manage && <AddMember projectId={projectId} members={items} manage={manage} />}
    </div>
  );
}

/** The role held in this project in words (an administrator's membership may carry none). */
const roleWords = (member: ProjectMember) => (member.projectRole ? ROLE_TITLES[member.projectRole] : member.role === 'admin' ? ACCOUNT_ROLE_TITLES.admin : 'No role here');

function MemberRow({ projectId, member, canManage }: { projectId: number; member: ProjectMember; canManage: boolean }) {
  const [confirming, setConfirming] = useState(false);
  const remove = useRemoveMember(projectId);
  const setRole = useAddMember(projectId);
  const canRemove = canManage;
  const keep = () => {
    remove.reset();
    setConfirming(false);
  };
  return (
    <li className="py-1.5 text-sm">
      <div className="flex items-center justify-between gap-2">
        <span className="min-w-0 truncate font-medium">{member.displayName}</span>
        {canRemove && !confirming && (
          <Button variant="quiet" className="shrink-0 px-2 py-1 text-xs" onClick={() => setConfirming(true)} aria-label={`Remove ${member.displayName}`}>
            Remove
          </Button>
        )}
      </div>
      {canManage ? (
        <select
          aria-label={`Role of ${member.displayName} in this project`}
          value={member.projectRole ?? ''}
          disabled={setRole.isPending}
          onChange={(e) => e.target.value && setRole.mutate({ userId: member.id, role: e.target.value as ProjectRole })}
          className="mt-0.5 w-full rounded-md border border-rule bg-sheet px-1.5 py-0.5 text-xs dark:border-night-rule dark:bg-night"
        >
          {member.projectRole === null && <option value="">{roleWords(member)}</option>}
          {PROJECT_ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_TITLES[role]}
            </option>
          ))}
        </select>
      ) : (
        <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{roleWords(member)}</span>
      )}
      {setRole.error && (
        <p role="alert" className="mt-1 text-xs text-short dark:text-short-bright">
          The role was not changed: {setRole.error.message}
        </p>
      )}
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

function AddMember({ projectId, members, manage }: { projectId: number; members: readonly ProjectMember[]; manage: MemberManagement }) {
  const selectId = useId();
  const roleId = useId();
  const [userId, setUserId] = useState('');
  const [role, setRole] = useState<ProjectRole>('designer');
  const add = useAddMember(projectId);
  if (manage.allUsersError) return <ErrorPanel error={manage.allUsersError} />;
  if (!manage.allUsers) return <Loading what="Loading accounts" />;
  const memberIds = new Set(members.map((m) => m.id));
  const candidates = manage.allUsers.filter((u) => !memberIds.has(u.id));
  if (candidates.length === 0) return <p className="text-xs text-ink-soft dark:text-night-ink-soft">Everyone with an account is on this project.</p>;
  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    if (userId) add.mutate({ userId: Number(userId), role }, { onSuccess: () => setUserId('') });
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
              {u.displayName}
              {u.role === 'admin' ? ` — ${ACCOUNT_ROLE_TITLES.admin}` : ''}
            </option>
          ))}
        </select>
      </div>
      <label htmlFor={roleId} className="mt-2 mb-1 block text-xs font-medium">
        Their role in this project
      </label>
      <div className="flex gap-2">
        <select
          id={roleId}
          value={role}
          onChange={(e) => {
            setRole(e.target.value as ProjectRole);
            add.reset();
          }}
          className="min-w-0 flex-1 rounded-md border border-rule bg-sheet px-2 py-1.5 text-sm dark:border-night-rule dark:bg-night"
        >
          {PROJECT_ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_TITLES[r]}
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
