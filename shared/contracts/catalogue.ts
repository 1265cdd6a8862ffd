import { z } from 'zod';
import { FACET_KEYS, FRAME_RATE_BUCKETS, INDIVIDUAL_BUCKETS, SEARCH_SORTS } from '../catalogue/facets';

// A query parameter given once arrives as a string, given twice as an array.
const many = (item: z.ZodType<string>, what: string) =>
  z.preprocess((v) => (v === undefined ? [] : Array.isArray(v) ? v : [v]), z.array(item).max(20, `Choose at most 20 values of ${what}`));

const word = (what: string) => z.string().trim().min(1, `A value of ${what} is empty`).max(200, `A value of ${what} is longer than 200 characters`);
const bucketIds = (ids: readonly { id: string }[], what: string) =>
  z.string().refine((v) => ids.some((b) => b.id === v), { message: `Unknown ${what} range; use one of ${ids.map((b) => b.id).join(', ')}` });

/** The query string of `GET /api/search`. */
export const searchQuery = z
  .object({
    q: z.string({ error: 'Give the search words as text' }).trim().max(200, 'Keep the search words under 200 characters').optional(),
    groupType: many(word('group type'), 'group type'),
    species: many(word('species'), 'species'),
    setting: many(z.enum(['laboratory', 'field'], { error: 'Setting is laboratory or field' }), 'setting'),
    dimension: many(z.enum(['2', '3'], { error: 'Dimension is 2 or 3' }), 'dimension'),
    individuals: many(bucketIds(INDIVIDUAL_BUCKETS, 'number of individuals'), 'number of individuals'),
    frameRate: many(bucketIds(FRAME_RATE_BUCKETS, 'frame rate'), 'frame rate'),
    lab: many(word('lab'), 'lab'),
    licence: many(word('licence'), 'licence'),
    access: many(z.enum(['open', 'restricted', 'embargoed'], { error: 'Access is open, restricted or embargoed' }), 'access'),
    year: many(z.string().regex(/^\d{4}$/, 'A year has four digits'), 'year'),
    sort: z.enum(SEARCH_SORTS, { error: `Sort by ${SEARCH_SORTS.join(', ')}` }).optional(),
    cursor: z.string().max(500, 'The cursor is not one this server gave').optional(),
    limit: z.coerce.number({ error: 'The limit is a number' }).int('The limit is a whole number').min(1, 'The limit is at least 1').max(50, 'The limit is at most 50').default(20),
  })
  .transform((v) => ({ ...v, q: v.q || undefined }));
export type SearchQuery = z.output<typeof searchQuery>;
export type SearchFilters = Pick<SearchQuery, (typeof FACET_KEYS)[number]>;

/** Text with the spans that matched the query, as [start, end) character offsets: the client marks them, no HTML travels. */
export const highlighted = z.object({ text: z.string(), highlights: z.array(z.tuple([z.number(), z.number()])) });
export type Highlighted = z.infer<typeof highlighted>;

export const searchItem = z.object({
  suffix: z.string(),
  doi: z.string(),
  datasetSuffix: z.string(),
  version: z.number(),
  versionCount: z.number(),
  title: highlighted,
  snippet: highlighted,
  lab: z.object({ name: z.string(), slug: z.string() }),
  species: z.array(z.string()),
  groupType: z.string().nullable(),
  setting: z.string().nullable(),
  dimension: z.number().nullable(),
  frameRate: z.number().nullable(),
  licence: z.string(),
  accessLevel: z.enum(['open', 'restricted', 'embargoed']),
  publishedAt: z.string(),
  downloads: z.number(),
  statistics: z.object({
    individuals: z.number().nullable(),
    durationS: z.number().nullable(),
    polarization: z.number().nullable(),
    springConstant: z.number().nullable(),
  }),
  // The group's mean speed over the recording (first trajectory file), downsampled for a sparkline; empty when not stored.
  sparkline: z.array(z.number()),
});
export type SearchItem = z.infer<typeof searchItem>;

export const facetValue = z.object({ value: z.string(), label: z.string(), count: z.number() });
export type FacetValue = z.infer<typeof facetValue>;

export const searchResult = z.object({
  items: z.array(searchItem),
  facets: z.record(z.enum(FACET_KEYS), z.array(facetValue)),
  total: z.number(),
  sort: z.enum(SEARCH_SORTS),
  nextCursor: z.string().nullable(),
});
export type SearchResult = z.infer<typeof searchResult>;
