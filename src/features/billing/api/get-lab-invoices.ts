import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { InvoiceView } from '../../../../shared/contracts';

export const getLabInvoices = (slug: string) => api.get<InvoiceView[]>(`/api/labs/${encodeURIComponent(slug)}/billing/invoices`);
export const labInvoicesQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'billing', 'invoices'], queryFn: () => getLabInvoices(slug) });
export const useLabInvoices = (slug: string) => useQuery(labInvoicesQueryOptions(slug));
