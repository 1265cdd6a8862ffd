import { useEffect, useState } from 'react';
import { paths } from '../app/paths';

/** Copies a value to the clipboard and says so for a moment (also to screen readers). */
export function CopyButton({ value, label }: { value: string; label?: string }) {
  const [copied, setCopied] = useState(false);
  useEffect(() => {
    if (!copied) return;
    const t = setTimeout(() => setCopied(false), 1500);
    return () => clearTimeout(t);
  }, [copied]);
  return (
    <button
      type="button"
      className="rounded border border-mist px-1.5 text-xs text-dusk hover:bg-mist"
      onClick={() => navigator.clipboard?.writeText(value).then(() => setCopied(true), () => undefined)}
      aria-label={label ?? `Copy ${value}`}
    >
      <span aria-live="polite">{copied ? 'Copied' : 'Copy'}</span>
    </button>
  );
}

/**
 * An identifier shown as a link with a copy button. DOIs link to the portal's
 * own resolver (`/doi/…`): the demo prefix is not registered, so doi.org would not find them.
 */
export function Identifier({ value, href, label, external = false }: { value: string; href?: string | null; label?: string; external?: boolean }) {
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      {label ? <span className="text-ink/70">{label}</span> : null}
      {href ? (
        // A plain link: /doi/… is answered by the server (a redirect), not by the client router.
        <a href={href} className="font-mono underline decoration-dotted underline-offset-2" rel={external ? 'noreferrer' : undefined}>{value}</a>
      ) : (
        <span className="font-mono">{value}</span>
      )}
      <CopyButton value={value} />
    </span>
  );
}

/** A DOI of this portal; `resolvable` is false before the identifier has a release to lead to. */
export function DoiIdentifier({ doi, label, resolvable = true }: { doi: string; label?: string; resolvable?: boolean }) {
  return <Identifier value={doi} href={resolvable ? paths.resolveDoi(doi) : null} label={label} />;
}

/** An ORCID iD, linked to its public record. */
export function OrcidIdentifier({ orcid, label }: { orcid: string; label?: string }) {
  return <Identifier value={orcid} href={`https://orcid.org/${orcid}`} label={label} external />;
}

/** A ROR id (stored as its https://ror.org/… form), linked to its record. */
export function RorIdentifier({ rorId, label }: { rorId: string; label?: string }) {
  return <Identifier value={rorId.replace(/^https:\/\/ror\.org\//, '')} href={rorId} label={label} external />;
}
