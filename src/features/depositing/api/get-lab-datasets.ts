import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { DatasetListItem } from '../../../../shared/contracts';

export const getLabDatasets = (slug: string) => api.get<DatasetListItem[]>(`/api/labs/${encodeURIComponent(slug)}/datasets`);
export const labDatasetsQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'datasets'], queryFn: () => getLabDatasets(slug) });
export const useLabDatasets = (slug: string, enabled = true) => useQuery({ ...labDatasetsQueryOptions(slug), enabled });
