import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { AuditPage } from '../../../../shared/contracts';
import { auditSearch, type AuditFilters } from './audit-filters';

export const adminAuditPath = '/api/admin/audit';

export const getAdminAudit = (filters: AuditFilters, cursor?: string) => api.get<AuditPage>(`${adminAuditPath}${auditSearch(filters, { cursor, limit: '50' })}`);

export const adminAuditQueryOptions = (filters: AuditFilters) =>
  infiniteQueryOptions({
    queryKey: ['admin', 'audit', filters],
    queryFn: ({ pageParam }) => getAdminAudit(filters, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export const useAdminAudit = (filters: AuditFilters) => useInfiniteQuery(adminAuditQueryOptions(filters));
