import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { LabDetail } from '../../../../shared/contracts';

export const getLab = (slug: string) => api.get<LabDetail>(`/api/labs/${encodeURIComponent(slug)}`);
export const labQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug], queryFn: () => getLab(slug) });
export const useLab = (slug: string) => useQuery(labQueryOptions(slug));
