import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { AccessRequestView } from '../../../../shared/contracts';

export const getMyAccess = () => api.get<AccessRequestView[]>('/api/me/access');
export const myAccessQueryOptions = () => queryOptions({ queryKey: ['me', 'access'], queryFn: getMyAccess });
export const useMyAccess = (enabled = true) => useQuery({ ...myAccessQueryOptions(), enabled });
