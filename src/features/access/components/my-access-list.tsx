import { Link } from 'react-router-dom';
import type { AccessRequestView } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { paths } from '../../../app/paths';
import { useWithdrawAccessRequest } from '../api/withdraw-access-request';
import { AccessStateBadge } from './access-state-badge';

export function MyAccessList({ items }: { items: AccessRequestView[] }) {
  const withdraw = useWithdrawAccessRequest();
  if (!items.length) return <p className="text-sm text-ink/70">You have not asked for any restricted data yet.</p>;
  return (
    <ul className="divide-y divide-mist rounded-lg border border-mist bg-white" data-testid="my-access">
      {items.map((r) => (
        <li key={r.id} className="flex flex-wrap items-center gap-3 px-4 py-3 text-sm">
          <div className="min-w-64 flex-1">
            {r.release ? <Link to={paths.release(r.release.suffix)} className="font-medium">{r.release.title}</Link> : <span className="font-medium">{r.dataset.title}</span>}
            <div className="text-xs text-ink/60">
              {r.scope === 'dataset' ? 'all versions' : `version ${r.release?.version}`} · asked {r.createdAt.slice(0, 10)}
              {r.decisionNote ? ` · note: ${r.decisionNote}` : ''}
            </div>
          </div>
          <AccessStateBadge state={r.grant ? r.grant.status : r.state} />
          {r.grant?.expiresAt && r.grant.status === 'active' ? <span className="text-xs text-ink/60">until {r.grant.expiresAt.slice(0, 10)}</span> : null}
          {r.state === 'pending' ? <Button variant="quiet" onClick={() => withdraw.mutate(r.id)}>Withdraw</Button> : null}
        </li>
      ))}
    </ul>
  );
}
