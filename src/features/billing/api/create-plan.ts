import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { CreatePlanInput, StoragePlanView } from '../../../../shared/contracts';

export const createPlan = (input: CreatePlanInput) => api.post<StoragePlanView>('/api/admin/plans', input);

export function useCreatePlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createPlan, onSuccess: () => qc.invalidateQueries({ queryKey: ['plans'] }) });
}
