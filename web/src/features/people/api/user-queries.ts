import { queryOptions } from '@tanstack/react-query';
import type { AccountRole } from '../../../../../shared/workflow/roles';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { Items, User } from '../../../lib/api-types';

export const userKeys = {
  all: ['users'] as const,
  list: () => ['users', 'list'] as const,
};

/** Every account (admins only: anyone else gets a 403). */
export const userListQuery = () => queryOptions({ queryKey: userKeys.list(), queryFn: () => apiClient.get<Items<User>>(api.users) });

export interface NewUser {
  email: string;
  displayName: string;
  role: AccountRole;
  password: string;
}

export function createUser(body: NewUser): Promise<User> {
  return apiClient.post<User>(api.users, body);
}

export function updateUser(id: number, changes: { displayName?: string; role?: AccountRole; disabled?: boolean }): Promise<User> {
  return apiClient.patch<User>(api.user(id), changes);
}

/** Mails the person a one-time link to set a new password; answers when it stops working. */
export function sendPasswordReset(id: number): Promise<{ expiresAt: string }> {
  return apiClient.post<{ expiresAt: string }>(api.userPasswordReset(id));
}
