import { infiniteQueryOptions, keepPreviousData, useInfiniteQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { SearchResult } from '../../../../shared/contracts/catalogue';
import { writeCatalogueState, type CatalogueState } from '../search-params';

export const searchReleases = (state: CatalogueState, cursor?: string) => {
  const params = writeCatalogueState(state);
  params.set('limit', '12');
  if (cursor) params.set('cursor', cursor);
  return api.get<SearchResult>(`/api/search?${params}`);
};

export const searchReleasesQueryOptions = (state: CatalogueState) =>
  infiniteQueryOptions({
    queryKey: ['catalogue', 'search', writeCatalogueState(state).toString()],
    queryFn: ({ pageParam }) => searchReleases(state, pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
    // Facet counts stay on screen while the next answer loads, so ticking a box does not blank the page.
    placeholderData: keepPreviousData,
  });

export const useSearchReleases = (state: CatalogueState) => useInfiniteQuery(searchReleasesQueryOptions(state));
