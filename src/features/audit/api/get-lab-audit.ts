import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { AuditPage } from '../../../../shared/contracts';
import { auditSearch, type AuditFilters } from './audit-filters';

export const labAuditPath = (slug: string) => `/api/labs/${encodeURIComponent(slug)}/audit`;

export const getLabAudit = (slug: string, filters: AuditFilters, cursor?: string) => api.get<AuditPage>(`${labAuditPath(slug)}${auditSearch(filters, { cursor, limit: '50' })}`);

export const labAuditQueryOptions = (slug: string, filters: AuditFilters) =>
  infiniteQueryOptions({
    queryKey: ['labs', slug, 'audit', filters],
    queryFn: ({ pageParam }) => getLabAudit(slug, filters, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export const useLabAudit = (slug: string, filters: AuditFilters) => useInfiniteQuery(labAuditQueryOptions(slug, filters));
