import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ComparisonView } from '../../../../shared/contracts/comparisons';

export const getComparisonView = (suffixes: string[]) => api.get<ComparisonView>(`/api/comparisons/view?releases=${suffixes.map(encodeURIComponent).join(',')}`);
export const comparisonViewQueryOptions = (suffixes: string[]) =>
  queryOptions({ queryKey: ['comparisons', 'view', suffixes], queryFn: () => getComparisonView(suffixes), enabled: suffixes.length > 0, placeholderData: keepPreviousData });
export const useComparisonView = (suffixes: string[]) => useQuery(comparisonViewQueryOptions(suffixes));
