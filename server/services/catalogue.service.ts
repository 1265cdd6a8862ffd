import { LRUCache } from 'lru-cache';
import { z } from 'zod';
import { AppError } from '../errors';
import type { CatalogueRepository, FacetRow, SearchRow } from '../repositories/catalogue.repository';
import { FACET_KEYS, FRAME_RATE_BUCKETS, INDIVIDUAL_BUCKETS, type FacetKey, type SearchSort } from '../../shared/catalogue/facets';
import { headlineRanges } from '../../shared/catalogue/headline-ranges';
import { sparklinePoints } from '../../shared/catalogue/sparkline-points';
import type { FacetValue, SearchItem, SearchQuery, SearchResult } from '../../shared/contracts/catalogue';

type Deps = { repo: CatalogueRepository };

const cursorShape = z.object({ s: z.string(), k: z.string().max(100), i: z.string().max(100) });

/** The cursor is opaque to clients: base64url of the sort, the last row's sort key and id. */
export function encodeCursor(sort: SearchSort, key: string, id: string) {
  return Buffer.from(JSON.stringify({ s: sort, k: key, i: id })).toString('base64url');
}

function decodeCursor(cursor: string, sort: SearchSort) {
  let parsed: z.infer<typeof cursorShape>;
  try {
    parsed = cursorShape.parse(JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8')));
  } catch {
    throw new AppError('bad_cursor', 'The cursor is not one this server gave; start again from the first page.', 400);
  }
  if (parsed.s !== sort) throw new AppError('bad_cursor', 'The cursor belongs to another sort order; start again from the first page.', 400);
  // Keys go to SQL as bound parameters with a cast; refusing odd text here turns a cast error into a clear 400.
  const ok = sort === 'newest' ? !Number.isNaN(Date.parse(parsed.k)) : /^-?\d+(\.\d+)?(e[-+]?\d+)?$/i.test(parsed.k);
  if (!ok) throw new AppError('bad_cursor', 'The cursor is not one this server gave; start again from the first page.', 400);
  return { key: parsed.k, id: parsed.i };
}

const GROUP_LABELS: Record<string, string> = { swarm: 'Swarm', school: 'School', flock: 'Flock', herd: 'Herd', colony: 'Colony', other: 'Other' };
const SETTING_LABELS: Record<string, string> = { laboratory: 'Laboratory', field: 'Field' };
const ACCESS_LABELS: Record<string, string> = { open: 'Open', restricted: 'Restricted', embargoed: 'Embargoed' };
const bucketLabel = (buckets: typeof INDIVIDUAL_BUCKETS) => (id: string) => buckets.find((b) => b.id === id)?.label ?? id;
const LABELS: Partial<Record<FacetKey, (value: string, raw: string) => string>> = {
  groupType: (v) => GROUP_LABELS[v] ?? v,
  setting: (v) => SETTING_LABELS[v] ?? v,
  access: (v) => ACCESS_LABELS[v] ?? v,
  individuals: bucketLabel(INDIVIDUAL_BUCKETS),
  frameRate: bucketLabel(FRAME_RATE_BUCKETS),
};
// Range facets keep their natural order; the others list the largest counts first.
const ORDERED: Partial<Record<FacetKey, string[]>> = {
  individuals: INDIVIDUAL_BUCKETS.map((b) => b.id),
  frameRate: FRAME_RATE_BUCKETS.map((b) => b.id),
};

type Summary = {
  durationS?: number | null;
  tracks?: number | null;
  polarization?: { mean?: number | null } | null;
  springConstant?: { throughOrigin?: { springConstant?: number | null } | null } | null;
};
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);

function keyStatistics(row: SearchRow): SearchItem['statistics'] {
  // The first file (by name) with a summary speaks for the release, as on its landing page.
  const summary = Object.keys(row.statistics ?? {})
    .sort()
    .map((k) => row.statistics[k] as Summary | null)
    .find((s) => s && typeof s === 'object');
  return {
    individuals: row.individuals ?? num(summary?.tracks),
    durationS: num(summary?.durationS),
    polarization: num(summary?.polarization?.mean),
    springConstant: num(summary?.springConstant?.throughOrigin?.springConstant),
  };
}

function toItem(row: SearchRow): SearchItem {
  return {
    suffix: row.suffix,
    doi: row.doi,
    datasetSuffix: row.dataset_suffix,
    version: Number(row.version),
    versionCount: Number(row.version_count),
    title: headlineRanges(row.title_marked),
    snippet: headlineRanges(row.snippet_marked),
    lab: { name: row.lab_name, slug: row.lab_slug },
    species: row.species ?? [],
    groupType: row.group_type,
    setting: row.setting,
    dimension: row.dimension === null ? null : Number(row.dimension),
    frameRate: row.frame_rate === null ? null : Number(row.frame_rate),
    licence: row.licence,
    accessLevel: row.access_level,
    publishedAt: new Date(row.published_at).toISOString(),
    downloads: Number(row.downloads),
    statistics: keyStatistics(row),
    sparkline: Array.isArray(row.series?.y) ? sparklinePoints(row.series.y, 32) : [],
  };
}

function facetLists(rows: FacetRow[], selected: SearchQuery): SearchResult['facets'] {
  const out = Object.fromEntries(FACET_KEYS.map((k) => [k, [] as FacetValue[]])) as SearchResult['facets'];
  for (const r of rows) out[r.facet].push({ value: r.value, label: LABELS[r.facet]?.(r.value, r.label) ?? r.label, count: r.count });
  for (const key of FACET_KEYS) {
    // A ticked value with no hits left still shows (count 0), so it can be unticked.
    for (const v of selected[key]) if (!out[key].some((f) => f.value === v)) out[key].push({ value: v, label: LABELS[key]?.(v, v) ?? v, count: 0 });
    const order = ORDERED[key];
    out[key].sort(order ? (a, b) => order.indexOf(a.value) - order.indexOf(b.value) : key === 'year' ? (a, b) => b.value.localeCompare(a.value) : (a, b) => b.count - a.count || a.label.localeCompare(b.label));
  }
  return out;
}

/** The catalogue: one card per dataset (its newest non-withdrawn release), full-text search and drill-down facets. */
export function createCatalogueService({ repo }: Deps) {
  // Answers are kept per query and catalogue generation (bumped by every publication, withdrawal and lab
  // rename): many visitors run the same searches, and the facet counts cost tens of milliseconds on 10,000
  // releases. Each instance reads the generation from the shared database, so a new release shows at once
  // everywhere. Download counts and the "most downloaded" order are refreshed after a minute: the kept answer
  // is still served while lru-cache computes the new one in the background, once for all who ask.
  const answers = new LRUCache<string, SearchResult, SearchQuery>({
    max: 2000,
    ttl: 60_000,
    allowStale: true,
    fetchMethod: (_key, _stale, { context }) => compute(context),
  });

  async function compute(query: SearchQuery): Promise<SearchResult> {
    const sort: SearchSort = query.sort ?? (query.q ? 'relevance' : 'newest');
    if (sort === 'relevance' && !query.q) throw new AppError('relevance_needs_query', 'Sorting by relevance needs search words; sort by newest instead.', 400);
    const after = query.cursor ? decodeCursor(query.cursor, sort) : undefined;
    const [page, facetRows] = await Promise.all([
      repo.page({ q: query.q, filters: query, sort, after, limit: query.limit + 1 }),
      repo.facets({ q: query.q, filters: query }),
    ]);
    const more = page.rows.length > query.limit;
    const rows = page.rows.slice(0, query.limit);
    const last = rows.at(-1);
    return {
      items: rows.map(toItem),
      facets: facetLists(facetRows, query),
      total: page.total,
      sort,
      nextCursor: more && last ? encodeCursor(sort, last.sort_key, last.release_id) : null,
    };
  }

  return {
    async search(query: SearchQuery): Promise<SearchResult> {
      const generation = await repo.generation();
      return (await answers.fetch(`${generation}|${JSON.stringify(query)}`, { context: query }))!;
    },
  };
}

export type CatalogueService = ReturnType<typeof createCatalogueService>;
