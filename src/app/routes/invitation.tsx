import { useParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { useInvitation } from '../../features/labs/api/get-invitation';
import { InvitationCard } from '../../features/labs/components/invitation-card';
import { RequireSession } from '../require-session';

export function Component() {
  const { id = '' } = useParams();
  return (
    <RequireSession>
      {(user) => (
        <Page title="Invitation to a lab" lead={`Signed in as ${user.email}. Invitations open only for the address they were sent to.`}>
          <Invitation id={id} />
        </Page>
      )}
    </RequireSession>
  );
}

function Invitation({ id }: { id: string }) {
  const invitation = useInvitation(id, true);
  return <QueryState query={invitation}>{(inv) => <InvitationCard invitation={inv} />}</QueryState>;
}
