import { Badge } from '../../../components/badge';

const looks: Record<string, { tone: 'dusk' | 'reed' | 'ember' | 'plum' | 'mist'; icon: string; label: string }> = {
  uploading: { tone: 'dusk', icon: '↥', label: 'Uploading' },
  queued: { tone: 'dusk', icon: '…', label: 'Waiting to be checked' },
  verifying: { tone: 'dusk', icon: '⟳', label: 'Checking' },
  ingesting: { tone: 'dusk', icon: '⟳', label: 'Checking and analysing' },
  ready: { tone: 'reed', icon: '✓', label: 'Checked' },
  stored: { tone: 'reed', icon: '✓', label: 'Stored' },
  invalid: { tone: 'ember', icon: '⚠', label: 'Needs attention' },
  failed: { tone: 'ember', icon: '✕', label: 'Could not be processed' },
};

export const FileStateBadge = ({ state }: { state: string }) => {
  const l = looks[state] ?? { tone: 'mist' as const, icon: '•', label: state };
  return <Badge tone={l.tone} icon={l.icon}>{l.label}</Badge>;
};

const draftLooks: Record<string, { tone: 'dusk' | 'reed' | 'ember' | 'plum' | 'mist'; icon: string; label: string }> = {
  editing: { tone: 'mist', icon: '✎', label: 'Draft' },
  submitted: { tone: 'dusk', icon: '…', label: 'In review' },
  returned: { tone: 'ember', icon: '↩', label: 'Returned for changes' },
  published: { tone: 'reed', icon: '✓', label: 'Published' },
};

export const DraftStateBadge = ({ state }: { state: string }) => {
  const l = draftLooks[state] ?? { tone: 'mist' as const, icon: '•', label: state };
  return <Badge tone={l.tone} icon={l.icon}>{l.label}</Badge>;
};
