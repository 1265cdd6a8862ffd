import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { InviteMemberInput } from '../../../../shared/contracts';

export const inviteMember = (slug: string, input: InviteMemberInput) =>
  api.post<{ id: string }>(`/api/labs/${encodeURIComponent(slug)}/invitations`, input);

export function useInviteMember(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteMemberInput) => inviteMember(slug, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['labs', slug] }),
  });
}
