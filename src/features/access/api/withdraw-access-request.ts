import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const withdrawAccessRequest = (id: string) => api.post<{ state: string }>(`/api/me/access-requests/${encodeURIComponent(id)}/withdraw`);

export function useWithdrawAccessRequest() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: withdrawAccessRequest, onSuccess: () => qc.invalidateQueries({ queryKey: ['me', 'access'] }) });
}
