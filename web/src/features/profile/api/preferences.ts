import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Me, PreferencesInput, SessionUser } from '#shared/api/users';
import { authKeys } from '../../../lib/auth-queries';

export function updatePreferences(changes: PreferencesInput): Promise<SessionUser> {
  return apiClient.patch<Me>(api.me, changes).then((answer) => answer.user);
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
