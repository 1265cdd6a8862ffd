import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ComparisonSummary } from '../../../../shared/contracts/comparisons';

export const getMyComparisons = () => api.get<{ items: ComparisonSummary[] }>('/api/comparisons');
export const myComparisonsQueryOptions = () => queryOptions({ queryKey: ['comparisons', 'mine'], queryFn: getMyComparisons });
export const useMyComparisons = (enabled: boolean) => useQuery({ ...myComparisonsQueryOptions(), enabled });
