import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { AdminLab } from '../../../../shared/contracts';

export const getAdminLabs = () => api.get<AdminLab[]>('/api/admin/labs');
export const adminLabsQueryOptions = () => queryOptions({ queryKey: ['admin', 'labs'], queryFn: getAdminLabs });
export const useAdminLabs = () => useQuery(adminLabsQueryOptions());
