import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ApiTokenView, CreateTokenInput } from '../../../../shared/contracts';

// The caller's API tokens: list, create, revoke — one resource, one file.
export const getApiTokens = () => api.get<ApiTokenView[]>('/api/me/tokens');
export const createApiToken = (input: CreateTokenInput) => api.post<{ id: string; name: string; scopes: string[]; token: string }>('/api/me/tokens', input);
export const revokeApiToken = (id: string) => api.delete<void>(`/api/me/tokens/${encodeURIComponent(id)}`);

export const apiTokensQueryOptions = () => queryOptions({ queryKey: ['me', 'tokens'], queryFn: getApiTokens });
export const useApiTokens = () => useQuery(apiTokensQueryOptions());

export function useCreateApiToken() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createApiToken, onSuccess: () => qc.invalidateQueries({ queryKey: ['me', 'tokens'] }) });
}
export function useRevokeApiToken() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: revokeApiToken, onSuccess: () => qc.invalidateQueries({ queryKey: ['me', 'tokens'] }) });
}
