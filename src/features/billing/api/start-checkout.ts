import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { CheckoutInput, CheckoutResult } from '../../../../shared/contracts';

export const startCheckout = (slug: string, input: CheckoutInput) => api.post<CheckoutResult>(`/api/labs/${encodeURIComponent(slug)}/billing/checkout`, input);

export function useStartCheckout(slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CheckoutInput) => startCheckout(slug, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['labs', slug, 'billing'] }),
  });
}
