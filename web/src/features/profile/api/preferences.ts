import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { User } from '../../../lib/api-types';
import { authKeys } from '../../../lib/auth-queries';

export function updatePreferences(changes: { notify: boolean }): Promise<User> {
  return apiClient.patch<{ user: User }>(api.me, changes).then((answer) => answer.user);
}

/** Changes the signed-in person's own preferences; resolves once the signed-in user is fetched again. */
export function useUpdatePreferences() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePreferences,
    onSuccess: async (user) => {
      queryClient.setQueryData(authKeys.me(), user);
      await queryClient.invalidateQueries({ queryKey: authKeys.me() });
    },
  });
}
