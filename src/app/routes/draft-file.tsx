import { Link, useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useFileReport } from '../../features/depositing/api/get-file-report';
import { FileStateBadge } from '../../features/depositing/components/file-state-badge';
import { ValidationReport } from '../../features/depositing/components/validation-report';
import { ColumnMapping } from '../../features/depositing/components/column-mapping';
import { IngestReport } from '../../features/ingest-report/components/ingest-report';
import { RequireSession } from '../require-session';
import { paths } from '../paths';
import { formatBytes } from '../../lib/format';

export function Component() {
  const { slug = '', draftId = '', fileId = '' } = useParams();
  return <RequireSession>{() => <FileReportPage slug={slug} draftId={draftId} fileId={fileId} />}</RequireSession>;
}

function FileReportPage({ slug, draftId, fileId }: { slug: string; draftId: string; fileId: string }) {
  const report = useFileReport(slug, draftId, fileId);
  return (
    <QueryState query={report}>
      {(r) => (
        <Page
          wide
          title={r.file.fileName}
          lead={
            <span className="flex flex-wrap items-center gap-3 text-sm">
              <FileStateBadge state={r.file.state} />
              <span>{formatBytes(r.file.sizeBytes ?? r.file.declaredSize)}</span>
              {r.file.sha256 ? <span className="font-mono text-xs">SHA-256 {r.file.sha256}</span> : null}
              <Link to={paths.draft(slug, draftId)}>Back to the draft</Link>
            </span>
          }
        >
          {r.result ? <ValidationReport result={r.result} /> : <p className="text-ink/70">The file has not been checked yet.</p>}
          {r.result ? <IngestReport result={r.result} /> : null}
          {r.file.role === 'trajectories' && ['invalid', 'ready', 'failed'].includes(r.file.state) ? (
            <ColumnMapping slug={slug} draftId={draftId} fileId={fileId} current={r.ingestOptions} open={r.file.state !== 'ready'} />
          ) : null}
        </Page>
      )}
    </QueryState>
  );
}
