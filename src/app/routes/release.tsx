import { useEffect } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Section } from '../../components/page';
import { DemoBadge } from '../../components/badge';
import { QueryState } from '../../components/query-state';
import { DoiIdentifier } from '../../components/identifier';
import { useRelease, type ReleaseLanding } from '../../features/releases/api/get-release';
import { AccessBadge, accessExplanation } from '../../features/releases/components/access-badge';
import { CitationBox } from '../../features/releases/components/citation-box';
import { AddToComparisonButton } from '../../features/comparison/components/add-to-comparison-button';
import { ReleaseFiles } from '../../features/releases/components/release-files';
import { ValidationReport } from '../../features/depositing/components/validation-report';
import { IngestReport } from '../../features/ingest-report/components/ingest-report';
import { RequestAccessForm } from '../../features/access/components/request-access-form';
import { useReleaseAccess } from '../../features/releases/api/get-release-access';
import { useSession } from '../../features/auth/api/get-session';
import { useLab } from '../../features/labs/api/get-lab';
import { WithdrawPanel } from '../../features/releases/components/withdraw-panel';
import { labRoleCan } from '../../../shared/lab-roles';
import { paths } from '../paths';

export function Component() {
  const { suffix = '' } = useParams();
  const release = useRelease(suffix);
  return <QueryState query={release}>{(r) => <Landing r={r} />}</QueryState>;
}

function Landing({ r }: { r: ReleaseLanding }) {
  const navigate = useNavigate();
  // The server puts the JSON-LD in the first page's head for crawlers without JavaScript; once this page
  // renders its own (and keeps it current while navigating), that copy would be a stale duplicate.
  useEffect(() => document.querySelectorAll('script[type="application/ld+json"][data-from="server"]').forEach((n) => n.remove()), []);
  const m = r.metadata;
  const creators: Array<{ name: string; orcid?: string; affiliation?: { name: string } }> = m.creators ?? [];
  return (
    <article className="mx-auto max-w-5xl px-4 py-8">
      {r.jsonLd ? <script type="application/ld+json">{JSON.stringify(r.jsonLd)}</script> : null}
      <title>{`${r.title} — Cohesia`}</title>
      {r.withdrawn ? (
        <div role="alert" className="mb-6 rounded-lg border border-ember bg-[#fbeee5] p-4">
          <p className="font-serif text-lg font-bold">This release was withdrawn on {r.withdrawn.at.slice(0, 10)}.</p>
          <p className="mt-1">{r.withdrawn.reason}</p>
          <p className="mt-1 text-sm">Its identifier and citation stay valid; its files and statistics are no longer shown.</p>
        </div>
      ) : null}
      <header className="border-b border-mist pb-6">
        <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
          <span className="font-semibold uppercase tracking-wide text-dusk">Dataset · version {r.version}</span>
          {!r.withdrawn ? <AccessBadge level={r.accessLevel} until={r.embargoUntil} /> : null}
          {r.dataset.lab?.isDemo ? <DemoBadge /> : null}
        </div>
        <h1 className="text-3xl font-bold leading-tight">{r.title}</h1>
        <p className="mt-3 text-ink/85">
          {creators.map((c, i) => (
            <span key={i}>
              {i ? ', ' : ''}
              {c.name}
              {c.orcid ? (
                <a href={`https://orcid.org/${c.orcid}`} className="ml-1 text-xs" aria-label={`ORCID iD of ${c.name}`} title={`ORCID iD ${c.orcid}`}>
                  ORCID
                </a>
              ) : null}
            </span>
          ))}
        </p>
        <div className="mt-4 flex flex-col gap-1 text-sm">
          <DoiIdentifier doi={r.doi} label="This version" />
          <DoiIdentifier doi={r.dataset.doi} label="All versions" />
          <span className="text-ink/70">
            Published {r.publishedAt.slice(0, 10)}
            {r.dataset.lab ? (
              <>
                {' '}by <Link to={paths.labProfile(r.dataset.lab.slug)}>{r.dataset.lab.name}</Link>
              </>
            ) : null}
          </span>
        </div>
        <label className="mt-4 flex items-center gap-2 text-sm">
          Version
          <select
            className="rounded border border-[#b7c3c9] bg-white px-2 py-1"
            value={r.suffix}
            onChange={(e) => navigate(paths.release(e.target.value))}
          >
            {r.versions.map((v) => (
              <option key={v.suffix} value={v.suffix}>
                v{v.version} · {v.publishedAt.slice(0, 10)}
                {v.version === r.latestVersion ? ' (latest)' : ''}
                {v.withdrawn ? ' (withdrawn)' : ''}
              </option>
            ))}
          </select>
        </label>
        {!r.withdrawn && r.results.length ? (
          <div className="mt-4">
            <AddToComparisonButton suffix={r.suffix} title={r.title} />
          </div>
        ) : null}
      </header>

      {!r.withdrawn ? (
        <>
          <section className="my-8 max-w-3xl">
            <p className="whitespace-pre-wrap font-serif text-lg leading-relaxed">{m.description}</p>
            {m.keywords?.length ? <p className="mt-3 text-sm text-ink/70">Keywords: {m.keywords.join(', ')}</p> : null}
          </section>
          <div className="grid gap-8 md:grid-cols-2">
            <Section title="Access and licence">
              <p className="text-sm">{accessExplanation(r.accessLevel, r.embargoUntil, r.dataset.lab?.name)}</p>
              <p className="mt-2 text-sm">
                Licence: {r.licence.url ? <a href={r.licence.url}>{r.licence.name}</a> : r.licence.name} (<span className="font-mono">{r.licence.id}</span>)
              </p>
            </Section>
            <Section title="Recording">
              <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
                <dt className="text-ink/70">Species</dt><dd>{(m.species ?? []).map((s: { name: string }) => s.name).join(', ')}</dd>
                <dt className="text-ink/70">Group</dt><dd>{m.groupType}, {m.setting}</dd>
                <dt className="text-ink/70">Individuals</dt><dd>{m.numberOfIndividuals ?? '–'}</dd>
                <dt className="text-ink/70">Dimension</dt><dd>{m.dimension}D, positions in {m.units}</dd>
                <dt className="text-ink/70">Frame rate</dt><dd>{m.frameRate} frames/s</dd>
                {m.site?.place ? (<><dt className="text-ink/70">Site</dt><dd>{m.site.place}</dd></>) : null}
              </dl>
            </Section>
          </div>
          {r.changelog ? (
            <Section title="What changed in this version">
              <p className="whitespace-pre-wrap text-sm">{r.changelog}</p>
            </Section>
          ) : null}
          <Section title="Files">
            <ReleaseFiles suffix={r.suffix} files={r.files} />
            <AccessRequestPanel suffix={r.suffix} />
          </Section>
          {r.results.map((x) => (
            <Section key={x.fileName} title={`Statistics of ${x.fileName}`}>
              <ValidationReport result={x.result} />
              <IngestReport result={x.result} />
            </Section>
          ))}
        </>
      ) : null}
      <Section title="How to cite">
        <CitationBox suffix={r.suffix} styles={r.citation.styles} />
      </Section>
      {!r.withdrawn && r.dataset.lab ? <Withdraw labSlug={r.dataset.lab.slug} suffix={r.suffix} /> : null}
    </article>
  );
}

/** For restricted files: the request form for a signed-in researcher, a sign-in link for a visitor. */
function AccessRequestPanel({ suffix }: { suffix: string }) {
  const session = useSession();
  const access = useReleaseAccess(suffix);
  if (!access.data || access.data.allowed || /withdrawn/.test(access.data.reason)) return null;
  if (!session.data) {
    return (
      <p className="mt-3 text-sm">
        <Link to={`${paths.signIn}?next=${encodeURIComponent(paths.release(suffix))}`}>Sign in</Link> to ask the lab for access.
      </p>
    );
  }
  return (
    <div className="mt-4">
      <RequestAccessForm suffix={suffix} />
    </div>
  );
}

function Withdraw({ labSlug, suffix }: { labSlug: string; suffix: string }) {
  const session = useSession();
  const lab = useLab(labSlug);
  const may = session.data?.role === 'admin' || labRoleCan(lab.data?.myRole, { lab: ['update'] });
  return may ? (
    <Section title="Withdrawal">
      <WithdrawPanel labSlug={labSlug} suffix={suffix} />
    </Section>
  ) : null;
}
