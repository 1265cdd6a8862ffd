import { Link } from 'react-router-dom';
import type { ComparedRelease } from '../../../../shared/contracts/comparisons';
import { paths } from '../../../../shared/paths';
import { downloadBlob, fileStem, toCsv } from '../../../lib/export-chart';
import { formatNumber } from '../../../lib/format';
import { seriesColour } from '../../ingest-report/palette';
import { columnHeader, scalarColumns } from '../scalar-columns';

/** The CSV of the table: one row per release, SI units in the header (spreadsheet formulas neutralised by toCsv). */
export function comparisonCsv(releases: ComparedRelease[]): string {
  const header = ['Release', 'DOI', 'Title', 'Lab', 'Group type', 'File', 'Declared unit', ...scalarColumns.map(columnHeader)];
  const rows = releases.map((r) => [r.suffix, r.doi, r.title, r.lab?.name ?? '', r.groupType ?? '', r.fileName ?? '', r.declaredUnit ?? '', ...scalarColumns.map((c) => r.scalars[c.key])]);
  return toCsv(header, rows);
}

/** Scalar statistics side by side: one column per release, one row per statistic, in SI units. */
export function ComparisonTable({ releases, title, onRemove }: { releases: ComparedRelease[]; title: string; onRemove?: (suffix: string) => void }) {
  function exportCsv() {
    // The byte-order mark lets spreadsheets read the units' superscripts as UTF-8.
    downloadBlob(new Blob(['\uFEFF', comparisonCsv(releases)], { type: 'text/csv;charset=utf-8' }), `${fileStem(title)}.csv`);
  }
  return (
    <section aria-labelledby="comparison-table-heading" className="flex flex-col gap-2">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="comparison-table-heading" className="font-serif text-xl font-bold">Statistics side by side</h2>
        <button type="button" onClick={exportCsv} className="rounded border border-dusk/60 bg-white px-2.5 py-1 text-sm font-medium text-dusk hover:bg-mist">
          Download table as CSV
        </button>
      </div>
      <p className="text-sm text-ink/75">
        All values in SI units, whatever unit each file was recorded in: lengths in metres, speeds in m/s, K in s⁻², times in seconds. Each release is summarised by its trajectory file with the most frames.
      </p>
      <div className="overflow-x-auto rounded-lg border border-mist bg-white">
        <table className="w-full border-collapse text-sm tabular-nums" data-testid="comparison-table">
          <thead>
            <tr className="border-b border-mist align-bottom">
              <th scope="col" className="sticky left-0 bg-white px-3 py-2 text-left font-semibold">Statistic (unit)</th>
              {releases.map((r, i) => (
                <th key={r.suffix} scope="col" className="min-w-40 px-3 py-2 text-left font-normal">
                  <span className="flex items-start gap-1.5">
                    <svg aria-hidden width="10" height="10" className="mt-1 shrink-0"><rect width="10" height="10" rx="2" fill={seriesColour(i)} /></svg>
                    <span>
                      <Link to={paths.release(r.suffix)} className="font-semibold">{r.title}</Link>
                      <span className="block text-xs text-ink/70">{r.lab?.name ?? 'No lab'} · v{r.version} · recorded in {r.declaredUnit ?? '?'}</span>
                      {onRemove ? (
                        <button type="button" className="mt-1 text-xs text-dusk hover:underline" onClick={() => onRemove(r.suffix)} aria-label={`Remove ${r.title} from the comparison`}>Remove</button>
                      ) : null}
                    </span>
                  </span>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {scalarColumns.map((c) => (
              <tr key={c.key} className="border-b border-mist/70 last:border-0 even:bg-paper/50">
                <th scope="row" className="sticky left-0 bg-inherit px-3 py-1.5 text-left font-normal text-ink/85">{columnHeader(c)}</th>
                {releases.map((r) => (
                  <td key={r.suffix} className="px-3 py-1.5 text-right">{c.key === 'dimension' && r.scalars.dimension ? `${r.scalars.dimension}D` : formatNumber(r.scalars[c.key], c.digits ?? 4)}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
