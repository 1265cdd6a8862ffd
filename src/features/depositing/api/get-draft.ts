import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { DraftView } from '../../../../shared/contracts';

const BUSY = ['uploading', 'queued', 'ingesting', 'verifying'];

export const getDraft = (slug: string, draftId: string) => api.get<DraftView>(`/api/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}`);

export const draftQueryOptions = (slug: string, draftId: string) =>
  queryOptions({
    queryKey: ['drafts', draftId],
    queryFn: () => getDraft(slug, draftId),
    // Live ingest progress: poll while any file is being checked.
    refetchInterval: (q) => (q.state.data?.files.some((f) => BUSY.includes(f.state) && f.state !== 'uploading') ? 1000 : false),
  });

export const useDraft = (slug: string, draftId: string) => useQuery(draftQueryOptions(slug, draftId));
