import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { LabSummary } from '../../../../shared/contracts';

export const getMyLabs = () => api.get<LabSummary[]>('/api/me/labs');
export const myLabsQueryOptions = () => queryOptions({ queryKey: ['labs', 'mine'], queryFn: getMyLabs });
export const useMyLabs = (enabled = true) => useQuery({ ...myLabsQueryOptions(), enabled });
