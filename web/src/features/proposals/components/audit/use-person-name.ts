import { useQuery } from '@tanstack/react-query';
import type { User } from '#shared/api/users';
import { proposalPeopleQuery } from '../../api/proposal-queries';

/**
 * Names for user ids, from the project's members: "Priya Valcourt", "you" for the viewer, and
 * "user #7" for anyone not (or no longer) a member, or while the list loads.
 */
export function usePersonName(projectId: number, viewer?: Pick<User, 'id'>): (userId: number | null) => string {
  const { data } = useQuery({ ...proposalPeopleQuery(projectId), enabled: projectId > 0 });
  return (userId) => {
    if (userId === null) return 'the system';
    const person = data?.items.find((u) => u.id === userId);
    if (viewer?.id === userId) return person ? `${person.displayName} (you)` : 'you';
    return person?.displayName ?? `user #${userId}`;
  };
}
