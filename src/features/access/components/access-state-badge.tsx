import { Badge } from '../../../components/badge';

const looks = {
  pending: { tone: 'dusk', icon: '…', label: 'Waiting for the lab' },
  approved: { tone: 'reed', icon: '✓', label: 'Approved' },
  denied: { tone: 'ember', icon: '✕', label: 'Declined' },
  withdrawn: { tone: 'mist', icon: '–', label: 'Withdrawn' },
  active: { tone: 'reed', icon: '○', label: 'Access active' },
  expired: { tone: 'mist', icon: '⌛', label: 'Access expired' },
  revoked: { tone: 'ember', icon: '⊘', label: 'Access withdrawn' },
} as const;

export const AccessStateBadge = ({ state }: { state: keyof typeof looks }) => {
  const l = looks[state];
  return <Badge tone={l.tone} icon={l.icon}>{l.label}</Badge>;
};
