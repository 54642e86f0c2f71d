/**
 * Roles and what each may do: the one table both the server (requirePermission) and the
 * browser (what to show) read. Pure data.
 */
export const ROLES = ['admin', 'requirements', 'designer', 'reviewer'] as const;
export type Role = (typeof ROLES)[number];

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
