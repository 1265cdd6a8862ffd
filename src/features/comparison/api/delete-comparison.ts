import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export const deleteComparison = (id: string) => api.delete<void>(`/api/comparisons/${encodeURIComponent(id)}`);
export function useDeleteComparison() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteComparison, onSuccess: () => qc.invalidateQueries({ queryKey: ['comparisons'] }) });
}
