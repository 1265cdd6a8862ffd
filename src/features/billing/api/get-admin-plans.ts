import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { StoragePlanView } from '../../../../shared/contracts';

export const getAdminPlans = () => api.get<StoragePlanView[]>('/api/admin/plans');
export const adminPlansQueryOptions = () => queryOptions({ queryKey: ['plans', 'all'], queryFn: getAdminPlans });
export const useAdminPlans = () => useQuery(adminPlansQueryOptions());
