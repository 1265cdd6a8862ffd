import { useNavigate } from 'react-router-dom';
import { Page } from '../../components/page';
import { CreateLabForm } from '../../features/labs/components/create-lab-form';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

export function Component() {
  const navigate = useNavigate();
  return (
    <RequireSession>
      {() => (
        <Page title="Create a lab" lead="A lab deposits and releases datasets together. You can invite its members next.">
          <CreateLabForm onCreated={(lab) => navigate(paths.lab(lab.slug))} />
        </Page>
      )}
    </RequireSession>
  );
}
