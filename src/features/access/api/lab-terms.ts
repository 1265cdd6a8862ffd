import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

// The lab's data-use terms: read and write are one resource, kept in one file.
export const getLabTerms = (slug: string) => api.get<{ version: number; body: string }>(`/api/labs/${encodeURIComponent(slug)}/terms`);
export const updateLabTerms = (slug: string, body: string) => api.put<{ version: number; body: string }>(`/api/labs/${encodeURIComponent(slug)}/terms`, { body });

export const labTermsQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'terms'], queryFn: () => getLabTerms(slug) });
export const useLabTerms = (slug: string) => useQuery(labTermsQueryOptions(slug));

export function useUpdateLabTerms(slug: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: string) => updateLabTerms(slug, body), onSuccess: (t) => qc.setQueryData(['labs', slug, 'terms'], t) });
}
