import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { LabRole } from '../../../../shared/lab-roles';

export const changeMemberRole = (slug: string, memberId: string, role: LabRole) =>
  api.patch<{ id: string; role: LabRole }>(`/api/labs/${encodeURIComponent(slug)}/members/${encodeURIComponent(memberId)}`, { role });

export function useChangeMemberRole(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: LabRole }) => changeMemberRole(slug, memberId, role),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['labs'] }),
  });
}
