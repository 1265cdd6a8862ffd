import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { IngestOptionsInput } from '../../../../shared/contracts';

export const reingestFile = (slug: string, draftId: string, fileId: string, options: IngestOptionsInput) =>
  api.post<{ state: string }>(`/api/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}/files/${encodeURIComponent(fileId)}/ingest`, options);

export function useReingestFile(slug: string, draftId: string, fileId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (options: IngestOptionsInput) => reingestFile(slug, draftId, fileId, options),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['drafts', draftId] }),
  });
}
