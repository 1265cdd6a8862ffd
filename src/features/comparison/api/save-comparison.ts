import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ComparisonInput, ComparisonSummary } from '../../../../shared/contracts/comparisons';

export const saveComparison = (input: ComparisonInput) => api.post<ComparisonSummary>('/api/comparisons', input);
export function useSaveComparison() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: saveComparison, onSuccess: () => qc.invalidateQueries({ queryKey: ['comparisons', 'mine'] }) });
}
