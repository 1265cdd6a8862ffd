import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const getLabDownloads = (slug: string) => api.get<Array<{ month: string; downloads: number }>>(`/api/labs/${encodeURIComponent(slug)}/downloads`);
export const labDownloadsQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'downloads'], queryFn: () => getLabDownloads(slug) });
export const useLabDownloads = (slug: string, enabled = true) => useQuery({ ...labDownloadsQueryOptions(slug), enabled });
