import { useMutation } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { PasswordChanged, PasswordChangeInput, PasswordResetDone, PasswordResetInput } from '#shared/api/users';

/** The signed-in person's own password change; answers how many of their other sessions ended. */
export function changeOwnPassword(body: PasswordChangeInput): Promise<PasswordChanged> {
  return apiClient.post<PasswordChanged>(api.ownPassword, body);
}

export function useChangeOwnPassword() {
  return useMutation({ mutationFn: changeOwnPassword });
}

/** A new password through a one-time reset link's token; answers the account's e-mail address. */
export function completePasswordReset(body: PasswordResetInput): Promise<PasswordResetDone> {
  return apiClient.post<PasswordResetDone>(api.passwordReset, body);
}
