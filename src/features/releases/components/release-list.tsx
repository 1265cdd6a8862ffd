import { Link } from 'react-router-dom';
import { Button } from '../../../components/button';
import { Loading } from '../../../components/query-state';
import { DoiIdentifier } from '../../../components/identifier';
import { paths } from '../../../app/paths';
import { useReleases } from '../api/get-releases';
import { AccessBadge } from './access-badge';

/** The newest releases of every lab. */
export function ReleaseList() {
  const q = useReleases();
  if (q.isPending) return <Loading />;
  const items = q.data?.pages.flatMap((p) => p.items) ?? [];
  if (!items.length) return <p className="text-ink/70">No releases yet.</p>;
  return (
    <div className="flex flex-col gap-3">
      <ul className="grid gap-3 sm:grid-cols-2" data-testid="release-list">
        {items.map((r) => (
          <li key={r.suffix} className="rounded-lg border border-mist bg-white p-4">
            <Link to={paths.release(r.suffix)} className="font-serif font-bold leading-snug">{r.title}</Link>
            <div className="mt-1 text-xs text-ink/70">
              {r.lab?.name} · v{r.version} · {r.publishedAt.slice(0, 10)}
            </div>
            <div className="mt-1 text-xs">
              <DoiIdentifier doi={r.doi} />
            </div>
            <div className="mt-2 flex flex-wrap items-center gap-2 text-xs">
              <AccessBadge level={r.accessLevel} />
              {r.species.length ? <span className="italic">{r.species.join(', ')}</span> : null}
              {r.groupType ? <span>{r.groupType}</span> : null}
              {r.individuals ? <span className="tabular-nums">{r.individuals} individuals</span> : null}
              {r.dimension ? <span>{r.dimension}D</span> : null}
            </div>
          </li>
        ))}
      </ul>
      {q.hasNextPage ? (
        <div>
          <Button variant="secondary" onClick={() => q.fetchNextPage()} busy={q.isFetchingNextPage}>Show more</Button>
        </div>
      ) : null}
    </div>
  );
}
