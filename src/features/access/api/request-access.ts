import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { RequestAccessInput } from '../../../../shared/contracts';

export const requestAccess = (suffix: string, input: RequestAccessInput) =>
  api.post<{ id: string; state: string }>(`/api/releases/${encodeURIComponent(suffix)}/access-requests`, input);

export function useRequestAccess(suffix: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (input: RequestAccessInput) => requestAccess(suffix, input), onSuccess: () => qc.invalidateQueries({ queryKey: ['me', 'access'] }) });
}
