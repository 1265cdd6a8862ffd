import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type OpenApiDoc = {
  info: { title: string; version: string; description?: string };
  paths: Record<string, Record<string, { summary?: string; description?: string; security?: unknown[]; requestBody?: { content: Record<string, { schema: unknown }> } }>>;
};

export const getOpenApi = () => api.get<OpenApiDoc>('/api/openapi.json');
export const openApiQueryOptions = () => queryOptions({ queryKey: ['openapi'], queryFn: getOpenApi, staleTime: Infinity });
export const useOpenApi = () => useQuery(openApiQueryOptions());
