import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { LabProfile } from '../../../../shared/contracts';

export const getLabProfile = (slug: string) => api.get<LabProfile>(`/api/labs/${encodeURIComponent(slug)}/profile`);
export const labProfileQueryOptions = (slug: string) => queryOptions({ queryKey: ['lab-profiles', slug], queryFn: () => getLabProfile(slug) });
export const useLabProfile = (slug: string) => useQuery(labProfileQueryOptions(slug));
