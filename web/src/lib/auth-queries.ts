import { queryOptions } from '@tanstack/react-query';
import { api } from '../config/paths';
import { ApiError, apiClient } from './api';
import type { Me, SessionUser, SignedIn } from '#shared/api/users';

export const authKeys = { all: ['auth'] as const, me: () => ['auth', 'me'] as const };

/** The signed-in user, or null when nobody is signed in (401 is an answer, not an error). */
export const meQuery = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: async (): Promise<SessionUser | null> => {
      try {
        return (await apiClient.get<Me>(api.me)).user;
      } catch (error) {
        if (error instanceof ApiError && error.status === 401) return null;
        throw error;
      }
    },
    staleTime: 60_000,
  });

export async function signIn(email: string, password: string): Promise<SessionUser> {
  apiClient.resetCsrf();
  const { user } = await apiClient.post<SignedIn>(api.login, { email, password });
  apiClient.resetCsrf();
  return user;
}

export async function signOut(): Promise<void> {
  await apiClient.post(api.logout);
  apiClient.resetCsrf();
}
