import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const setLabDescription = (slug: string, description: string) =>
  api.put<{ description: string | null }>(`/api/labs/${encodeURIComponent(slug)}/description`, { description });

export function useSetLabDescription(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (description: string) => setLabDescription(slug, description),
    // The management page (['labs', slug]) and the public page show it.
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: ['lab-profiles', slug] }), qc.invalidateQueries({ queryKey: ['labs', slug] })]),
  });
}
