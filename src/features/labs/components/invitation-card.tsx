import { useState } from 'react';
import type { InvitationView } from '../../../../shared/contracts';
import { Button, LinkButton } from '../../../components/button';
import { FormAlert } from '../../../components/form';
import { errorMessage } from '../../../components/query-state';
import { paths } from '../../../app/paths';
import { useRespondToInvitation } from '../api/respond-to-invitation';
import { RoleBadge } from './role-badge';

export function InvitationCard({ invitation }: { invitation: InvitationView }) {
  const respond = useRespondToInvitation(invitation.id);
  const [error, setError] = useState<string | null>(null);
  const answer = (a: 'accept' | 'reject') => {
    setError(null);
    respond.mutate(a, { onError: (e) => setError(errorMessage(e)) });
  };
  const status = respond.data?.status ?? invitation.status;

  return (
    <div className="flex flex-col gap-4 rounded-lg border border-mist bg-white p-6">
      <p className="font-serif text-lg">
        {invitation.inviterName} invites you to join <strong>{invitation.labName}</strong> as <RoleBadge role={invitation.role} />
      </p>
      {error ? <FormAlert>{error}</FormAlert> : null}
      {status === 'pending' ? (
        <div className="flex gap-3">
          <Button onClick={() => answer('accept')} busy={respond.isPending && respond.variables === 'accept'}>Accept and join</Button>
          <Button variant="secondary" onClick={() => answer('reject')} busy={respond.isPending && respond.variables === 'reject'}>Decline</Button>
        </div>
      ) : status === 'accepted' ? (
        <FormAlert tone="success">
          You are now a member of {invitation.labName}. <LinkButton variant="quiet" to={paths.lab(invitation.labSlug)}>Open the lab</LinkButton>
        </FormAlert>
      ) : status === 'expired' ? (
        <FormAlert>This invitation has expired. Ask the lab lead to invite you again.</FormAlert>
      ) : (
        <FormAlert tone="info">This invitation is {status === 'rejected' ? 'declined' : 'no longer open'}.</FormAlert>
      )}
    </div>
  );
}
