import { sql, type SQL } from 'drizzle-orm';
import type { Db } from '../db/client';
import { readCatalogueGeneration } from './catalogue-generation';
import { FRAME_RATE_BUCKETS, INDIVIDUAL_BUCKETS, type FacetKey, type RangeBucket, type SearchSort } from '../../shared/catalogue/facets';
import { MARK_END, MARK_START } from '../../shared/catalogue/headline-ranges';
import type { SearchFilters } from '../../shared/contracts/catalogue';

/** Where page 1 ended: the sort key of its last row (text, compared in SQL) and its release id. */
export type SearchKey = { key: string; id: string };

export type SearchRow = {
  release_id: string;
  suffix: string;
  doi: string;
  dataset_suffix: string;
  version: number;
  version_count: number;
  title_marked: string;
  snippet_marked: string;
  lab_name: string;
  lab_slug: string;
  species: string[];
  group_type: string | null;
  setting: string | null;
  dimension: number | null;
  individuals: number | null;
  frame_rate: number | null;
  licence: string;
  access_level: 'open' | 'restricted' | 'embargoed';
  published_at: string;
  downloads: number;
  sort_key: string;
  statistics: Record<string, unknown>;
  series: { y?: Array<number | null> } | null;
};

export type FacetRow = { facet: FacetKey; value: string; label: string; count: number };

const rows = <T>(r: unknown) => (r as { rows: T[] }).rows;
const list = (values: readonly string[]) => sql.join(values.map((v) => sql`${v}`), sql`, `);
const CONFIG = sql.raw(`'english'`);

// Range buckets as one CASE, so a row's bucket id is a plain value to group by. Written as literals (our own
// constants, never input) so grouping() can recognise the same expression in GROUP BY.
function bucketCase(column: SQL, buckets: readonly RangeBucket[]) {
  const lit = (b: RangeBucket) => sql.raw(`'${b.id.replace(/[^a-z0-9-]/g, '')}'`);
  const arms = buckets.map((b) => (b.max === null ? sql`when ${column} >= ${sql.raw(String(Number(b.min)))} then ${lit(b)}` : sql`when ${column} >= ${sql.raw(String(Number(b.min)))} and ${column} < ${sql.raw(String(Number(b.max)))} then ${lit(b)}`));
  return sql`(case ${sql.join(arms, sql` `)} end)`;
}

// A bucket filter as ranges on the column itself, so the planner can use it on the table.
function inBuckets(column: SQL, buckets: readonly RangeBucket[], ids: string[]) {
  const chosen = buckets.filter((b) => ids.includes(b.id));
  if (!chosen.length) return sql`false`;
  return sql`(${sql.join(chosen.map((b) => (b.max === null ? sql`${column} >= ${b.min}` : sql`(${column} >= ${b.min} and ${column} < ${b.max})`)), sql` or `)})`;
}

type Facet = { key: FacetKey; value: SQL; match: (values: string[]) => SQL };

// Each facet: its value per row of release_search (`s`) and its filter (OR within a facet, AND across facets).
const FACETS: Facet[] = [
  { key: 'groupType', value: sql`s.group_type`, match: (v) => sql`s.group_type in (${list(v)})` },
  { key: 'species', value: sql`null::text`, match: (v) => sql`s.species && array[${list(v)}]::text[]` },
  { key: 'setting', value: sql`s.setting`, match: (v) => sql`s.setting in (${list(v)})` },
  { key: 'dimension', value: sql`s.dimension::text`, match: (v) => sql`s.dimension in (${list(v.map(Number).map(String))})` },
  { key: 'individuals', value: bucketCase(sql`s.individuals`, INDIVIDUAL_BUCKETS), match: (v) => inBuckets(sql`s.individuals`, INDIVIDUAL_BUCKETS, v) },
  { key: 'frameRate', value: bucketCase(sql`s.frame_rate`, FRAME_RATE_BUCKETS), match: (v) => inBuckets(sql`s.frame_rate`, FRAME_RATE_BUCKETS, v) },
  { key: 'lab', value: sql`s.lab_id`, match: (v) => sql`s.lab_id in (select id from organization where slug in (${list(v)}))` },
  { key: 'licence', value: sql`s.licence`, match: (v) => sql`s.licence in (${list(v)})` },
  { key: 'access', value: sql`s.access_level`, match: (v) => sql`s.access_level in (${list(v)})` },
  { key: 'year', value: sql`s.publication_year::text`, match: (v) => sql`s.publication_year in (${list(v.map(Number).map(String))})` },
];
const SCALAR = FACETS.filter((f) => f.key !== 'species');

const tsquery = (q: string) => sql`websearch_to_tsquery(${CONFIG}, ${q})`;
const rankOf = (q: string | undefined) => (q ? sql`ts_rank_cd(s.document, ${tsquery(q)})` : sql`0::real`);

// The sort key as text (exact: timestamps keep microseconds, ranks go through float8) and the keyset condition.
const SORTS: Record<SearchSort, { key: SQL; order: SQL; before: (a: SearchKey) => SQL }> = {
  relevance: { key: sql`rank::float8::text`, order: sql`rank desc, release_id desc`, before: (a) => sql`(rank::float8, release_id) < (${a.key}::float8, ${a.id})` },
  newest: { key: sql`published_at::text`, order: sql`published_at desc, release_id desc`, before: (a) => sql`(published_at, release_id) < (${a.key}::timestamptz, ${a.id})` },
  'group-size': { key: sql`coalesce(individuals, -1)::text`, order: sql`coalesce(individuals, -1) desc, release_id desc`, before: (a) => sql`(coalesce(individuals, -1), release_id) < (${a.key}::int, ${a.id})` },
  downloads: { key: sql`downloads::text`, order: sql`downloads desc, release_id desc`, before: (a) => sql`(downloads, release_id) < (${a.key}::int, ${a.id})` },
};

const HEADLINE = `StartSel=${MARK_START}, StopSel=${MARK_END}, MaxWords=32, MinWords=12, MaxFragments=2, FragmentDelimiter=" … "`;
const TITLE_HEADLINE = `StartSel=${MARK_START}, StopSel=${MARK_END}, HighlightAll=true`;

/** The catalogue's full-text search and facet counts over `release_search` (filled by triggers). */
export function createCatalogueRepository(db: Db) {
  const where = (q: string | undefined) => (q ? sql`s.listed and s.document @@ ${tsquery(q)}` : sql`s.listed`);

  function matches(filters: SearchFilters, except?: FacetKey) {
    const parts = FACETS.filter((f) => f.key !== except && filters[f.key].length > 0).map((f) => f.match(filters[f.key]));
    return parts.length ? sql.join(parts, sql` and `) : sql`true`;
  }

  return {
    /** A fingerprint of what a search answer depends on: it changes with every publication and withdrawal (download counts are not in it). */
    generation: () => readCatalogueGeneration(db),

    /** One page of matching datasets (their newest release), and the total. */
    async page(opts: { q?: string; filters: SearchFilters; sort: SearchSort; after?: SearchKey; limit: number }): Promise<{ rows: SearchRow[]; total: number }> {
      const s = SORTS[opts.sort];
      const q = opts.q;
      // The page reads the table directly (the sort indexes serve it); display columns come only for its rows.
      const result = await db.execute(sql`
        with hits as (
          select s.release_id, s.published_at, s.individuals, s.downloads, ${rankOf(q)} as rank
            from release_search s where ${where(q)} and ${matches(opts.filters)}
        ),
        page as (select release_id, ${s.key} as sort_key, row_number() over (order by ${s.order}) as ord
                   from (select * from hits where true ${opts.after ? sql`and ${s.before(opts.after)}` : sql``} order by ${s.order} limit ${opts.limit}) top)
        select p.release_id, r.suffix, r.doi, d.suffix as dataset_suffix, r.version, x.version_count,
               ${q ? sql`ts_headline(${CONFIG}, x.title, ${tsquery(q)}, ${TITLE_HEADLINE})` : sql`x.title`} as title_marked,
               ${q ? sql`ts_headline(${CONFIG}, translate(x.description, ${MARK_START + MARK_END}, ''), ${tsquery(q)}, ${HEADLINE})` : sql`left(x.description, 240)`} as snippet_marked,
               x.lab_name, o.slug as lab_slug, x.species, x.group_type, x.setting, x.dimension, x.individuals, x.frame_rate, x.licence, x.access_level,
               x.published_at::text as published_at, x.downloads, p.sort_key, r.statistics,
               (select f.result->'series'->'time'->'meanSpeed' from release_file f
                 where f.release_id = p.release_id and f.role = 'trajectories' and f.result is not null order by f.file_name limit 1) as series,
               (select count(*)::int from hits) as total
          from page p join release_search x on x.release_id = p.release_id join release r on r.id = p.release_id
               join dataset d on d.id = r.dataset_id join organization o on o.id = x.lab_id
         order by p.ord`);
      const out = rows<SearchRow & { total: number }>(result);
      const total = out.length
        ? Number(out[0].total)
        : Number(rows<{ n: number }>(await db.execute(sql`select count(*)::int as n from release_search s where ${where(q)} and ${matches(opts.filters)}`))[0]?.n ?? 0);
      return { rows: out, total };
    },

    /**
     * Facet counts in one pass (grouping sets): each facet counted with every
     * other facet's filter applied but not its own (drill-down). Species, an
     * array, is unnested in a second small query over the same rows.
     */
    async facets(opts: { q?: string; filters: SearchFilters }): Promise<FacetRow[]> {
      const f = opts.filters;
      const active = FACETS.filter((x) => f[x.key].length > 0).map((x) => x.key);
      // One count per distinct predicate: all filters, and all but F for each facet F that has a filter.
      const countCols = [sql`count(*) filter (where ${matches(f)})::int as c`, ...active.map((k) => sql`count(*) filter (where ${matches(f, k)})::int as ${sql.raw(`"c_${k}"`)}`)];
      // The wide table is read once into a narrow set; both the grouping sets and the species unnest use it.
      const narrow = SCALAR.map((x) => sql`${x.value} as ${sql.raw(`"v_${x.key}"`)}`);
      // Quoted: the facet keys are camelCase and the rows are read back by these names.
      const vcol = (x: Facet) => sql.raw(`"v_${x.key}"`);
      const [facetRows, labs] = await Promise.all([
        db.execute(sql`
          with s as materialized (
            select s.group_type, s.species, s.setting, s.dimension, s.individuals, s.frame_rate, s.lab_id, s.licence, s.access_level, s.publication_year, ${sql.join(narrow, sql`, `)}
              from release_search s where ${where(opts.q)}
          )
          select grouping(${sql.join(SCALAR.map(vcol), sql`, `)}) as g, null::text as v_species, ${sql.join(SCALAR.map((x) => sql`${vcol(x)}::text as ${vcol(x)}`), sql`, `)}, ${sql.join(countCols, sql`, `)}
            from s group by grouping sets (${sql.join(SCALAR.map((x) => sql`(${vcol(x)})`), sql`, `)})
          union all
          select -1, sp, ${sql.join(SCALAR.map(() => sql`null`), sql`, `)}, ${sql.join(countCols, sql`, `)} from s, unnest(s.species) as sp group by sp`),
        db.execute(sql`select id, slug, name from organization`),
      ]);
      const all = rows<Record<string, unknown>>(facetRows);
      const scalar = { rows: all.filter((r) => Number(r.g) >= 0) };
      const species = { rows: all.filter((r) => Number(r.g) < 0).map((r) => ({ ...r, v: r.v_species })) };
      const labById = new Map(rows<{ id: string; slug: string; name: string }>(labs).map((l) => [l.id, l]));
      const countOf = (r: Record<string, unknown>, k: FacetKey) => Number(r[f[k].length ? `c_${k}` : 'c']);
      const out: FacetRow[] = [];
      for (const r of rows<Record<string, unknown>>(scalar)) {
        // grouping() sets a bit for every column rolled up; the one column left at 0 names the facet (first argument = highest bit).
        const g = Number(r.g);
        const i = SCALAR.findIndex((_, j) => (g & (1 << (SCALAR.length - 1 - j))) === 0);
        const key = SCALAR[i].key;
        if (r[`v_${key}`] === null || r[`v_${key}`] === undefined) continue;
        const value = String(r[`v_${key}`]);
        const lab = key === 'lab' ? labById.get(value) : undefined;
        out.push({ facet: key, value: lab?.slug ?? value, label: lab?.name ?? (key === 'dimension' ? `${value}D` : value), count: countOf(r, key) });
      }
      for (const r of rows<Record<string, unknown>>(species)) out.push({ facet: 'species', value: String(r.v), label: String(r.v), count: countOf(r, 'species') });
      return out;
    },
  };
}

export type CatalogueRepository = ReturnType<typeof createCatalogueRepository>;
