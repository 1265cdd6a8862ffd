import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { CreateDatasetInput } from '../../../../shared/contracts';

export type CreatedDataset = { datasetId: string; draftId: string; suffix: string; doi: string };

export const createDataset = (slug: string, input: CreateDatasetInput) => api.post<CreatedDataset>(`/api/labs/${encodeURIComponent(slug)}/datasets`, input);

export function useCreateDataset(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateDatasetInput) => createDataset(slug, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['labs', slug, 'datasets'] }),
  });
}
