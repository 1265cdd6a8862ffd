import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import type { ReviewItem } from '../api/get-review-queue';

export function ReviewQueue({ slug, items }: { slug: string; items: ReviewItem[] }) {
  if (!items.length) return <p className="text-ink/70">Nothing waits for review.</p>;
  return (
    <ul className="divide-y divide-mist rounded-lg border border-mist bg-white">
      {items.map((i) => (
        <li key={i.draftId} className="flex flex-wrap items-center gap-3 px-4 py-3">
          <Link to={paths.draft(slug, i.draftId)} className="font-serif font-bold">{i.title}</Link>
          <span className="text-sm text-ink/70">{i.newVersion ? 'new version' : 'first version'}</span>
          <span className="ml-auto text-xs tabular-nums text-ink/60">submitted {i.submittedAt ? new Date(i.submittedAt).toLocaleString('en-GB') : ''}</span>
        </li>
      ))}
    </ul>
  );
}
