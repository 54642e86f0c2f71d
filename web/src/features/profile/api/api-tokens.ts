import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../config/paths';
import { apiClient } from '../../../lib/api';
import type { ApiToken, ApiTokenInput, NewApiToken } from '#shared/api/users';

const tokensKey = ['auth', 'api-tokens'] as const;

/** Your personal API tokens, newest first (never the tokens themselves). */
export function useApiTokens() {
  return useQuery({ queryKey: tokensKey, queryFn: () => apiClient.get<{ items: ApiToken[] }>(api.apiTokens).then((answer) => answer.items) });
}

/** A new token: the answer holds the token, shown this once. */
export function useCreateApiToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ApiTokenInput) => apiClient.post<NewApiToken>(api.apiTokens, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokensKey }),
  });
}

export function useRevokeApiToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiClient.delete<ApiToken>(api.apiToken(id)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokensKey }),
  });
}
