import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { DraftView, MetadataProblem } from '../../../../shared/contracts';

export type SaveResult = { problems: MetadataProblem[]; savedAt: string };

export const saveMetadata = (slug: string, draftId: string, metadata: Record<string, unknown>, changelog?: string) =>
  api.put<SaveResult>(`/api/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}/metadata`, { metadata, changelog });

export function useSaveMetadata(slug: string, draftId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ metadata, changelog }: { metadata: Record<string, unknown>; changelog?: string }) => saveMetadata(slug, draftId, metadata, changelog),
    onSuccess: (r, v) =>
      qc.setQueryData<DraftView>(['drafts', draftId], (d) => (d ? { ...d, metadata: v.metadata, problems: r.problems } : d)),
    onSettled: () => qc.invalidateQueries({ queryKey: ['drafts', draftId] }),
  });
}
