import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { StoragePlanView, UpdatePlanInput } from '../../../../shared/contracts';

export const updatePlan = (id: string, input: UpdatePlanInput) => api.patch<StoragePlanView>(`/api/admin/plans/${encodeURIComponent(id)}`, input);

export function useUpdatePlan() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: UpdatePlanInput }) => updatePlan(id, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['plans'] }),
  });
}
