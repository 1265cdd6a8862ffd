/** Range buckets of the catalogue's numeric facets; ids appear in shareable URLs, so keep them stable. */
export type RangeBucket = { id: string; label: string; min: number; max: number | null };

// Bounds follow common practice in collective-behaviour work: pairs and small groups, tens, hundreds, thousands.
export const INDIVIDUAL_BUCKETS: readonly RangeBucket[] = [
  { id: '1-9', label: '1–9', min: 1, max: 10 },
  { id: '10-49', label: '10–49', min: 10, max: 50 },
  { id: '50-199', label: '50–199', min: 50, max: 200 },
  { id: '200-999', label: '200–999', min: 200, max: 1000 },
  { id: '1000-plus', label: '1,000 or more', min: 1000, max: null },
];

// Bounds at the usual camera rates: below video rate, video, fast video, high-speed.
export const FRAME_RATE_BUCKETS: readonly RangeBucket[] = [
  { id: 'under-25', label: 'under 25 frames/s', min: 0, max: 25 },
  { id: '25-59', label: '25–59 frames/s', min: 25, max: 60 },
  { id: '60-119', label: '60–119 frames/s', min: 60, max: 120 },
  { id: '120-plus', label: '120 frames/s or more', min: 120, max: null },
];

/** The bucket a value falls in (min inclusive, max exclusive), or undefined. */
export function bucketOf(buckets: readonly RangeBucket[], value: number | null | undefined): RangeBucket | undefined {
  if (value === null || value === undefined || !Number.isFinite(value)) return undefined;
  return buckets.find((b) => value >= b.min && (b.max === null || value < b.max));
}

export const FACET_KEYS = ['groupType', 'species', 'setting', 'dimension', 'individuals', 'frameRate', 'lab', 'licence', 'access', 'year'] as const;
export type FacetKey = (typeof FACET_KEYS)[number];

export const SEARCH_SORTS = ['relevance', 'newest', 'group-size', 'downloads'] as const;
export type SearchSort = (typeof SEARCH_SORTS)[number];
