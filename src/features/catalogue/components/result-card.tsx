import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Badge } from '../../../components/badge';
import { paths } from '../../../app/paths';
import type { SearchItem } from '../../../../shared/contracts/catalogue';
import { HighlightedText } from './highlighted-text';
import { Sparkline } from './sparkline';

const fmt = (v: number | null, digits: number, unit = '') => (v === null ? '—' : `${v.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: 0 })}${unit}`);
// K spans orders of magnitude across species (10⁻⁴ to 10 s⁻²): significant digits, not decimals.
const sig = (v: number | null, unit: string) => (v === null ? '—' : `${v.toLocaleString('en-GB', { maximumSignificantDigits: 3 })}${unit}`);
const GROUP: Record<string, string> = { swarm: 'Swarm', school: 'School', flock: 'Flock', herd: 'Herd', colony: 'Colony', other: 'Other group' };

function AccessMark({ level }: { level: SearchItem['accessLevel'] }) {
  if (level === 'open') return <Badge tone="reed" icon="○">Open</Badge>;
  if (level === 'restricted') return <Badge tone="ember" icon="◐">Files on request</Badge>;
  return <Badge tone="plum" icon="◔">Under embargo</Badge>;
}

/**
 * One dataset in the catalogue: its newest release. The title is the link (one
 * tab stop per card); `actions` lets a page add its own controls, such as
 * adding the release to a comparison.
 */
export function ResultCard({ item, actions }: { item: SearchItem; actions?: (item: SearchItem) => ReactNode }) {
  const s = item.statistics;
  return (
    <article className="rounded-lg border border-mist bg-white p-4" aria-labelledby={`card-${item.suffix}`}>
      <div className="flex items-start justify-between gap-4">
        <div className="min-w-0">
          <h3 id={`card-${item.suffix}`} className="font-serif text-lg font-bold leading-snug">
            <Link to={paths.release(item.suffix)} className="rounded-sm text-ink no-underline hover:text-dusk hover:underline focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-dusk">
              <HighlightedText value={item.title} />
            </Link>
          </h3>
          <p className="mt-1 text-xs text-ink/70">
            {item.lab.name} · version {item.version}
            {item.versionCount > 1 ? ` (${item.versionCount} versions)` : ''} · {item.publishedAt.slice(0, 10)}
          </p>
        </div>
        <div className="text-dusk">
          <Sparkline values={item.sparkline} label="Mean speed over the recording" />
        </div>
      </div>
      <div className="mt-2 flex flex-wrap items-center gap-2 text-xs">
        <AccessMark level={item.accessLevel} />
        {item.species.length ? <span className="italic">{item.species.join(', ')}</span> : null}
        {item.groupType ? <span>{GROUP[item.groupType] ?? item.groupType}</span> : null}
        {item.setting ? <span>{item.setting === 'field' ? 'Field' : 'Laboratory'}</span> : null}
        {item.dimension ? <span>{item.dimension}D</span> : null}
        {item.frameRate ? <span className="tabular-nums">{fmt(item.frameRate, 1)} frames/s</span> : null}
      </div>
      {item.snippet.text ? (
        <p className="mt-2 text-sm leading-relaxed text-ink/80">
          <HighlightedText value={item.snippet} />
        </p>
      ) : null}
      <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 text-xs sm:grid-cols-4">
        <div><dt className="text-ink/60">Individuals</dt><dd className="tabular-nums font-medium">{fmt(s.individuals, 0)}</dd></div>
        <div><dt className="text-ink/60">Duration</dt><dd className="tabular-nums font-medium">{fmt(s.durationS, 1, ' s')}</dd></div>
        <div><dt className="text-ink/60">Polarization</dt><dd className="tabular-nums font-medium">{fmt(s.polarization, 2)}</dd></div>
        <div><dt className="text-ink/60">Spring constant K</dt><dd className="tabular-nums font-medium">{sig(s.springConstant, ' s⁻²')}</dd></div>
      </dl>
      {actions ? <div className="mt-3 flex flex-wrap gap-2">{actions(item)}</div> : null}
    </article>
  );
}
