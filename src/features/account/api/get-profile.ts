import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { Profile } from '../../../../shared/contracts';

export const getProfile = () => api.get<Profile>('/api/me');
export const profileQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getProfile });
export const useProfile = () => useQuery(profileQueryOptions());
