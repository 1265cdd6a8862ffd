import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { AccessRequestView } from '../../../../shared/contracts';

export const getLabAccessRequests = (slug: string, state: string) =>
  api.get<AccessRequestView[]>(`/api/labs/${encodeURIComponent(slug)}/access-requests${state ? `?state=${encodeURIComponent(state)}` : ''}`);
export const labAccessRequestsQueryOptions = (slug: string, state: string) =>
  queryOptions({ queryKey: ['labs', slug, 'access-requests', state], queryFn: () => getLabAccessRequests(slug, state) });
export const useLabAccessRequests = (slug: string, state: string) => useQuery(labAccessRequestsQueryOptions(slug, state));
