import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Items } from '#shared/api/lists';
import type { NewUser, PasswordResetIssued, User, UserChanges } from '#shared/api/users';

export type { NewUser };

export const userKeys = {
  all: ['users'] as const,
  list: () => ['users', 'list'] as const,
};

/** Every account (admins only: anyone else gets a 403). */
export const userListQuery = () => queryOptions({ queryKey: userKeys.list(), queryFn: () => apiClient.get<Items<User>>(api.users) });

export function createUser(body: NewUser): Promise<User> {
  return apiClient.post<User>(api.users, body);
}

export function updateUser(id: number, changes: UserChanges): Promise<User> {
  return apiClient.patch<User>(api.user(id), changes);
}

/** Mails the person a one-time link to set a new password; answers when it stops working. */
export function sendPasswordReset(id: number): Promise<PasswordResetIssued> {
  return apiClient.post<PasswordResetIssued>(api.userPasswordReset(id));
}
