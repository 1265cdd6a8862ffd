import { useState, type ReactNode } from 'react';
import { CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import type { ComparedRelease, ReleaseCurves } from '../../../../shared/contracts/comparisons';
import { formatNumber } from '../../../lib/format';
import { Figure, MissingFigure, type LegendItem } from '../../ingest-report/components/figure';
import { seriesColour } from '../../ingest-report/palette';

// Chart furniture in Cohesia's ink and mist; data in the colour-blind-safe categorical scale.
const INK = '#1d2a33';
const RULE = '#b7c3c9';
const tick = { fontSize: 11, fill: INK };
const fmt = (v: unknown) => (typeof v === 'number' ? formatNumber(v, 3) : String(v ?? ''));
const margin = { top: 8, right: 16, bottom: 22, left: 8 };

type Xy = { x: (number | null)[]; y: (number | null)[] };
type Curve = { release: ComparedRelease; colour: string; points: { x: number; y: number }[]; dashed?: boolean; label?: string };

const pointsOf = (c: Xy | null | undefined) => (c ? c.x.flatMap((x, i) => (x !== null && c.y[i] !== null && Number.isFinite(x) && Number.isFinite(c.y[i]!) ? [{ x, y: c.y[i]! }] : [])) : []);

function Overlay({ id, title, caption, curves, xLabel, yLabel, zeroLine }: { id: string; title: string; caption: ReactNode; curves: Curve[]; xLabel: string; yLabel: string; zeroLine?: boolean }) {
  const drawn = curves.filter((c) => c.points.length > 0);
  if (!drawn.length) return <MissingFigure title={title} reason="None of the releases has this curve (the engine computes it in full mode only)." />;
  // One legend entry per release, even where a release draws several curves (velocity components).
  const seen = new Set<string>();
  const legend: LegendItem[] = drawn.filter((c) => !c.dashed && !seen.has(c.release.suffix) && seen.add(c.release.suffix)).map((c) => ({ label: c.release.title, color: c.colour }));
  if (drawn.some((c) => c.dashed)) legend.push({ label: 'fitted −K r (same colour)', color: INK, dashed: true });
  const rows = drawn.flatMap((c) => c.points.map((p) => [c.release.suffix, c.label ?? 'measured', p.x, p.y]));
  return (
    <Figure id={id} title={title} caption={caption} legend={legend} csv={{ header: ['release', 'curve', xLabel, yLabel], rows }} height={260}>
      <ResponsiveContainer width="100%" height="100%" minWidth={200}>
        <ComposedChart margin={margin}>
          <CartesianGrid stroke="#dfe5e8" strokeDasharray="2 3" />
          <XAxis dataKey="x" type="number" domain={['auto', 'auto']} tick={tick} stroke={RULE} tickFormatter={fmt} allowDuplicatedCategory={false} label={{ value: xLabel, position: 'insideBottom', offset: -12, fontSize: 11, fill: INK }} />
          <YAxis type="number" domain={['auto', 'auto']} tick={tick} stroke={RULE} tickFormatter={fmt} width={62} label={{ value: yLabel, angle: -90, position: 'insideLeft', offset: 8, dy: 60, fontSize: 11, fill: INK }} />
          {zeroLine ? <ReferenceLine y={0} stroke={RULE} /> : null}
          <Tooltip isAnimationActive={false} formatter={(v) => fmt(v)} labelFormatter={(v) => fmt(v)} contentStyle={{ fontSize: 12, borderColor: RULE }} />
          {drawn.map((c, i) => (
            <Line
              key={`${c.release.suffix}-${c.label ?? i}`}
              data={c.points}
              dataKey="y"
              name={c.dashed ? `${c.release.title}, −K r` : c.release.title}
              stroke={c.colour}
              strokeDasharray={c.dashed ? '5 3' : undefined}
              strokeWidth={1.5}
              dot={c.dashed ? false : { r: 1.8, fill: c.colour, stroke: c.colour }}
              isAnimationActive={false}
              connectNulls
            />
          ))}
        </ComposedChart>
      </ResponsiveContainer>
    </Figure>
  );
}

/** Distributions and profiles of every compared release, overlaid, one colour per release (as in the table). */
export default function ComparisonPlots({ releases, curves }: { releases: ComparedRelease[]; curves: ReleaseCurves[] }) {
  const bySuffix = new Map(curves.map((c) => [c.suffix, c]));
  const each = (pick: (c: ReleaseCurves) => Xy | null | undefined): Curve[] =>
    releases.map((r, i) => ({ release: r, colour: seriesColour(i), points: pointsOf(bySuffix.get(r.suffix) && pick(bySuffix.get(r.suffix)!)) }));
  const components = releases.flatMap((r, i) => (bySuffix.get(r.suffix)?.components ?? []).map((c) => ({ release: r, colour: seriesColour(i), points: pointsOf(c), label: c.name })));
  // Groups of very different sizes (a tank school, a rooftop flock) share a profile axis only in units of their own RMS radius R.
  const [perRadius, setPerRadius] = useState(false);
  const scaleOf = (r: ComparedRelease) => (perRadius ? r.scalars.radiusM ?? NaN : 1);
  const scaled = (r: ComparedRelease, pts: { x: number; y: number }[], yPower: number) => {
    const R = scaleOf(r);
    return Number.isFinite(R) && R > 0 ? pts.map((p) => ({ x: p.x / R, y: p.y * R ** yPower })) : [];
  };
  const density: Curve[] = releases.map((r, i) => ({ release: r, colour: seriesColour(i), points: scaled(r, pointsOf(bySuffix.get(r.suffix)?.radialDensity), perRadius ? (r.scalars.dimension ?? 3) : 0) }));
  const accel: Curve[] = releases.flatMap((r, i) => {
    // a_r / R against r / R keeps the slope −K (s⁻²).
    const measured = scaled(r, pointsOf(bySuffix.get(r.suffix)?.radialAcceleration), perRadius ? -1 : 0);
    const K = r.scalars.springConstantS2;
    const rMax = measured.length ? Math.max(...measured.map((p) => p.x)) : 0;
    const fit: Curve[] = K !== null && rMax > 0 ? [{ release: r, colour: seriesColour(i), points: [{ x: 0, y: 0 }, { x: rMax, y: -K * rMax }], dashed: true, label: 'fit −K r' }] : [];
    return [{ release: r, colour: seriesColour(i), points: measured }, ...fit];
  });
  const dist = perRadius ? 'distance from centroid / RMS radius' : 'distance from centroid (m)';
  return (
    <section aria-labelledby="comparison-plots-heading" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="comparison-plots-heading" className="font-serif text-xl font-bold">Distributions and profiles</h2>
        <label className="flex items-center gap-2 text-sm">
          Profile distances
          <select className="rounded border border-mist bg-white px-2 py-1" value={perRadius ? 'radius' : 'm'} onChange={(e) => setPerRadius(e.target.value === 'radius')}>
            <option value="m">in metres</option>
            <option value="radius">in each release's RMS radius</option>
          </select>
        </label>
      </div>
      <div className="grid gap-4 lg:grid-cols-2">
        <Overlay id="cmp-speed" title="Normalised speed distribution" curves={each((c) => c.speed)} xLabel="speed / mean speed" yLabel="probability density"
          caption="Speed divided by each release's mean speed, so groups moving at different speeds share one axis." />
        <Overlay id="cmp-components" title="Standardised velocity components" curves={components} xLabel="(u − mean) / s.d." yLabel="probability density"
          caption="Every velocity component (x, y and z in the release's colour), centred and divided by its standard deviation; Gaussian components would all follow one curve." />
        <Overlay id="cmp-density" title="Radial density profile" curves={density} xLabel={dist} yLabel={perRadius ? 'density × R³ (3D) or × R² (2D)' : 'density (m⁻³ or m⁻²)'}
          caption="Individuals per unit volume (3D) or area (2D) at each distance from the frame's centroid, averaged over frames." />
        <Overlay id="cmp-accel" title="Radial acceleration against distance" curves={accel} xLabel={dist} yLabel={perRadius ? 'mean radial acceleration / R (s⁻²)' : 'mean radial acceleration (m/s²)'} zeroLine
          caption="Binned mean acceleration along the outward direction, with each release's fitted line −K r dashed in its colour." />
        <Overlay id="cmp-acf" title="Velocity autocorrelation" curves={each((c) => c.autocorrelation)} xLabel="lag (s)" yLabel="ρ(τ)" zeroLine
          caption="Correlation of each individual's velocity with itself after a lag, averaged over tracks and times." />
      </div>
    </section>
  );
}
