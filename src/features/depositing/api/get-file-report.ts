import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { DraftFileView, IngestOptionsInput } from '../../../../shared/contracts';

export type FileReport = { file: DraftFileView; result: Record<string, any> | null; ingestOptions: IngestOptionsInput };

export const getFileReport = (slug: string, draftId: string, fileId: string) =>
  api.get<FileReport>(`/api/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}/files/${encodeURIComponent(fileId)}`);

export const fileReportQueryOptions = (slug: string, draftId: string, fileId: string) =>
  queryOptions({
    queryKey: ['drafts', draftId, 'files', fileId],
    queryFn: () => getFileReport(slug, draftId, fileId),
    refetchInterval: (q) => (['queued', 'ingesting', 'verifying'].includes(q.state.data?.file.state ?? '') ? 1000 : false),
  });

export const useFileReport = (slug: string, draftId: string, fileId: string) => useQuery(fileReportQueryOptions(slug, draftId, fileId));
