import { lazy, Suspense, useState, type FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { Loading, QueryState } from '../../components/query-state';
import { useSession } from '../../features/auth/api/get-session';
import { basket, useBasket } from '../../features/comparison/basket';
import { useComparisonView } from '../../features/comparison/api/get-comparison-view';
import { useSavedComparison } from '../../features/comparison/api/get-saved-comparison';
import { useMyComparisons } from '../../features/comparison/api/get-my-comparisons';
import { useSaveComparison } from '../../features/comparison/api/save-comparison';
import { useDeleteComparison } from '../../features/comparison/api/delete-comparison';
import { ComparisonTable } from '../../features/comparison/components/comparison-table';
import type { ComparisonView } from '../../../shared/contracts/comparisons';
import { errorMessage } from '../../components/query-state';
import { paths } from '../paths';

// recharts is large: the plots load after the table.
const ComparisonPlots = lazy(() => import('../../features/comparison/components/comparison-plots'));

export function Component() {
  const { id } = useParams();
  return id ? <Saved id={id} /> : <Basket />;
}

function HiddenNotice({ n }: { n: number }) {
  if (!n) return null;
  return (
    <p role="status" className="rounded-md border border-ember/60 bg-[#fbeee5] px-3 py-2 text-sm">
      <span aria-hidden>⚠ </span>
      {n === 1 ? '1 release in this comparison is not visible to you' : `${n} releases in this comparison are not visible to you`}: it was withdrawn, so its statistics are no longer shown.
    </p>
  );
}

function Body({ view, title, onRemove }: { view: ComparisonView; title: string; onRemove?: (suffix: string) => void }) {
  return (
    <div className="flex flex-col gap-8">
      <HiddenNotice n={view.hidden} />
      {view.releases.length ? (
        <>
          <ComparisonTable releases={view.releases} title={title} onRemove={onRemove} />
          <Suspense fallback={<Loading />}>
            <ComparisonPlots releases={view.releases} curves={view.curves} />
          </Suspense>
        </>
      ) : null}
    </div>
  );
}

function Basket() {
  const items = useBasket();
  const suffixes = items.map((i) => i.suffix);
  const view = useComparisonView(suffixes);
  const session = useSession();
  return (
    <Page wide title="Compare releases" lead="Statistics of up to 12 releases side by side, in SI units, with their distributions overlaid."
      actions={<Link to={paths.scaling} className="rounded-md border border-dusk/60 bg-white px-3 py-1.5 text-sm font-medium text-dusk no-underline hover:bg-mist">Scaling view across all releases</Link>}>
      {items.length === 0 ? (
        <p className="rounded-lg border border-dashed border-mist bg-white p-6 text-ink/80">
          No releases picked yet. Use <strong>Add to comparison</strong> on a release page or on the cards of the <Link to={paths.catalogue}>catalogue</Link>.
        </p>
      ) : (
        <div className="flex flex-col gap-6">
          <div className="flex flex-wrap items-center gap-2 text-sm" aria-label="Picked releases">
            <span className="text-ink/70">{items.length} picked:</span>
            {items.map((i) => (
              <span key={i.suffix} className="inline-flex items-center gap-1 rounded-full border border-mist bg-white px-2.5 py-0.5">
                {i.title}
                <button type="button" className="text-dusk hover:text-ink" onClick={() => basket.remove(i.suffix)} aria-label={`Remove ${i.title}`}>×</button>
              </span>
            ))}
            <button type="button" className="text-dusk hover:underline" onClick={() => basket.clear()}>Clear all</button>
          </div>
          {session.data ? <SaveForm suffixes={suffixes} /> : <p className="text-sm text-ink/75"><Link to={paths.signIn}>Sign in</Link> to save this comparison and share it by link.</p>}
          <QueryState query={view}>{(v) => <Body view={v} title="comparison" onRemove={(s) => basket.remove(s)} />}</QueryState>
        </div>
      )}
      {session.data ? <MyComparisons /> : null}
    </Page>
  );
}

function SaveForm({ suffixes }: { suffixes: string[] }) {
  const [title, setTitle] = useState('');
  const save = useSaveComparison();
  const navigate = useNavigate();
  function submit(e: FormEvent) {
    e.preventDefault();
    save.mutate({ title, releases: suffixes }, { onSuccess: (c) => navigate(paths.savedComparison(c.id)) });
  }
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-2 rounded-lg border border-mist bg-white p-3 text-sm">
      <label className="flex min-w-64 flex-1 flex-col gap-1">
        Title of the saved comparison
        <input value={title} onChange={(e) => setTitle(e.target.value)} className="rounded border border-mist px-2 py-1" placeholder="e.g. Swarm size and spring constant" maxLength={200} />
      </label>
      <button type="submit" disabled={save.isPending} className="rounded-md bg-dusk px-3 py-1.5 font-medium text-paper disabled:opacity-60">Save and get a share link</button>
      {save.isError ? <p role="alert" className="w-full text-[#9a4a1c]">{errorMessage(save.error)}</p> : null}
    </form>
  );
}

function MyComparisons() {
  const mine = useMyComparisons(true);
  if (!mine.data?.items.length) return null;
  return (
    <section className="mt-10" aria-labelledby="my-comparisons">
      <h2 id="my-comparisons" className="mb-2 font-serif text-xl font-bold">Your saved comparisons</h2>
      <ul className="divide-y divide-mist rounded-lg border border-mist bg-white text-sm">
        {mine.data.items.map((c) => (
          <li key={c.id} className="flex flex-wrap items-baseline justify-between gap-2 px-3 py-2">
            <Link to={paths.savedComparison(c.id)} className="font-semibold">{c.title}</Link>
            <span className="text-ink/70 tabular-nums">{c.releases.length} releases · saved {c.updatedAt.slice(0, 10)}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}

function Saved({ id }: { id: string }) {
  const view = useSavedComparison(id);
  return <QueryState query={view}>{(v) => <SavedPage view={v} />}</QueryState>;
}

function SavedPage({ view }: { view: ComparisonView }) {
  const navigate = useNavigate();
  const remove = useDeleteComparison();
  const [copied, setCopied] = useState(false);
  const link = typeof window === 'undefined' ? '' : window.location.href;
  const title = view.title ?? 'Saved comparison';
  return (
    <Page wide title={title} lead={`Saved by ${view.owner?.name ?? 'someone'} on ${view.createdAt?.slice(0, 10) ?? ''}. Anyone with the link sees it.`}
      actions={
        <>
          <button type="button" className="rounded-md border border-dusk/60 bg-white px-3 py-1.5 text-sm font-medium text-dusk hover:bg-mist"
            onClick={() => navigator.clipboard.writeText(link).then(() => setCopied(true), () => undefined)}>{copied ? 'Link copied' : 'Copy share link'}</button>
          <button type="button" className="rounded-md border border-dusk/60 bg-white px-3 py-1.5 text-sm font-medium text-dusk hover:bg-mist"
            onClick={() => { basket.replace(view.releases.map((r) => ({ suffix: r.suffix, title: r.title }))); navigate(paths.compare); }}>Open as my comparison</button>
          {view.mine ? (
            <button type="button" className="rounded-md border border-ember bg-white px-3 py-1.5 text-sm font-medium text-[#9a4a1c] hover:bg-[#fbeee5]" disabled={remove.isPending}
              onClick={() => remove.mutate(view.id!, { onSuccess: () => navigate(paths.compare) })}>Delete</button>
          ) : null}
        </>
      }>
      <Body view={view} title={title} />
      <p className="mt-6 text-sm"><Link to={paths.scaling}>Scaling view across all releases</Link></p>
    </Page>
  );
}
