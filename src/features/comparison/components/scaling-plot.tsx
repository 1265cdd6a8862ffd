import { useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { CartesianGrid, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from 'recharts';
import type { ComparedRelease } from '../../../../shared/contracts/comparisons';
import { paths } from '../../../../shared/paths';
import { powerLawFit } from '../../../../shared/stats/power-law-fit';
import { formatNumber } from '../../../lib/format';
import { Figure, type LegendItem } from '../../ingest-report/components/figure';
import { seriesColour } from '../../ingest-report/palette';
import { columnByKey, columnHeader, scalarColumns, type ScalarColumn } from '../scalar-columns';

const INK = '#1d2a33';
const RULE = '#b7c3c9';
const tick = { fontSize: 11, fill: INK };
const fmt = (v: unknown) => (typeof v === 'number' ? formatNumber(v, 3) : String(v ?? ''));

type Point = { x: number; y: number; release: ComparedRelease };

/** An axis range a little wider than the data, so no point sits on the frame (a factor on log axes). */
function padded(values: number[], scale: 'log' | 'linear'): [number, number] | ['auto', 'auto'] {
  if (!values.length) return ['auto', 'auto'];
  const lo = Math.min(...values), hi = Math.max(...values);
  if (scale === 'log') return lo === hi ? [lo / 2, hi * 2] : [lo / (hi / lo) ** 0.06, hi * (hi / lo) ** 0.06];
  const pad = lo === hi ? Math.abs(lo) * 0.1 || 1 : (hi - lo) * 0.06;
  return [lo - pad, hi + pad];
}
type Scale = 'log' | 'linear';
const select = 'rounded border border-mist bg-white px-2 py-1 text-sm';

function PointTooltip({ active, payload, xc, yc }: { active?: boolean; payload?: { payload?: Point }[]; xc: ScalarColumn; yc: ScalarColumn }) {
  const p = payload?.[0]?.payload;
  if (!active || !p?.release) return null;
  return (
    <div className="max-w-72 rounded border border-mist bg-white p-2 text-xs shadow-sm">
      <p className="font-semibold">{p.release.title}</p>
      <p className="text-ink/70">{p.release.lab?.name ?? 'No lab'} · {p.release.groupType ?? 'group type not given'}</p>
      <p className="tabular-nums">{xc.label}: {formatNumber(p.x, 4)} {xc.unit}</p>
      <p className="tabular-nums">{yc.label}: {formatNumber(p.y, 4)} {yc.unit}</p>
      <p className="mt-1 text-dusk">Click the point to open the release.</p>
    </div>
  );
}

/** One scalar statistic against another over every public release, with a least-squares power law on log–log axes. */
export function ScalingPlot({ releases }: { releases: ComparedRelease[] }) {
  const navigate = useNavigate();
  const [xKey, setXKey] = useState<string>('individuals');
  const [yKey, setYKey] = useState<string>('springConstantS2');
  const [xScale, setXScale] = useState<Scale>('log');
  const [yScale, setYScale] = useState<Scale>('log');
  const [colourBy, setColourBy] = useState<'groupType' | 'lab'>('groupType');
  const xc = columnByKey(xKey)!;
  const yc = columnByKey(yKey)!;

  const { groups, dropped, fit, all } = useMemo(() => {
    const all: Point[] = [];
    let dropped = 0;
    for (const r of releases) {
      const x = r.scalars[xc.key], y = r.scalars[yc.key];
      if (x === null || y === null) continue;
      // A log axis has no place for zero or negative values.
      if ((xScale === 'log' && x <= 0) || (yScale === 'log' && y <= 0)) {
        dropped++;
        continue;
      }
      all.push({ x, y, release: r });
    }
    const key = (p: Point) => (colourBy === 'lab' ? p.release.lab?.name ?? 'No lab' : p.release.groupType ?? 'not given');
    const names = [...new Set(all.map(key))].sort();
    const groups = names.map((name, i) => ({ name, colour: seriesColour(i), points: all.filter((p) => key(p) === name) }));
    const fit = powerLawFit(all.map((p) => p.x), all.map((p) => p.y));
    return { groups, dropped, fit, all };
  }, [releases, xc, yc, xScale, yScale, colourBy]);

  const fitLine = useMemo(() => {
    const xs = all.map((p) => p.x).filter((x) => x > 0);
    if (!(fit.count >= 3) || !Number.isFinite(fit.exponent) || !xs.length) return [];
    const lo = Math.min(...xs), hi = Math.max(...xs);
    return Array.from({ length: 24 }, (_, i) => lo * (hi / lo) ** (i / 23)).map((x) => ({ x, y: fit.prefactor * x ** fit.exponent }));
  }, [all, fit]);

  const legend: LegendItem[] = groups.map((g) => ({ label: `${g.name} (${g.points.length})`, color: g.colour, marker: true }));
  if (fitLine.length) legend.push({ label: `y = ${formatNumber(fit.prefactor, 3)} · x^${formatNumber(fit.exponent, 3)}`, color: INK, dashed: true });
  const fitText = fitLine.length
    ? `Power law fitted by least squares on log–log scales over ${fit.count} releases: exponent b = ${formatNumber(fit.exponent, 3)}, 95 % confidence interval ${formatNumber(fit.exponentInterval[0], 3)} to ${formatNumber(fit.exponentInterval[1], 3)} (Student t, ${fit.count - 2} degrees of freedom), R² = ${formatNumber(fit.rSquared, 3)}.`
    : 'A power law needs at least three releases with positive values on both axes.';
  const title = `${yc.label} against ${xc.label}`;
  const csvRows = all.map((p) => [p.release.suffix, p.release.title, p.release.lab?.name ?? '', p.release.groupType ?? '', p.x, p.y]);

  return (
    <div className="flex flex-col gap-4">
      <fieldset className="flex flex-wrap items-end gap-x-5 gap-y-3 rounded-lg border border-mist bg-white p-3 text-sm">
        <legend className="px-1 font-semibold">Axes and colours</legend>
        <label className="flex flex-col gap-1">Horizontal axis
          <select className={select} value={xKey} onChange={(e) => setXKey(e.target.value)}>{scalarColumns.map((c) => <option key={c.key} value={c.key}>{columnHeader(c)}</option>)}</select>
        </label>
        <label className="flex flex-col gap-1">Scale
          <select className={select} value={xScale} onChange={(e) => setXScale(e.target.value as Scale)}><option value="log">logarithmic</option><option value="linear">linear</option></select>
        </label>
        <label className="flex flex-col gap-1">Vertical axis
          <select className={select} value={yKey} onChange={(e) => setYKey(e.target.value)}>{scalarColumns.map((c) => <option key={c.key} value={c.key}>{columnHeader(c)}</option>)}</select>
        </label>
        <label className="flex flex-col gap-1">Scale
          <select className={select} value={yScale} onChange={(e) => setYScale(e.target.value as Scale)}><option value="log">logarithmic</option><option value="linear">linear</option></select>
        </label>
        <label className="flex flex-col gap-1">Colour by
          <select className={select} value={colourBy} onChange={(e) => setColourBy(e.target.value as 'groupType' | 'lab')}><option value="groupType">group type</option><option value="lab">lab</option></select>
        </label>
      </fieldset>
      <Figure id="scaling" title={title} legend={legend} height={380}
        caption={<>{fitText} {dropped ? `${dropped} release${dropped === 1 ? ' has' : 's have'} a zero or negative value and cannot be drawn on a logarithmic axis.` : ''}</>}
        csv={{ header: ['release', 'title', 'lab', 'group type', columnHeader(xc), columnHeader(yc)], rows: csvRows }}>
        <ResponsiveContainer width="100%" height="100%" minWidth={240}>
          <ScatterChart margin={{ top: 8, right: 20, bottom: 26, left: 12 }}>
            <CartesianGrid stroke="#dfe5e8" strokeDasharray="2 3" />
            <XAxis dataKey="x" type="number" scale={xScale} domain={padded(all.map((p) => p.x), xScale)} tick={tick} stroke={RULE} tickFormatter={fmt} allowDataOverflow
              label={{ value: columnHeader(xc), position: 'insideBottom', offset: -14, fontSize: 11, fill: INK }} />
            <YAxis dataKey="y" type="number" scale={yScale} domain={padded(all.map((p) => p.y), yScale)} tick={tick} stroke={RULE} tickFormatter={fmt} width={70} allowDataOverflow
              label={{ value: columnHeader(yc), angle: -90, position: 'insideLeft', offset: 4, dy: 80, fontSize: 11, fill: INK }} />
            <Tooltip cursor={false} content={<PointTooltip xc={xc} yc={yc} />} isAnimationActive={false} />
            {groups.map((g) => (
              <Scatter key={g.name} name={g.name} data={g.points} fill={g.colour} isAnimationActive={false} cursor="pointer"
                onClick={(d: { payload?: Point }) => d?.payload?.release && navigate(paths.release(d.payload.release.suffix))} />
            ))}
            {fitLine.length ? <Scatter name="power law" data={fitLine} line={{ stroke: INK, strokeDasharray: '5 3', strokeWidth: 1.5 }} shape={() => <g />} isAnimationActive={false} tooltipType="none" legendType="none" /> : null}
          </ScatterChart>
        </ResponsiveContainer>
      </Figure>
      <details className="rounded-lg border border-mist bg-white p-3 text-sm">
        <summary className="cursor-pointer font-semibold">The {all.length} releases drawn</summary>
        <table className="mt-2 w-full text-left tabular-nums">
          <thead><tr className="border-b border-mist"><th className="py-1 pr-3">Release</th><th className="py-1 pr-3">Lab</th><th className="py-1 pr-3">Group type</th><th className="py-1 pr-3 text-right">{columnHeader(xc)}</th><th className="py-1 text-right">{columnHeader(yc)}</th></tr></thead>
          <tbody>
            {all.map((p) => (
              <tr key={p.release.suffix} className="border-b border-mist/60 last:border-0">
                <td className="py-1 pr-3"><Link to={paths.release(p.release.suffix)}>{p.release.title}</Link></td>
                <td className="py-1 pr-3">{p.release.lab?.name ?? '–'}</td>
                <td className="py-1 pr-3">{p.release.groupType ?? '–'}</td>
                <td className="py-1 pr-3 text-right">{formatNumber(p.x, 4)}</td>
                <td className="py-1 text-right">{formatNumber(p.y, 4)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </div>
  );
}
