import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useAdminUsers } from '../../features/admin/api/get-admin-users';
import { UsersTable } from '../../features/admin/components/users-table';
import { RequireSession } from '../require-session';

export function Component() {
  return <RequireSession admin>{() => <AdminUsers />}</RequireSession>;
}

function AdminUsers() {
  const users = useAdminUsers();
  return (
    <Page wide title="Accounts" lead="Everyone with a Cohesia account, their platform role and their labs.">
      <QueryState query={users}>{(u) => <UsersTable users={u} />}</QueryState>
    </Page>
  );
}
