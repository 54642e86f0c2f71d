/**
 * Roles and what each may do: the one table both the server (requirePermission, projectFor) and
 * the browser (what to show) read. Pure data.
 *
 * A person's roles: the account is an administrator or a member (the only global role); each
 * project membership carries the role the person holds in that project (systems engineer,
 * designer or reviewer), so one person may design in one project and review in another.
 */
export const ROLES = ['admin', 'requirements', 'designer', 'reviewer'] as const;
export type Role = (typeof ROLES)[number];

/** The roles a project membership carries. */
export const PROJECT_ROLES = ['requirements', 'designer', 'reviewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];

/** The account's own (global) role: administrators, and everybody else. */
export const ACCOUNT_ROLES = ['admin', 'member'] as const;
export type AccountRole = (typeof ACCOUNT_ROLES)[number];

export const ACCOUNT_ROLE_TITLES: Record<AccountRole, string> = {
  admin: 'Administrator',
  member: 'Member',
};

export const ROLE_TITLES: Record<Role, string> = {
  admin: 'Administrator',
  requirements: 'Systems engineer (requirements)',
  designer: 'Circuit designer',
  reviewer: 'Reviewer',
};

/** Every action a route may require. */
export type Action =
  | 'users:manage'
  | 'projects:create'
  | 'projects:read-all'
  | 'members:manage'
  | 'specs:write'
  | 'proposals:create'
  | 'proposals:decide'
  | 'proposals:review'
  | 'proposals:verify'
  | 'proposals:withdraw'
  | 'proposals:comment'
  | 'devices:write'
  | 'measurements:write'
  | 'mail:read';

/** Which roles may take each action (anything not listed is refused). */
export const PERMISSIONS: Record<Action, readonly Role[]> = {
  'users:manage': ['admin'],
  'projects:create': ['admin'],
  'projects:read-all': ['admin'],
  'members:manage': ['admin'],
  'specs:write': ['requirements'],
  'proposals:create': ['requirements', 'designer'],
  'proposals:decide': ['designer'],
  'proposals:review': ['reviewer'],
  /** Ask for a SPICE verification or Monte Carlo run (reading results needs only project access). */
  'proposals:verify': ['designer', 'reviewer'],
  /** Withdraw an open proposal with a reason: a designer, or the person who asked for it (the service checks authorship). */
  'proposals:withdraw': ['requirements', 'designer'],
  /** Comment on a check, a figure or a SPICE result of an option, reply, resolve and reopen threads (reading needs only project access). */
  'proposals:comment': ['designer', 'reviewer'],
  /** Upload SPICE .model cards to a project's device library (reading it needs only project access). */
  'devices:write': ['requirements', 'designer'],
  /** Upload bench measurements of a decided design (bench engineers are designers here; reading needs only project access). */
  'measurements:write': ['designer', 'reviewer'],
  /** Read the messages the built-in local mail server received (the demo mailbox). */
  'mail:read': ['admin'],
};

/** Whether a role may take an action. */
export function may(role: Role, action: Action): boolean {
  return PERMISSIONS[action].includes(role);
}

/** Whether the action is about a project's records (some project role may take it); the others are the administrator's alone. */
export function isProjectAction(action: Action): boolean {
  return PERMISSIONS[action].some((role) => role !== 'admin');
}

/** The roles a person acts with in one project: the administrator role (everywhere) and the membership's role. */
export function rolesIn(accountRole: AccountRole, projectRole: ProjectRole | null | undefined): Role[] {
  return [...(accountRole === 'admin' ? (['admin'] as const) : []), ...(projectRole ? [projectRole] : [])];
}

/** Whether a person may take an action in a project, by the role held there (null: no membership or no role in it). */
export function mayIn(accountRole: AccountRole, projectRole: ProjectRole | null | undefined, action: Action): boolean {
  return rolesIn(accountRole, projectRole).some((role) => may(role, action));
}

/** A membership as the signed-in person's record carries it. */
export interface ProjectRoleOf {
  projectId: number;
  role: ProjectRole | null;
}

/** Whether the person may take the action in at least one project (or, for the administrator's actions, at all). */
export function mayAnywhere(accountRole: AccountRole, projectRoles: readonly ProjectRoleOf[], action: Action): boolean {
  return mayIn(accountRole, null, action) || (isProjectAction(action) && projectRoles.some((m) => mayIn(accountRole, m.role, action)));
}

/** The role the person holds in a project, from the signed-in person's record (null: none). */
export function projectRoleOf(projectRoles: readonly ProjectRoleOf[] | undefined, projectId: number): ProjectRole | null {
  return projectRoles?.find((m) => m.projectId === projectId)?.role ?? null;
}

/** A signed-in person as the server answers `GET /api/auth/me`: the account's role and the role held in each project. */
export interface PersonRoles {
  role: AccountRole;
  projectRoles?: readonly ProjectRoleOf[];
}

/**
 * Whether the person may take the action in a project (the role held there, or the
 * administrator's), or, with `projectId` null, as the account alone (the administrator's actions).
 * What the browser shows; the server decides the same way.
 */
export function mayAs(person: PersonRoles, projectId: number | null, action: Action): boolean {
  return mayIn(person.role, projectId === null ? null : projectRoleOf(person.projectRoles, projectId), action);
}

/** The roles a person holds anywhere (the administrator's, and each project's), without repeats, in the table's order. */
export function heldRoles(person: PersonRoles): Role[] {
  const held = new Set<Role>(rolesIn(person.role, null));
  for (const membership of person.projectRoles ?? []) if (membership.role) held.add(membership.role);
  return ROLES.filter((role) => held.has(role));
}

/** Their titles (e.g. for a header). */
export function heldRoleTitles(person: PersonRoles): string[] {
  return heldRoles(person).map((role) => ROLE_TITLES[role]);
}
