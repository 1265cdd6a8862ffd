import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type Terms = { labName: string; version: number; body: string };

export const getReleaseTerms = (suffix: string) => api.get<Terms>(`/api/releases/${encodeURIComponent(suffix)}/terms`);
export const releaseTermsQueryOptions = (suffix: string) => queryOptions({ queryKey: ['releases', suffix, 'terms'], queryFn: () => getReleaseTerms(suffix) });
export const useReleaseTerms = (suffix: string, enabled: boolean) => useQuery({ ...releaseTermsQueryOptions(suffix), enabled });
