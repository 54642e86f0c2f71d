import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProjectRole } from '#shared/workflow/roles';
import { authKeys } from '../../../lib/auth-queries';
import { addMember, removeMember } from './project-queries';
import { projectKeys } from '../../../lib/query-keys';

/** Adds a person to a project with their role there, or changes that role; resolves once the member list (and your own roles) are fetched again. */
export function useAddMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: number; role: ProjectRole }) => addMember(projectId, userId, role),
    onSuccess: () => Promise.all([queryClient.invalidateQueries({ queryKey: projectKeys.members(projectId) }), queryClient.invalidateQueries({ queryKey: authKeys.me() })]),
  });
}

/** Takes a person off a project; resolves once the member list is fetched again. */
export function useRemoveMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => removeMember(projectId, userId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.members(projectId) }),
  });
}
