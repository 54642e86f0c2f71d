import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AccountRole } from '#shared/workflow/roles';
import { createUser, sendPasswordReset, updateUser, userKeys, type NewUser } from './user-queries';

/**
 * Account changes. Each resolves once the user list is fetched again; `alsoRefresh` lets the
 * page refresh what else shows names and roles (project member lists, the signed-in user).
 */
export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: NewUser) => createUser(body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.all }),
  });
}

export function useUpdateUser(alsoRefresh?: () => Promise<unknown>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: { displayName?: string; role?: AccountRole; disabled?: boolean } }) => updateUser(id, changes),
    onSuccess: () => Promise.all([queryClient.invalidateQueries({ queryKey: userKeys.all }), alsoRefresh?.()]),
  });
}

/** An administrator mails someone a one-time password link (nothing on the page changes). */
export function useSendPasswordReset() {
  return useMutation({ mutationFn: (id: number) => sendPasswordReset(id) });
}
