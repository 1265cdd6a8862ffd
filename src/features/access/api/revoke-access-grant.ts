import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const revokeAccessGrant = (slug: string, grantId: string) => api.post<{ revoked: boolean }>(`/api/labs/${encodeURIComponent(slug)}/access-grants/${encodeURIComponent(grantId)}/revoke`);

export function useRevokeAccessGrant(slug: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (grantId: string) => revokeAccessGrant(slug, grantId), onSuccess: () => qc.invalidateQueries({ queryKey: ['labs', slug, 'access-requests'] }) });
}
