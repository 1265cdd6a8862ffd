import { useId, useRef, useState, type ReactNode } from 'react';
import { downloadBlob, embeddedFontCss, fileStem, standaloneSvg, svgToPng, toCsv, type CsvCell } from '../../../lib/export-chart';

export type LegendItem = { label: string; color: string; dashed?: boolean; marker?: boolean };
export type FigureCsv = { header: string[]; rows: CsvCell[][] };

const exportButton =
  'rounded border border-dusk/60 bg-white px-2 py-0.5 text-xs font-medium text-dusk hover:bg-mist disabled:cursor-wait disabled:opacity-60';

/** A plot with its title, legend, one-sentence caption and PNG / SVG / CSV export. */
export function Figure({ id, title, caption, legend = [], csv, height = 240, children }: {
  id: string;
  title: string;
  caption: ReactNode;
  legend?: LegendItem[];
  csv: FigureCsv;
  height?: number;
  children: ReactNode;
}) {
  const chart = useRef<HTMLDivElement>(null);
  const headingId = useId();
  const [busy, setBusy] = useState<'png' | 'svg' | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const stem = fileStem(title);

  async function exportImage(kind: 'png' | 'svg') {
    const svg = chart.current?.querySelector<SVGSVGElement>('svg.recharts-surface') ?? chart.current?.querySelector<SVGSVGElement>('svg');
    if (!svg) return setProblem('The chart has not been drawn yet.');
    setBusy(kind);
    setProblem(null);
    try {
      const { markup, width, height: h } = standaloneSvg(svg, { title, legend, fontCss: await embeddedFontCss() });
      const blob = kind === 'svg' ? new Blob([markup], { type: 'image/svg+xml;charset=utf-8' }) : await svgToPng(markup, width, h, 2);
      downloadBlob(blob, `${stem}.${kind}`);
    } catch (e) {
      setProblem(e instanceof Error ? e.message : 'The export failed.');
    } finally {
      setBusy(null);
    }
  }

  function exportCsv() {
    // The byte-order mark lets spreadsheets read the units' superscripts as UTF-8.
    downloadBlob(new Blob(['\uFEFF', toCsv(csv.header, csv.rows)], { type: 'text/csv;charset=utf-8' }), `${stem}.csv`);
  }

  return (
    <figure className="flex min-w-0 flex-col gap-2 rounded-lg border border-mist bg-white p-3" aria-labelledby={headingId} data-testid={`figure-${id}`}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h3 id={headingId} className="font-serif text-sm font-bold leading-snug">{title}</h3>
        <div className="flex gap-1" role="group" aria-label={`Export ${title}`}>
          <button type="button" className={exportButton} onClick={() => exportImage('png')} disabled={busy !== null} aria-label={`Download ${title} as PNG`}>PNG</button>
          <button type="button" className={exportButton} onClick={() => exportImage('svg')} disabled={busy !== null} aria-label={`Download ${title} as SVG`}>SVG</button>
          <button type="button" className={exportButton} onClick={exportCsv} aria-label={`Download the data of ${title} as CSV`}>CSV</button>
        </div>
      </div>
      <div ref={chart} style={{ height }} className="w-full text-ink" data-testid="chart">
        {children}
      </div>
      {legend.length ? (
        <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label="Legend">
          {legend.map((l) => (
            <li key={l.label} className="flex items-center gap-1.5">
              <svg aria-hidden width="22" height="10" className="shrink-0">
                {l.marker ? <circle cx="11" cy="5" r="3.5" fill={l.color} /> : <line x1="1" x2="21" y1="5" y2="5" stroke={l.color} strokeWidth="2.5" strokeDasharray={l.dashed ? '5 3' : undefined} />}
              </svg>
              <span className="tabular-nums">{l.label}</span>
            </li>
          ))}
        </ul>
      ) : null}
      <figcaption className="text-xs leading-relaxed text-ink/75">{caption}</figcaption>
      {problem ? <p role="alert" className="text-xs text-[#9a4a1c]"><span aria-hidden>⚠ </span>{problem}</p> : null}
    </figure>
  );
}

/** The place of a figure the engine did not compute for this file. */
export function MissingFigure({ title, reason }: { title: string; reason: string }) {
  return (
    <figure className="flex min-w-0 flex-col gap-2 rounded-lg border border-dashed border-mist bg-white/60 p-3">
      <h3 className="font-serif text-sm font-bold">{title}</h3>
      <figcaption className="text-xs text-ink/70">{reason}</figcaption>
    </figure>
  );
}
