import { FACET_KEYS, SEARCH_SORTS, type FacetKey, type SearchSort } from '../../../shared/catalogue/facets';

/** What the catalogue shows, as held in the page's URL (shareable; the back button steps through it). */
export type CatalogueState = { q: string; sort: SearchSort | null; filters: Record<FacetKey, string[]> };

export function readCatalogueState(params: URLSearchParams): CatalogueState {
  const sort = params.get('sort');
  return {
    q: params.get('q') ?? '',
    sort: SEARCH_SORTS.includes(sort as SearchSort) ? (sort as SearchSort) : null,
    filters: Object.fromEntries(FACET_KEYS.map((k) => [k, params.getAll(k)])) as Record<FacetKey, string[]>,
  };
}

export function writeCatalogueState(state: CatalogueState): URLSearchParams {
  const out = new URLSearchParams();
  if (state.q.trim()) out.set('q', state.q.trim());
  // Relevance needs words; without them the server's default order applies.
  if (state.sort && !(state.sort === 'relevance' && !state.q.trim())) out.set('sort', state.sort);
  for (const k of FACET_KEYS) for (const v of state.filters[k]) out.append(k, v);
  return out;
}

export function toggleFilter(state: CatalogueState, key: FacetKey, value: string): CatalogueState {
  const now = state.filters[key];
  return { ...state, filters: { ...state.filters, [key]: now.includes(value) ? now.filter((v) => v !== value) : [...now, value] } };
}
