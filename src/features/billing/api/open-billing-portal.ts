import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const openBillingPortal = (slug: string) => api.post<{ url: string }>(`/api/labs/${encodeURIComponent(slug)}/billing/portal`);

export const useOpenBillingPortal = (slug: string) => useMutation({ mutationFn: () => openBillingPortal(slug) });
