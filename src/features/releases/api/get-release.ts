import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type ReleaseLanding = {
  suffix: string;
  doi: string;
  version: number;
  title: string;
  publishedAt: string;
  licence: { id: string; name: string; url: string | null };
  accessLevel: 'open' | 'restricted' | 'embargoed';
  embargoUntil: string | null;
  changelog: string;
  dataset: { suffix: string; doi: string; lab: { name: string; slug: string; isDemo: boolean } | null };
  versions: Array<{ version: number; suffix: string; doi: string; publishedAt: string; withdrawn: boolean }>;
  latestVersion: number | null;
  metadata: Record<string, any>;
  files: Array<{ fileName: string; role: string; mediaType: string; sizeBytes: number; sha256: string }>;
  results: Array<{ fileName: string; result: Record<string, any> }>;
  withdrawn: { at: string; reason: string } | null;
  citation: { styles: Record<string, string> };
  jsonLd: Record<string, unknown> | null;
};

export const getRelease = (suffix: string) => api.get<ReleaseLanding>(`/api/releases/${encodeURIComponent(suffix)}`);
export const releaseQueryOptions = (suffix: string) => queryOptions({ queryKey: ['releases', suffix], queryFn: () => getRelease(suffix) });
export const useRelease = (suffix: string) => useQuery(releaseQueryOptions(suffix));

/** Where the citation downloads live (plain links: the browser saves the file). */
export const citationUrl = (suffix: string, format: 'bibtex' | 'ris' | 'csl-json' | 'cff') => `/api/releases/${encodeURIComponent(suffix)}/citation/${format}`;
