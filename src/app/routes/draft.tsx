import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Page, Section } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useLab } from '../../features/labs/api/get-lab';
import { useDraft } from '../../features/depositing/api/get-draft';
import { FileUploader } from '../../features/depositing/components/file-uploader';
import { DraftFiles } from '../../features/depositing/components/draft-files';
import { MetadataForm } from '../../features/depositing/components/metadata-form';
import { ReviewPanel } from '../../features/depositing/components/review-panel';
import { DraftStateBadge } from '../../features/depositing/components/file-state-badge';
import { labRoleCan } from '../../../shared/lab-roles';
import { RequireSession } from '../require-session';
import { paths } from '../paths';
import { DoiIdentifier } from '../../components/identifier';

export function Component() {
  const { slug = '', draftId = '' } = useParams();
  return <RequireSession>{() => <Draft slug={slug} draftId={draftId} />}</RequireSession>;
}

function Draft({ slug, draftId }: { slug: string; draftId: string }) {
  const lab = useLab(slug);
  const draft = useDraft(slug, draftId);
  const [showProblems, setShowProblems] = useState(false);
  return (
    <QueryState query={draft}>
      {(d) => {
        const role = lab.data?.myRole ?? null;
        const editable = (d.state === 'editing' || d.state === 'returned') && labRoleCan(role, { dataset: ['edit'] });
        return (
          <Page
            wide
            title={d.dataset.title}
            lead={
              <span className="flex flex-wrap items-center gap-2 text-sm">
                <DraftStateBadge state={d.state} />
                {d.baseVersion ? <span>New version after v{d.baseVersion}</span> : <span>First version</span>}
                <span>
                  <DoiIdentifier doi={d.dataset.doi} label="All-versions identifier" resolvable={!!d.baseVersion} />
                  {d.baseVersion ? null : ' (registered at publication)'}
                </span>
                <Link to={paths.labDatasets(slug)}>All datasets of the lab</Link>
              </span>
            }
          >
            <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
              <div className="flex min-w-0 flex-col gap-8">
                <Section title="Files">
                  <div className="flex flex-col gap-4">
                    {editable ? <FileUploader slug={slug} draftId={d.id} partSize={d.uploadPartSize} /> : null}
                    <DraftFiles slug={slug} draftId={d.id} files={d.files} editable={editable} />
                  </div>
                </Section>
                <Section title="Metadata">
                  <MetadataForm key={d.id} slug={slug} draft={d} editable={editable} showAllProblems={showProblems} />
                </Section>
              </div>
              <aside>
                <Section title="Review">
                  <ReviewPanel slug={slug} draft={d} role={role} onWantProblems={() => setShowProblems(true)} />
                </Section>
              </aside>
            </div>
          </Page>
        );
      }}
    </QueryState>
  );
}
