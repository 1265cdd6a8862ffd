import { useState } from 'react';
import { Button } from '../../../components/button';
import { citationUrl } from '../api/get-release';
import { useCitationText } from '../api/get-citation-text';

const STYLE_NAMES: Record<string, string> = { apa: 'APA', vancouver: 'Vancouver', harvard1: 'Harvard' };

/** How to cite: a formatted citation in a chosen style, BibTeX to copy, and the citation files. */
export function CitationBox({ suffix, styles }: { suffix: string; styles: Record<string, string> }) {
  const [style, setStyle] = useState('apa');
  const [copied, setCopied] = useState<string | null>(null);
  const bibtex = useCitationText(suffix, 'bibtex', true);
  const copy = async (what: string, text: string) => {
    await navigator.clipboard.writeText(text).catch(() => undefined);
    setCopied(what);
    setTimeout(() => setCopied(null), 2000);
  };
  return (
    <div className="flex flex-col gap-3 rounded-lg border border-mist bg-white p-4">
      <div className="flex flex-wrap items-center gap-2" role="tablist" aria-label="Citation style">
        {Object.keys(styles).map((s) => (
          <button
            key={s}
            role="tab"
            aria-selected={style === s}
            onClick={() => setStyle(s)}
            className={`rounded px-2 py-1 text-sm ${style === s ? 'bg-dusk text-paper' : 'text-dusk hover:bg-mist'}`}
          >
            {STYLE_NAMES[s] ?? s}
          </button>
        ))}
      </div>
      <p className="font-serif leading-relaxed" data-testid="formatted-citation">{styles[style]}</p>
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => copy('text', styles[style])}>{copied === 'text' ? 'Copied ✓' : 'Copy citation'}</Button>
        <Button variant="secondary" disabled={!bibtex.data} onClick={() => bibtex.data && copy('bibtex', bibtex.data)}>{copied === 'bibtex' ? 'Copied ✓' : 'Copy BibTeX'}</Button>
      </div>
      {bibtex.data ? <pre className="overflow-x-auto rounded bg-paper p-2 text-xs" data-testid="bibtex">{bibtex.data}</pre> : null}
      <p className="flex flex-wrap gap-3 text-sm">
        Download:
        <a href={citationUrl(suffix, 'bibtex')} download>BibTeX</a>
        <a href={citationUrl(suffix, 'ris')} download>RIS</a>
        <a href={citationUrl(suffix, 'csl-json')} download>CSL-JSON</a>
        <a href={citationUrl(suffix, 'cff')} download>CITATION.cff</a>
      </p>
    </div>
  );
}
