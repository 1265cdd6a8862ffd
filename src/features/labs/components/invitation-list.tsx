import type { LabInvitation } from '../../../../shared/contracts';
import { Badge } from '../../../components/badge';
import { Button } from '../../../components/button';
import { useCancelInvitation } from '../api/cancel-invitation';
import { RoleBadge } from './role-badge';

const statusLook: Record<string, { tone: 'dusk' | 'reed' | 'ember' | 'mist'; icon: string; label: string }> = {
  pending: { tone: 'dusk', icon: '✉', label: 'Awaiting answer' },
  accepted: { tone: 'reed', icon: '✓', label: 'Accepted' },
  rejected: { tone: 'ember', icon: '✕', label: 'Declined' },
  canceled: { tone: 'mist', icon: '–', label: 'Withdrawn' },
};

export function InvitationList({ slug, invitations }: { slug: string; invitations: LabInvitation[] }) {
  const cancel = useCancelInvitation(slug);
  if (invitations.length === 0) return <p className="text-sm text-ink/70">No invitations yet.</p>;
  return (
    <ul className="divide-y divide-mist rounded-lg border border-mist bg-white">
      {invitations.map((i) => {
        const expired = i.status === 'pending' && new Date(i.expiresAt) < new Date();
        const look = expired ? { tone: 'mist' as const, icon: '⌛', label: 'Expired' } : (statusLook[i.status] ?? statusLook.pending);
        return (
          <li key={i.id} className="flex flex-wrap items-center gap-3 px-4 py-2 text-sm">
            <span className="min-w-48 font-medium">{i.email}</span>
            <RoleBadge role={i.role} />
            <Badge tone={look.tone} icon={look.icon}>{look.label}</Badge>
            <span className="text-ink/60">by {i.invitedBy}</span>
            {i.status === 'pending' && !expired ? (
              <Button variant="quiet" className="ml-auto" onClick={() => cancel.mutate(i.id)} busy={cancel.isPending && cancel.variables === i.id}>
                Withdraw
              </Button>
            ) : null}
          </li>
        );
      })}
    </ul>
  );
}
