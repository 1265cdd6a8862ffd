import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { DecideAccessInput } from '../../../../shared/contracts';

export const decideAccessRequest = (slug: string, id: string, input: DecideAccessInput) =>
  api.post<{ state: string }>(`/api/labs/${encodeURIComponent(slug)}/access-requests/${encodeURIComponent(id)}/decision`, input);

export function useDecideAccessRequest(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: DecideAccessInput }) => decideAccessRequest(slug, id, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['labs', slug, 'access-requests'] }),
  });
}
