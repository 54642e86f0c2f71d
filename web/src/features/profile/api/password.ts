import { useMutation } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';

/** The signed-in person's own password change; answers how many of their other sessions ended. */
export function changeOwnPassword(body: { currentPassword: string; newPassword: string }): Promise<{ endedSessions: number }> {
  return apiClient.post<{ endedSessions: number }>(api.ownPassword, body);
}

export function useChangeOwnPassword() {
  return useMutation({ mutationFn: changeOwnPassword });
}

/** A new password through a one-time reset link's token; answers the account's e-mail address. */
export function completePasswordReset(body: { token: string; newPassword: string }): Promise<{ email: string }> {
  return apiClient.post<{ email: string }>(api.passwordReset, body);
}
