import { ROLE_TITLES, type Role } from '#shared/workflow/roles';

/** What each role comes here to do, as the end of "Open a project to …". */
const ROLE_TASKS = {
  requirements: 'write or revise a spec, then ask the engine for a proposal',
  designer: 'weigh ranked tail options and decide',
  reviewer: 'check decided proposals against their reasons, then sign them off or send them back for rework',
} as const;

/**
 * The page's lead sentence for the roles a person holds: one "Open a project to …" sentence, the
 * tasks of several project roles each named by the role ("where you are reviewer").
 */
export function roleHint(roles: readonly Role[]): string {
  const parts: string[] = [];
  if (roles.includes('admin')) parts.push('Create projects, add people to them, and manage accounts under People.');
  const projectRoles = roles.filter((role): role is keyof typeof ROLE_TASKS => role in ROLE_TASKS);
  if (projectRoles.length === 1) parts.push(`Open a project to ${ROLE_TASKS[projectRoles[0]!]}.`);
  else if (projectRoles.length > 1) {
    const tasks = projectRoles.map((role) => `${ROLE_TASKS[role]} where you are ${ROLE_TITLES[role].toLowerCase()}`);
    parts.push(`Open a project to ${tasks.slice(0, -1).join('; ')}; or ${tasks.at(-1)}.`);
  }
  return parts.join(' ');
}
