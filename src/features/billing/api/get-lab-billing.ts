import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { LabBillingView } from '../../../../shared/contracts';

export const getLabBilling = (slug: string) => api.get<LabBillingView>(`/api/labs/${encodeURIComponent(slug)}/billing`);
export const labBillingQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'billing'], queryFn: () => getLabBilling(slug) });

/** `pollMs` while waiting for the payment provider's webhook after a checkout. */
export const useLabBilling = (slug: string, pollMs?: number | false) => useQuery({ ...labBillingQueryOptions(slug), refetchInterval: pollMs ?? false });
