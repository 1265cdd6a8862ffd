import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type DatasetVersions = { suffix: string; doi: string; latest: string; versions: Array<{ version: number; suffix: string }> };

export const getDatasetVersions = (suffix: string) => api.get<DatasetVersions>(`/api/datasets/${encodeURIComponent(suffix)}`);
export const datasetVersionsQueryOptions = (suffix: string) => queryOptions({ queryKey: ['datasets', suffix], queryFn: () => getDatasetVersions(suffix) });
export const useDatasetVersions = (suffix: string) => useQuery(datasetVersionsQueryOptions(suffix));
