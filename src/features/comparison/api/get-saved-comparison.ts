import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ComparisonView } from '../../../../shared/contracts/comparisons';

export const getSavedComparison = (id: string) => api.get<ComparisonView>(`/api/comparisons/${encodeURIComponent(id)}`);
export const savedComparisonQueryOptions = (id: string) => queryOptions({ queryKey: ['comparisons', 'saved', id], queryFn: () => getSavedComparison(id) });
export const useSavedComparison = (id: string) => useQuery(savedComparisonQueryOptions(id));
