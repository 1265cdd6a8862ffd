import type { ReactNode } from 'react';

type Tone = 'dusk' | 'reed' | 'ember' | 'plum' | 'mist';

const tones: Record<Tone, string> = {
  dusk: 'border-dusk/50 bg-[#e6eef3] text-dusk',
  reed: 'border-reed bg-[#eef4ef] text-[#3d5c43]',
  ember: 'border-ember bg-[#fbeee5] text-[#8a4418]',
  plum: 'border-plum bg-[#f1ebf4] text-plum',
  mist: 'border-[#b7c3c9] bg-mist text-ink',
};

/** Status is never colour alone: every badge carries an icon and a word. */
export function Badge({ tone = 'mist', icon, children }: { tone?: Tone; icon: string; children: ReactNode }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-medium ${tones[tone]}`}>
      <span aria-hidden>{icon}</span>
      {children}
    </span>
  );
}

export const DemoBadge = () => <Badge tone="plum" icon="◇">Demo</Badge>;
