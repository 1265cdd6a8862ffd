import { lazy, Suspense } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Section } from '../../components/page';
import { Loading } from '../../components/query-state';
import { useLabDownloads } from '../../features/depositing/api/get-lab-downloads';
import { Page } from '../../components/page';
import { LinkButton } from '../../components/button';
import { QueryState } from '../../components/query-state';
import { useLab } from '../../features/labs/api/get-lab';
import { useLabDatasets } from '../../features/depositing/api/get-lab-datasets';
import { DatasetList } from '../../features/depositing/components/dataset-list';
import { labRoleCan } from '../../../shared/lab-roles';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

// The chart library loads only where a chart is shown.
const DownloadsChart = lazy(() => import('../../features/depositing/components/downloads-chart'));

export function Component() {
  const { slug = '' } = useParams();
  return <RequireSession>{() => <LabDatasets slug={slug} />}</RequireSession>;
}

function LabDatasets({ slug }: { slug: string }) {
  const lab = useLab(slug);
  const datasets = useLabDatasets(slug, !!lab.data?.myRole);
  return (
    <QueryState query={lab}>
      {(l) =>
        !l.myRole ? (
          <Page title="Datasets">
            <p>Only members of {l.name} see its datasets in progress. Released datasets are public.</p>
          </Page>
        ) : (
          <Page
            wide
            title={`Datasets of ${l.name}`}
            lead={<Link to={paths.lab(slug)}>Back to the lab</Link>}
            actions={labRoleCan(l.myRole, { dataset: ['create'] }) ? <LinkButton to={paths.newDataset(slug)}>New dataset</LinkButton> : null}
          >
            <QueryState query={datasets}>{(d) => <DatasetList slug={slug} datasets={d} canCreate={labRoleCan(l.myRole, { dataset: ['create'] })} />}</QueryState>
            <Section title="Downloads">
              <Downloads slug={slug} />
            </Section>
          </Page>
        )
      }
    </QueryState>
  );
}

function Downloads({ slug }: { slug: string }) {
  const q = useLabDownloads(slug);
  return (
    <QueryState query={q}>
      {(data) => (
        <Suspense fallback={<Loading />}>
          <DownloadsChart data={data} />
        </Suspense>
      )}
    </QueryState>
  );
}
