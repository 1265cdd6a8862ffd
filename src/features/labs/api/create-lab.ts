import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { CreateLabInput, LabSummary } from '../../../../shared/contracts';

export const createLab = (input: CreateLabInput) => api.post<LabSummary>('/api/labs', input);

export function useCreateLab() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createLab, onSuccess: () => qc.invalidateQueries({ queryKey: ['labs'] }) });
}
