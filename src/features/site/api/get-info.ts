import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type SiteInfo = { demo: boolean; doiPrefix: string; mailbox: boolean };

export const getInfo = () => api.get<SiteInfo>('/api/info');
export const infoQueryOptions = () => queryOptions({ queryKey: ['info'], queryFn: getInfo, staleTime: Infinity });
export const useInfo = () => useQuery(infoQueryOptions());
