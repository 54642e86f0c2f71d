import { useMutation, useQueryClient } from '@tanstack/react-query';
import { addMember, projectKeys, removeMember } from './project-queries';

/** Adds a person to a project; resolves once the member list is fetched again. */
export function useAddMember(projectId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => addMember(projectId, userId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.members(projectId) }),
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
