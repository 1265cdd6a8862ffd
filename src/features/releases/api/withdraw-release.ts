import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const withdrawRelease = (labSlug: string, suffix: string, reason: string) =>
  api.post<{ withdrawn: boolean }>(`/api/labs/${encodeURIComponent(labSlug)}/releases/${encodeURIComponent(suffix)}/withdraw`, { reason });

export function useWithdrawRelease(labSlug: string, suffix: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (reason: string) => withdrawRelease(labSlug, suffix, reason), onSuccess: () => qc.invalidateQueries({ queryKey: ['releases'] }) });
}
