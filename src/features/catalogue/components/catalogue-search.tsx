import { useEffect, useState, type FormEvent, type ReactNode } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Button } from '../../../components/button';
import { Loading, errorMessage } from '../../../components/query-state';
import type { FacetKey, SearchSort } from '../../../../shared/catalogue/facets';
import type { SearchItem } from '../../../../shared/contracts/catalogue';
import { useSearchReleases } from '../api/search-releases';
import { readCatalogueState, toggleFilter, writeCatalogueState, type CatalogueState } from '../search-params';
import { FacetPanel } from './facet-panel';
import { ResultCard } from './result-card';

const SORT_LABELS: Record<SearchSort, string> = { relevance: 'Best match', newest: 'Newest', 'group-size': 'Largest groups', downloads: 'Most downloaded' };

/** Search words, facets and sort live in the URL; "Show more" pages with the server's cursor. */
export function CatalogueSearch({ actions }: { actions?: (item: SearchItem) => ReactNode }) {
  const [params, setParams] = useSearchParams();
  const state = readCatalogueState(params);
  const [words, setWords] = useState(state.q);
  // The back button changes the URL under the form: follow it.
  useEffect(() => setWords(state.q), [state.q]);
  const query = useSearchReleases(state);
  const go = (next: CatalogueState) => setParams(writeCatalogueState(next));
  const submit = (e: FormEvent) => {
    e.preventDefault();
    go({ ...state, q: words, sort: words.trim() ? state.sort : state.sort === 'relevance' ? null : state.sort });
  };
  const first = query.data?.pages[0];
  const items = query.data?.pages.flatMap((p) => p.items) ?? [];
  const sort = first?.sort ?? state.sort ?? (state.q ? 'relevance' : 'newest');
  const anyFilter = Object.values(state.filters).some((v) => v.length > 0);

  return (
    <div className="flex flex-col gap-6">
      <form role="search" onSubmit={submit} className="flex flex-wrap items-end gap-2">
        <label className="flex min-w-64 flex-1 flex-col gap-1 text-sm font-medium">
          Search released datasets
          <input
            type="search"
            name="q"
            value={words}
            maxLength={200}
            onChange={(e) => setWords(e.target.value)}
            placeholder="Species, behaviour, lab, person…"
            className="rounded-md border border-[#b7c3c9] bg-white px-3 py-2 font-normal focus-visible:outline-2 focus-visible:outline-dusk"
          />
        </label>
        <Button type="submit">Search</Button>
      </form>
      <div className="grid gap-8 md:grid-cols-[15rem_1fr]">
        <aside aria-label="Narrow the results">
          {first ? <FacetPanel facets={first.facets} selected={state.filters} onToggle={(k: FacetKey, v) => go(toggleFilter(state, k, v))} /> : null}
          {anyFilter ? (
            <button type="button" className="mt-4 text-sm text-dusk underline" onClick={() => go({ ...state, filters: readCatalogueState(new URLSearchParams()).filters })}>
              Clear all choices
            </button>
          ) : null}
        </aside>
        <section aria-label="Results" className="flex min-w-0 flex-col gap-4">
          <div className="flex flex-wrap items-center justify-between gap-3">
            <p className="text-sm text-ink/75" aria-live="polite" data-testid="result-count">
              {first ? `${first.total.toLocaleString('en-GB')} ${first.total === 1 ? 'dataset' : 'datasets'}` : ' '}
            </p>
            <label className="flex items-center gap-2 text-sm">
              Sort by
              <select
                value={sort}
                onChange={(e) => go({ ...state, sort: e.target.value as SearchSort })}
                className="rounded-md border border-[#b7c3c9] bg-white px-2 py-1 focus-visible:outline-2 focus-visible:outline-dusk"
              >
                {(Object.keys(SORT_LABELS) as SearchSort[]).filter((s) => s !== 'relevance' || state.q).map((s) => (
                  <option key={s} value={s}>{SORT_LABELS[s]}</option>
                ))}
              </select>
            </label>
          </div>
          {query.isPending ? <Loading /> : null}
          {query.isError ? <p role="alert" className="rounded-md border border-ember bg-[#fbeee5] p-3 text-sm">{errorMessage(query.error)}</p> : null}
          {first && !items.length ? <p className="text-ink/70">No released dataset matches. Try fewer words or untick a choice.</p> : null}
          <ul className="flex flex-col gap-3" data-testid="catalogue-results">
            {items.map((item) => (
              <li key={item.suffix}>
                <ResultCard item={item} actions={actions} />
              </li>
            ))}
          </ul>
          {query.hasNextPage ? (
            <div>
              <Button variant="secondary" onClick={() => query.fetchNextPage()} busy={query.isFetchingNextPage}>Show more</Button>
            </div>
          ) : null}
        </section>
      </div>
    </div>
  );
}
