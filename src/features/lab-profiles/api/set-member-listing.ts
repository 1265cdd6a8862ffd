import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const setMemberListing = (slug: string, listed: boolean) => api.put<{ listed: boolean }>(`/api/labs/${encodeURIComponent(slug)}/listing`, { listed });

export function useSetMemberListing(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (listed: boolean) => setMemberListing(slug, listed),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['lab-profiles', slug] }),
  });
}
