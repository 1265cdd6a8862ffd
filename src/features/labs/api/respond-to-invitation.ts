import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const respondToInvitation = (id: string, answer: 'accept' | 'reject') =>
  api.post<{ labSlug: string; status: string }>(`/api/invitations/${encodeURIComponent(id)}/${answer}`);

export function useRespondToInvitation(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (answer: 'accept' | 'reject') => respondToInvitation(id, answer),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ['invitations', id] });
      void qc.invalidateQueries({ queryKey: ['labs'] });
    },
  });
}
