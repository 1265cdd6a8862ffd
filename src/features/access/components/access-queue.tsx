import { useState } from 'react';
import type { AccessRequestView } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextArea, TextField } from '../../../components/form';
import { errorMessage } from '../../../components/query-state';
import { useDecideAccessRequest } from '../api/decide-access-request';
import { useRevokeAccessGrant } from '../api/revoke-access-grant';
import { AccessStateBadge } from './access-state-badge';

function Decision({ slug, r }: { slug: string; r: AccessRequestView }) {
  const decide = useDecideAccessRequest(slug);
  const [expiresOn, setExpiresOn] = useState('');
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  const go = (decision: 'approve' | 'deny') => {
    setError(null);
    decide.mutate({ id: r.id, input: { decision, expiresOn, note } }, { onError: (e) => setError(errorMessage(e)) });
  };
  return (
    <div className="mt-2 flex flex-col gap-2">
      {error ? <FormAlert>{error}</FormAlert> : null}
      <div className="grid gap-2 sm:grid-cols-[12rem_1fr]">
        <TextField label="Access ends on (optional)" type="date" value={expiresOn} onChange={(e) => setExpiresOn(e.target.value)} />
        <TextArea label="Note to the requester (a reason is needed to decline)" value={note} onChange={(e) => setNote(e.target.value)} className="min-h-12" />
      </div>
      <div className="flex gap-2">
        <Button onClick={() => go('approve')} busy={decide.isPending && decide.variables?.input.decision === 'approve'}>Approve</Button>
        <Button variant="danger" onClick={() => go('deny')} busy={decide.isPending && decide.variables?.input.decision === 'deny'}>Decline</Button>
      </div>
    </div>
  );
}

/** The lab's queue of access requests, with decisions and revocation. */
export function AccessQueue({ slug, items, highlight }: { slug: string; items: AccessRequestView[]; highlight?: string | null }) {
  const revoke = useRevokeAccessGrant(slug);
  if (!items.length) return <p className="text-sm text-ink/70">No requests here.</p>;
  return (
    <ul className="flex flex-col gap-3">
      {items.map((r) => (
        <li key={r.id} className={`rounded-lg border bg-white p-4 text-sm ${highlight === r.id ? 'border-dusk ring-2 ring-dusk/30' : 'border-mist'}`} data-testid="access-request">
          <div className="flex flex-wrap items-center gap-2">
            <span className="font-medium">{r.requester.name}</span>
            <span className="text-ink/70">{r.requester.email} · {r.affiliation}</span>
            <span className="ml-auto"><AccessStateBadge state={r.grant ? r.grant.status : r.state} /></span>
          </div>
          <div className="mt-1 text-xs text-ink/60">
            {r.release ? `${r.release.title}, version ${r.release.version}` : `${r.dataset.title}, all versions`} · asked {r.createdAt.slice(0, 10)} · accepted terms version {r.termsVersion}
          </div>
          <p className="mt-2 whitespace-pre-wrap">{r.purpose}</p>
          {r.decisionNote ? <p className="mt-1 text-xs text-ink/70">Note: {r.decisionNote}</p> : null}
          {r.state === 'pending' ? <Decision slug={slug} r={r} /> : null}
          {r.grant?.status === 'active' ? (
            <div className="mt-2">
              <Button variant="danger" onClick={() => revoke.mutate(r.grant!.id)} busy={revoke.isPending && revoke.variables === r.grant.id}>Withdraw access</Button>
            </div>
          ) : null}
        </li>
      ))}
    </ul>
  );
}
