import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const getFilePreview = (slug: string, draftId: string, fileId: string) =>
  api.get<{ lines: string[] }>(`/api/labs/${encodeURIComponent(slug)}/drafts/${encodeURIComponent(draftId)}/files/${encodeURIComponent(fileId)}/preview`);

export const filePreviewQueryOptions = (slug: string, draftId: string, fileId: string) =>
  queryOptions({ queryKey: ['drafts', draftId, 'files', fileId, 'preview'], queryFn: () => getFilePreview(slug, draftId, fileId), staleTime: Infinity });

export const useFilePreview = (slug: string, draftId: string, fileId: string, enabled: boolean) => useQuery({ ...filePreviewQueryOptions(slug, draftId, fileId), enabled });
