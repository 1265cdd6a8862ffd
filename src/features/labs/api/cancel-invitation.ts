import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const cancelInvitation = (slug: string, id: string) =>
  api.delete<void>(`/api/labs/${encodeURIComponent(slug)}/invitations/${encodeURIComponent(id)}`);

export function useCancelInvitation(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => cancelInvitation(slug, id),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['labs', slug] }),
  });
}
