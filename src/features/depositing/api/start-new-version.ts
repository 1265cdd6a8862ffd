import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const startNewVersion = (slug: string, datasetId: string) =>
  api.post<{ draftId: string }>(`/api/labs/${encodeURIComponent(slug)}/datasets/${encodeURIComponent(datasetId)}/versions`);

export function useStartNewVersion(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (datasetId: string) => startNewVersion(slug, datasetId),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['labs', slug, 'datasets'] }),
  });
}
