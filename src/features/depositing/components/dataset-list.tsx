import { Link, useNavigate } from 'react-router-dom';
import type { DatasetListItem } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { DoiIdentifier } from '../../../components/identifier';
import { paths } from '../../../app/paths';
import { useStartNewVersion } from '../api/start-new-version';
import { DraftStateBadge } from './file-state-badge';

export function DatasetList({ slug, datasets, canCreate }: { slug: string; datasets: DatasetListItem[]; canCreate: boolean }) {
  const newVersion = useStartNewVersion(slug);
  const navigate = useNavigate();
  if (!datasets.length) return <p className="text-ink/75">No datasets yet.</p>;
  return (
    <ul className="divide-y divide-mist rounded-lg border border-mist bg-white">
      {datasets.map((d) => (
        <li key={d.id} className="flex flex-wrap items-center gap-3 px-4 py-3">
          <div className="min-w-64 flex-1">
            <div className="font-serif font-bold">{d.title}</div>
            <div className="text-xs text-ink/60">
              <DoiIdentifier doi={d.doi} label="All versions:" resolvable={!!d.latestVersion} />
              {d.latestVersion ? ` · latest release v${d.latestVersion}` : ' · not released yet'}
            </div>
          </div>
          {d.openDraft ? (
            <>
              <DraftStateBadge state={d.openDraft.state} />
              <Link to={paths.draft(slug, d.openDraft.id)}>Open the draft</Link>
            </>
          ) : null}
          {d.latestVersion ? <Link to={paths.release(`${d.suffix}.v${d.latestVersion}`)}>Release page</Link> : null}
          {!d.openDraft && d.latestVersion && canCreate ? (
            <Button
              variant="secondary"
              busy={newVersion.isPending && newVersion.variables === d.id}
              onClick={() => newVersion.mutate(d.id, { onSuccess: (r) => navigate(paths.draft(slug, r.draftId)) })}
            >
              Start a new version
            </Button>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
