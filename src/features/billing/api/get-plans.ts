import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { StoragePlanView } from '../../../../shared/contracts';

export const getPlans = () => api.get<StoragePlanView[]>('/api/plans');
export const plansQueryOptions = () => queryOptions({ queryKey: ['plans', 'offered'], queryFn: getPlans });
export const usePlans = () => useQuery(plansQueryOptions());
