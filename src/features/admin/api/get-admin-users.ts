import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { AdminUser } from '../../../../shared/contracts';

export const getAdminUsers = () => api.get<AdminUser[]>('/api/admin/users');
export const adminUsersQueryOptions = () => queryOptions({ queryKey: ['admin', 'users'], queryFn: getAdminUsers });
export const useAdminUsers = () => useQuery(adminUsersQueryOptions());
