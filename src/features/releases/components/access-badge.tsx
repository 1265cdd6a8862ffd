import { Badge } from '../../../components/badge';

export function AccessBadge({ level, until }: { level: 'open' | 'restricted' | 'embargoed'; until?: string | null }) {
  if (level === 'open') return <Badge tone="reed" icon="○">Open</Badge>;
  if (level === 'restricted') return <Badge tone="ember" icon="◐">Restricted</Badge>;
  return <Badge tone="plum" icon="◑">Embargoed{until ? ` until ${until.slice(0, 10)}` : ''}</Badge>;
}

export function accessExplanation(level: 'open' | 'restricted' | 'embargoed', until?: string | null, lab?: string): string {
  if (level === 'open') return 'Anyone may download these files under the licence below.';
  if (level === 'restricted') return `The description, statistics and plots are public; the files are shared on request, decided by ${lab ?? 'the depositing lab'}.`;
  return `The description, statistics and plots are public; the files open to everyone on ${until?.slice(0, 10) ?? 'the embargo date'}.`;
}
