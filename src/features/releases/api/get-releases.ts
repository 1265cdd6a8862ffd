import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type ReleaseListItem = {
  suffix: string;
  doi: string;
  title: string;
  version: number;
  publishedAt: string;
  accessLevel: 'open' | 'restricted' | 'embargoed';
  lab: { name: string; slug: string } | null;
  species: string[];
  groupType: string | null;
  dimension: number | null;
  individuals: number | null;
};

export const getReleases = (cursor?: string) =>
  api.get<{ items: ReleaseListItem[]; nextCursor: string | null }>(`/api/releases?limit=12${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`);

export const releasesQueryOptions = () =>
  infiniteQueryOptions({
    queryKey: ['releases', 'list'],
    queryFn: ({ pageParam }) => getReleases(pageParam),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });

export const useReleases = () => useInfiniteQuery(releasesQueryOptions());
