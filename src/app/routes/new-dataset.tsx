import { useNavigate, useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { CreateDatasetForm } from '../../features/depositing/components/create-dataset-form';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

export function Component() {
  const { slug = '' } = useParams();
  const navigate = useNavigate();
  return (
    <RequireSession>
      {() => (
        <Page title="New dataset" lead="A dataset is a series of releases. You work in its draft: files, metadata, then review.">
          <CreateDatasetForm slug={slug} onCreated={(d) => navigate(paths.draft(slug, d.draftId))} />
        </Page>
      )}
    </RequireSession>
  );
}
