import { Link } from 'react-router-dom';
import type { DraftFileView } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { formatBytes, formatNumber } from '../../../lib/format';
import { paths } from '../../../app/paths';
import { useRemoveFile } from '../api/remove-file';
import { FileStateBadge } from './file-state-badge';
import { Progress } from './file-uploader';

export function DraftFiles({ slug, draftId, files, editable }: { slug: string; draftId: string; files: DraftFileView[]; editable: boolean }) {
  const remove = useRemoveFile(slug, draftId);
  // Uploads in progress show here too, so one left unfinished (a closed tab) can be removed.
  const shown = files;
  if (!shown.length) return <p className="text-sm text-ink/70">No files yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-mist bg-white">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Files of this draft</caption>
        <thead>
          <tr className="border-b border-mist text-left">
            <th className="px-3 py-2 font-semibold">File</th>
            <th className="px-3 py-2 text-right font-semibold">Size</th>
            <th className="px-3 py-2 font-semibold">State</th>
            <th className="px-3 py-2 text-right font-semibold">Tracks</th>
            <th className="px-3 py-2 text-right font-semibold">Frames</th>
            <th className="px-3 py-2 text-right font-semibold">Problems</th>
            <th className="px-3 py-2"><span className="sr-only">Actions</span></th>
          </tr>
        </thead>
        <tbody>
          {shown.map((f) => {
            const busy = ['queued', 'ingesting', 'verifying'].includes(f.state);
            const s = f.summary as { tracks?: number; frames?: number } | null;
            return (
              <tr key={f.id} className="border-b border-mist/70 align-top" data-testid="draft-file">
                <td className="px-3 py-2">
                  <Link to={paths.draftFile(slug, draftId, f.id)} className="font-medium">{f.fileName}</Link>
                  <div className="text-xs text-ink/60">
                    {f.role === 'supplementary' ? 'supplementary' : 'trajectories'}
                    {f.carriedOver ? ' · carried over from the previous version' : ''}
                  </div>
                  {f.sha256 ? <div className="font-mono text-[11px] text-ink/50" title="SHA-256">sha256 {f.sha256.slice(0, 16)}…</div> : null}
                </td>
                <td className="px-3 py-2 text-right tabular-nums">{formatBytes(f.sizeBytes ?? f.declaredSize)}</td>
                <td className="min-w-56 px-3 py-2">
                  <FileStateBadge state={f.state} />
                  {busy && f.job ? (
                    <div className="mt-1">
                      <Progress label={`Checking ${f.fileName}`} value={f.job.progress} max={1} detail={`${Math.round(f.job.progress * 100)} % · ${f.job.phase}`} />
                    </div>
                  ) : null}
                  {f.errorMessage ? <div className="mt-1 text-xs text-[#8a4418]">{f.errorMessage}</div> : null}
                </td>
                <td className="px-3 py-2 text-right tabular-nums">{formatNumber(s?.tracks)}</td>
                <td className="px-3 py-2 text-right tabular-nums">{formatNumber(s?.frames)}</td>
                <td className="px-3 py-2 text-right tabular-nums">
                  {f.status ? `${f.errors} errors, ${f.warnings} warnings` : '–'}
                </td>
                <td className="px-3 py-2 text-right">
                  {editable ? (
                    <Button variant="quiet" onClick={() => remove.mutate(f.id)} busy={remove.isPending && remove.variables === f.id}>
                      Remove
                    </Button>
                  ) : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
