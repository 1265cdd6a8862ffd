import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { ScalingData } from '../../../../shared/contracts/comparisons';

export const getScalingData = () => api.get<ScalingData>('/api/comparisons/scaling');
export const scalingDataQueryOptions = () => queryOptions({ queryKey: ['comparisons', 'scaling'], queryFn: getScalingData });
export const useScalingData = () => useQuery(scalingDataQueryOptions());
