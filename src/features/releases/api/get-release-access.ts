import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type ReleaseAccess = { allowed: boolean; reason: string; bundleReady: boolean; downloads: { total: number; unique: number } };

export const getReleaseAccess = (suffix: string) => api.get<ReleaseAccess>(`/api/releases/${encodeURIComponent(suffix)}/access`);
export const releaseAccessQueryOptions = (suffix: string) =>
  queryOptions({
    queryKey: ['releases', suffix, 'access'],
    queryFn: () => getReleaseAccess(suffix),
    // The bundle is built just after publication: look again until it is there.
    refetchInterval: (q) => (q.state.data && !q.state.data.bundleReady && q.state.data.allowed ? 3000 : false),
  });
export const useReleaseAccess = (suffix: string) => useQuery(releaseAccessQueryOptions(suffix));

export const fileDownloadUrl = (suffix: string, fileName: string) => `/api/releases/${encodeURIComponent(suffix)}/files/${encodeURIComponent(fileName)}/download`;
export const bundleDownloadUrl = (suffix: string) => `/api/releases/${encodeURIComponent(suffix)}/bundle`;
