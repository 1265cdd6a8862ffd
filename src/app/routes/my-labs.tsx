import { Page } from '../../components/page';
import { LinkButton } from '../../components/button';
import { QueryState } from '../../components/query-state';
import { useMyLabs } from '../../features/labs/api/get-my-labs';
import { LabList } from '../../features/labs/components/lab-list';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

export function Component() {
  return <RequireSession>{() => <MyLabs />}</RequireSession>;
}

function MyLabs() {
  const labs = useMyLabs();
  return (
    <Page title="My labs" wide actions={<LinkButton to={paths.createLab}>Create a lab</LinkButton>}>
      <QueryState query={labs}>{(l) => <LabList labs={l} />}</QueryState>
    </Page>
  );
}
