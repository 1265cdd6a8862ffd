import { Link } from 'react-router-dom';
import type { LabProfile } from '../../../../shared/contracts';
import { Badge, DemoBadge } from '../../../components/badge';
import { Section } from '../../../components/page';
import { DoiIdentifier, OrcidIdentifier, RorIdentifier } from '../../../components/identifier';
import { paths } from '../../../app/paths';

// The same words, icons and tones as the access badge of release pages (features do not import each other).
const levels = { open: ['reed', '○', 'Open'], restricted: ['ember', '◐', 'Restricted'], embargoed: ['plum', '◑', 'Embargoed'] } as const;

/** A lab's public page: who they are, who chose to be listed, what they released and how often it was downloaded. */
export function LabProfileView({ p }: { p: LabProfile }) {
  return (
    <article className="mx-auto max-w-4xl px-4 py-8">
      <title>{`${p.name} — Cohesia`}</title>
      <header className="border-b border-mist pb-6">
        <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
          <span className="font-semibold uppercase tracking-wide text-dusk">Lab</span>
          {p.isDemo ? <DemoBadge /> : null}
        </div>
        <h1 className="text-3xl font-bold leading-tight">{p.name}</h1>
        <div className="mt-3 flex flex-col gap-1 text-sm">
          {p.institution ? <span>{p.institution}</span> : null}
          {p.rorId ? <RorIdentifier rorId={p.rorId} label="ROR id" /> : null}
        </div>
      </header>
      {p.description ? <p className="my-8 max-w-3xl whitespace-pre-wrap font-serif text-lg leading-relaxed">{p.description}</p> : <div className="my-8" />}

      <div className="grid gap-8 md:grid-cols-[minmax(0,1fr)_16rem]">
        <Section title={`Releases (${p.releases.length})`}>
          {p.releases.length ? (
            <ul className="divide-y divide-mist rounded-lg border border-mist bg-white" data-testid="lab-releases">
              {p.releases.map((r) => (
                <li key={r.suffix} className="px-4 py-3">
                  <Link to={paths.release(r.suffix)} className="font-serif font-bold leading-snug">{r.title}</Link>
                  <div className="mt-1 flex flex-wrap items-center gap-x-3 gap-y-1 text-xs text-ink/75">
                    <span>v{r.version} · {r.publishedAt.slice(0, 10)}</span>
                    <Badge tone={levels[r.accessLevel][0]} icon={levels[r.accessLevel][1]}>{levels[r.accessLevel][2]}</Badge>
                    <span className="tabular-nums">{r.downloads} {r.downloads === 1 ? 'download' : 'downloads'}</span>
                  </div>
                  <div className="mt-1 text-xs"><DoiIdentifier doi={r.doi} /></div>
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-ink/70">No releases yet.</p>
          )}
        </Section>
        <div>
          <Section title="Downloads">
            <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1 rounded-lg border border-mist bg-white p-4 text-sm">
              <dt className="text-ink/70">Total</dt>
              <dd className="text-right font-semibold tabular-nums">{p.downloads.total}</dd>
              <dt className="text-ink/70">Unique</dt>
              <dd className="text-right font-semibold tabular-nums">{p.downloads.unique}</dd>
            </dl>
            <p className="mt-2 text-xs text-ink/60">Counted by the COUNTER Code of Practice (Release 5), over every release of the lab.</p>
          </Section>
          <Section title="People">
            {p.members.length ? (
              <ul className="flex flex-col gap-2 text-sm" data-testid="lab-people">
                {p.members.map((m) => (
                  <li key={`${m.name}-${m.orcid ?? ''}`}>
                    <div className="font-medium">{m.name}</div>
                    {m.orcid ? <div className="text-xs"><OrcidIdentifier orcid={m.orcid} label="ORCID iD" /></div> : null}
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-ink/70">No member has chosen to be listed yet.</p>
            )}
          </Section>
        </div>
      </div>
    </article>
  );
}
