import { Badge } from '../../../components/badge';
import { Section } from '../../../components/page';
import { formatNumber } from '../../../lib/format';

type Issue = { kind: string; severity: string; message: string; rows?: number[]; count?: number; column?: string };

/** The engine's validation report and scalar summaries, in words and a dense table. */
export function ValidationReport({ result }: { result: Record<string, any> }) {
  const errors: Issue[] = result.validation?.errors ?? [];
  const warnings: Issue[] = result.validation?.warnings ?? [];
  const s = result.summary;
  const p = result.parameters ?? {};
  return (
    <div className="flex flex-col gap-6">
      <Section title="Checks">
        <div className="mb-3 flex flex-wrap gap-2">
          {result.status === 'ok' ? <Badge tone="reed" icon="✓">Passed</Badge> : <Badge tone="ember" icon="⚠">Did not pass</Badge>}
          <Badge tone={errors.length ? 'ember' : 'mist'} icon="✕">{errors.length} errors</Badge>
          <Badge tone={warnings.length ? 'dusk' : 'mist'} icon="!">{warnings.length} warnings</Badge>
          <span className="text-xs text-ink/60">engine {result.engineVersion}</span>
        </div>
        {[...errors, ...warnings].length ? (
          <ul className="flex flex-col gap-2" data-testid="issues">
            {[...errors, ...warnings].map((i, n) => (
              <li key={n} className={`rounded border px-3 py-2 text-sm ${i.severity === 'error' ? 'border-ember bg-[#fbeee5]' : 'border-mist bg-white'}`}>
                <div className="flex items-start gap-2">
                  <span aria-hidden>{i.severity === 'error' ? '✕' : '!'}</span>
                  <span className="font-medium">{i.message}</span>
                </div>
                {i.rows?.length ? (
                  <div className="mt-1 text-xs text-ink/70">
                    Rows {i.rows.slice(0, 10).map((r) => r.toLocaleString('en-GB')).join(', ')}
                    {i.count && i.count > i.rows.length ? ` and ${(i.count - Math.min(10, i.rows.length)).toLocaleString('en-GB')} more` : ''}
                  </div>
                ) : null}
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-ink/70">No problems found.</p>
        )}
      </Section>
      {s ? (
        <Section title="Summary">
          <div className="overflow-x-auto rounded-lg border border-mist bg-white">
            <table className="w-full border-collapse text-sm" data-testid="summary-table">
              <tbody>
                {[
                  ['Rows', formatNumber(s.rows, 9)],
                  ['Tracks', formatNumber(s.tracks, 9)],
                  ['Frames', formatNumber(s.frames, 9)],
                  ['Duration', `${formatNumber(s.durationS)} s`],
                  ['Frame rate', `${formatNumber(p.fps)} frames/s`],
                  ['Dimension', `${p.dims ?? '–'}D`],
                  ['Individuals per frame (min / mean / max)', `${formatNumber(s.individualsPerFrame?.min)} / ${formatNumber(s.individualsPerFrame?.mean)} / ${formatNumber(s.individualsPerFrame?.max)}`],
                  ['Group size (RMS radius)', `${formatNumber(s.radius?.mean)} m`],
                  ['Mean speed', `${formatNumber(s.velocity?.speed?.mean)} m/s`],
                  ['Velocity kurtosis per component', (s.velocity?.components ?? []).map((c: any) => `${c.name} ${formatNumber(c.kurtosis)}`).join(', ')],
                  ['Polarization', `${formatNumber(s.polarization?.mean)} (random headings: ${formatNumber(s.polarization?.randomHeadingsBaseline)})`],
                  ['Milling', formatNumber(s.milling?.mean)],
                  ['Nearest-neighbour distance', `${formatNumber(s.nearestNeighbour?.mean)} m (median ${formatNumber(s.nearestNeighbour?.median)} m)`],
                  ['Effective spring constant K', s.springConstant?.throughOrigin ? `${formatNumber(s.springConstant.throughOrigin.springConstant)} s⁻² ± ${formatNumber(s.springConstant.throughOrigin.standardError)} (R² ${formatNumber(s.springConstant.throughOrigin.rSquared)})` : '–'],
                  ['Velocity autocorrelation: 1/e time, first zero', `${formatNumber(s.autocorrelation?.eFoldingTimeS)} s, ${formatNumber(s.autocorrelation?.firstZeroCrossingS)} s`],
                  ['Transient pairs (events, paired fraction)', `${formatNumber(s.pairs?.events, 9)}, ${formatNumber(s.pairs?.pairedFraction)}`],
                ].map(([k, v]) => (
                  <tr key={k} className="border-b border-mist/70">
                    <th scope="row" className="w-80 px-3 py-1.5 text-left font-medium">{k}</th>
                    <td className="px-3 py-1.5 tabular-nums">{v}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </Section>
      ) : null}
    </div>
  );
}
