import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useAdminLabs } from '../../features/admin/api/get-admin-labs';
import { LabsTable } from '../../features/admin/components/labs-table';
import { RequireSession } from '../require-session';

export function Component() {
  return <RequireSession admin>{() => <AdminLabs />}</RequireSession>;
}

function AdminLabs() {
  const labs = useAdminLabs();
  return (
    <Page wide title="All labs" lead="Every lab on this installation.">
      <QueryState query={labs}>{(l) => <LabsTable labs={l} />}</QueryState>
    </Page>
  );
}
