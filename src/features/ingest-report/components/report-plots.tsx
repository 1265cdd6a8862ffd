import type { ReactNode } from 'react';
import { Area, Bar, BarChart, CartesianGrid, ComposedChart, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { formatNumber } from '../../../lib/format';
import { seriesColour } from '../palette';
import { extent, histogramRows, histogramSteps, niceScale, niceTicks, pairTimelineRows, zipRows } from '../plot-data';
import type { Histogram, IngestReportResult } from '../types';
import { Figure, MissingFigure, type LegendItem } from './figure';

// Chart furniture in Cohesia's ink and mist; data in the categorical scale.
const INK = '#1d2a33';
const RULE = '#b7c3c9';
const tick = { fontSize: 11, fill: INK };
const margin = { top: 8, right: 16, bottom: 22, left: 8 };
const fmt = (v: unknown) => (typeof v === 'number' ? formatNumber(v, 3) : String(v ?? ''));
const C0 = seriesColour(0), C1 = seriesColour(1), C2 = seriesColour(2), C3 = seriesColour(3);

/** A numeric x axis ending at the data (from zero for distances, lags and times), with round ticks inside. */
function xAxis(label: string, xs: Iterable<number | null | undefined>, fromZero = false) {
  const e = extent(xs) ?? [0, 1];
  const lo = fromZero ? Math.min(0, e[0]) : e[0];
  return (
    <XAxis dataKey="x" type="number" domain={[lo, e[1]]} padding={{ right: 6 }} ticks={niceTicks(lo, e[1])} interval={0} tick={tick} stroke={RULE} tickFormatter={fmt} allowDataOverflow label={{ value: label, position: 'insideBottom', offset: -12, fontSize: 11, fill: INK }} />
  );
}
/** A value axis over `values` (and zero, for quantities measured from it), widened to round ticks. */
function yAxis(label: string, values: Iterable<number | null | undefined>, withZero = true) {
  const e = extent(values) ?? [0, 1];
  const { domain, ticks } = niceScale(withZero ? Math.min(0, e[0]) : e[0], withZero ? Math.max(0, e[1]) : e[1]);
  return <YAxis type="number" domain={domain} ticks={ticks} interval={0} tick={tick} stroke={RULE} tickFormatter={fmt} width={62} label={{ value: label, angle: -90, position: 'insideLeft', offset: 8, dy: 60, fontSize: 11, fill: INK }} />;
}
const grid = <CartesianGrid stroke="#dfe5e8" strokeDasharray="2 3" />;
const tooltip = <Tooltip isAnimationActive={false} formatter={(v) => fmt(v)} labelFormatter={(v) => fmt(v)} contentStyle={{ fontSize: 12, borderColor: RULE }} />;

function Chart({ children }: { children: ReactNode }) {
  return (
    <ResponsiveContainer width="100%" height="100%" minWidth={200}>
      {children as React.ReactElement}
    </ResponsiveContainer>
  );
}

function HistogramFigure({ id, title, caption, h, xLabel, xUnit, densityUnit, gaussian, colour = C0, fromZero }: {
  id: string;
  title: string;
  caption: string;
  h: Histogram;
  xLabel: string;
  xUnit: string;
  densityUnit: string;
  gaussian?: { mean: number; sd: number };
  colour?: string;
  /** For quantities that cannot be negative (speed, distance). */
  fromZero?: boolean;
}) {
  const data = histogramSteps(h, gaussian);
  const legend: LegendItem[] = [{ label: 'measured', color: colour }];
  if (gaussian) legend.push({ label: `Gaussian, mean ${formatNumber(gaussian.mean)} ${xUnit}, s.d. ${formatNumber(gaussian.sd)} ${xUnit}`, color: INK, dashed: true });
  const header = [`bin start (${xUnit})`, `bin end (${xUnit})`, `probability density (${densityUnit})`];
  const rows = histogramRows(h).map((r) => (gaussian ? [...r, data.find((p) => p.x === r[0])?.gaussian ?? null] : r));
  // A quantity that hardly varies (a flock at constant speed) fills one or two narrow bins: say so, and mark them.
  const few = h.density.length < 3;
  const note = few ? ` All values fall between ${formatNumber(h.edges[0])} and ${formatNumber(h.edges[h.edges.length - 1])} ${xUnit}.` : '';
  return (
    <Figure id={id} title={title} caption={caption + note} legend={legend} csv={{ header: gaussian ? [...header, `Gaussian density at bin start (${densityUnit})`] : header, rows }}>
      <Chart>
        <ComposedChart data={data} margin={margin}>
          {grid}
          {xAxis(`${xLabel} (${xUnit})`, data.map((d) => d.x), fromZero)}
          {yAxis(`probability density (${densityUnit})`, data.flatMap((d) => [d.density, d.gaussian]))}
          {tooltip}
          <Area type="stepAfter" dataKey="density" name="measured" stroke={colour} fill={colour} fillOpacity={0.18} strokeWidth={1.5} isAnimationActive={false} connectNulls dot={few ? { r: 3, fill: colour } : false} />
          {gaussian ? <Line type="monotone" dataKey="gaussian" name="Gaussian" stroke={INK} strokeDasharray="5 3" dot={false} strokeWidth={1.5} isAnimationActive={false} /> : null}
        </ComposedChart>
      </Chart>
    </Figure>
  );
}

/** Every plot of the ingest report, in a two-column grid on wide screens. Loaded lazily with recharts. */
export default function ReportPlots({ result }: { result: IngestReportResult }) {
  const dims = result.parameters?.dims ?? 3;
  const s = result.summary ?? {};
  const series = result.series ?? {};
  const hist = series.histograms ?? {};
  const prof = series.profiles ?? {};
  const comps = s.velocity?.components ?? [];
  const densityUnit = dims === 3 ? 'm⁻³' : 'm⁻²';
  const figures: ReactNode[] = [];

  const rd = prof.radialDensity;
  if (rd?.r?.length) {
    const data = zipRows(rd.r, { n: rd.density });
    figures.push(
      <Figure
        key="radial-density"
        id="radial-density"
        title="Radial density profile n(r)"
        caption={`Individuals per unit ${dims === 3 ? 'volume (shells 4πr²Δr)' : 'area (rings 2πrΔr)'} at distance r from the frame's centroid, averaged over frames.`}
        csv={{ header: ['distance from centroid r (m)', `density n(r) (${densityUnit})`], rows: data.map((d) => [d.x, d.n]) }}
      >
        <Chart>
          <LineChart data={data} margin={margin}>
            {grid}
            {xAxis('distance from centroid r (m)', data.map((d) => d.x), true)}
            {yAxis(`n(r) (${densityUnit})`, data.map((d) => d.n))}
            {tooltip}
            <Line dataKey="n" name="n(r)" stroke={C0} strokeWidth={1.5} dot={{ r: 2 }} isAnimationActive={false} connectNulls />
          </LineChart>
        </Chart>
      </Figure>,
    );
  } else figures.push(<MissingFigure key="radial-density" title="Radial density profile n(r)" reason="Not computed for this file." />);

  if (hist.speed?.edges?.length)
    figures.push(<HistogramFigure key="speed" id="speed" title="Speed distribution" caption="How often each speed |v| occurs, over all individuals and frames, normalised to unit area." h={hist.speed} xLabel="speed |v|" xUnit="m/s" densityUnit="s/m" fromZero />);
  else figures.push(<MissingFigure key="speed" title="Speed distribution" reason="Not computed for this file." />);

  (['vx', 'vy', 'vz'] as const).slice(0, dims).forEach((k, i) => {
    const h = hist[k];
    const axis = k.slice(1);
    const title = `Velocity component v${axis}`;
    const c = comps.find((x) => x.name === k);
    const gaussian = c && typeof c.mean === 'number' && typeof c.standardDeviation === 'number' && c.standardDeviation > 0 ? { mean: c.mean, sd: c.standardDeviation } : undefined;
    if (h?.edges?.length)
      figures.push(
        <HistogramFigure
          key={k}
          id={k}
          title={title}
          caption={`Distribution of the ${axis} component of velocity, with the Gaussian of the same mean and variance for comparison (heavier tails show as excess above the dashed line).`}
          h={h}
          xLabel={`v${axis}`}
          xUnit="m/s"
          densityUnit="s/m"
          gaussian={gaussian}
          colour={seriesColour(i + 2)}
        />,
      );
    else figures.push(<MissingFigure key={k} title={title} reason="Not computed for this file." />);
  });

  const svd = prof.speedVsDistance;
  if (svd?.r?.length) {
    const data = zipRows(svd.r, { speed: svd.meanSpeed, count: svd.count });
    figures.push(
      <Figure
        key="speed-distance"
        id="speed-distance"
        title="Mean speed against distance from the centroid"
        caption="Mean speed of the individuals found at distance r from the frame's centroid; flat in laboratory swarms."
        csv={{ header: ['distance from centroid r (m)', 'mean speed (m/s)', 'samples in bin'], rows: data.map((d) => [d.x, d.speed, d.count]) }}
      >
        <Chart>
          <LineChart data={data} margin={margin}>
            {grid}
            {xAxis('distance from centroid r (m)', data.map((d) => d.x), true)}
            {yAxis('mean speed (m/s)', data.map((d) => d.speed))}
            {tooltip}
            <Line dataKey="speed" name="mean speed" stroke={C0} strokeWidth={1.5} dot={{ r: 2 }} isAnimationActive={false} connectNulls />
          </LineChart>
        </Chart>
      </Figure>,
    );
  } else figures.push(<MissingFigure key="speed-distance" title="Mean speed against distance from the centroid" reason="Not computed for this file." />);

  const ra = prof.radialAcceleration;
  const k = s.springConstant?.throughOrigin;
  if (ra?.r?.length) {
    const K = typeof k?.springConstant === 'number' ? k.springConstant : null;
    const data = zipRows(ra.r, { a: ra.meanRadialAcceleration, count: ra.count }).map((d) => ({ ...d, fit: K === null ? null : -K * d.x }));
    const fitLabel = K === null ? 'no fit (too few samples per bin)' : `fit ⟨a_r⟩ = −K r: K = ${formatNumber(K)} ± ${formatNumber(k?.standardError)} s⁻², R² = ${formatNumber(k?.rSquared)}`;
    figures.push(
      <Figure
        key="radial-acceleration"
        id="radial-acceleration"
        title="Radial acceleration against distance"
        caption="Mean acceleration towards (negative) or away from the centroid at distance r, with the least-squares line through the origin whose slope is the effective spring constant K."
        legend={[{ label: 'binned mean ⟨a_r⟩', color: C0, marker: true }, { label: fitLabel, color: C3, dashed: true }]}
        csv={{ header: ['distance from centroid r (m)', 'mean radial acceleration (m/s²)', 'samples in bin', 'fitted −K r (m/s²)'], rows: data.map((d) => [d.x, d.a, d.count, d.fit]) }}
      >
        <Chart>
          <ComposedChart data={data} margin={margin}>
            {grid}
            {xAxis('distance from centroid r (m)', data.map((d) => d.x), true)}
            {yAxis('⟨a_r⟩ (m/s²)', data.flatMap((d) => [d.a, d.fit]))}
            {tooltip}
            <ReferenceLine y={0} stroke={RULE} />
            <Line dataKey="a" name="⟨a_r⟩" stroke="none" dot={{ r: 2.5, fill: C0, stroke: C0 }} isAnimationActive={false} />
            {K !== null ? <Line dataKey="fit" name="−K r" stroke={C3} strokeDasharray="5 3" strokeWidth={1.5} dot={false} isAnimationActive={false} /> : null}
          </ComposedChart>
        </Chart>
      </Figure>,
    );
  } else figures.push(<MissingFigure key="radial-acceleration" title="Radial acceleration against distance" reason="Not computed for this file (needs accelerations)." />);

  const pol = series.time?.polarization;
  const mil = series.time?.milling;
  if (pol?.t?.length) {
    const milling = new Map<number | null, number | null>((mil?.t ?? []).map((t, i) => [t, mil!.y[i]]));
    const data = zipRows(pol.t, { polarization: pol.y }).map((d) => ({ ...d, milling: milling.get(d.x) ?? null }));
    figures.push(
      <Figure
        key="order"
        id="order"
        title="Polarization and milling over time"
        caption="Per frame, polarization (1 when all move the same way) and milling (1 when all circle the centroid the same way)."
        legend={[{ label: 'polarization φ', color: C0 }, ...(mil ? [{ label: 'milling O_R', color: C1 }] : [])]}
        csv={{ header: ['time t (s)', 'polarization φ (dimensionless)', 'milling O_R (dimensionless)'], rows: data.map((d) => [d.x, d.polarization, d.milling]) }}
      >
        <Chart>
          <LineChart data={data} margin={margin}>
            {grid}
            {xAxis('time t (s)', data.map((d) => d.x), true)}
            {yAxis('φ, O_R (dimensionless)', [0, 1])}
            {tooltip}
            <Line dataKey="polarization" name="polarization" stroke={C0} strokeWidth={1.25} dot={false} isAnimationActive={false} />
            {mil ? <Line dataKey="milling" name="milling" stroke={C1} strokeWidth={1.25} dot={false} isAnimationActive={false} /> : null}
          </LineChart>
        </Chart>
      </Figure>,
    );
  } else figures.push(<MissingFigure key="order" title="Polarization and milling over time" reason="Not computed for this file." />);

  if (hist.nearestNeighbour?.edges?.length)
    figures.push(
      <HistogramFigure
        key="nearest-neighbour"
        id="nearest-neighbour"
        title="Nearest-neighbour distance"
        caption="How often each distance to the nearest other individual occurs, over a sample of frames, normalised to unit area."
        h={hist.nearestNeighbour}
        xLabel="nearest-neighbour distance d"
        xUnit="m"
        densityUnit="m⁻¹"
        colour={seriesColour(5)}
        fromZero
      />,
    );
  else figures.push(<MissingFigure key="nearest-neighbour" title="Nearest-neighbour distance" reason="Not computed for this file." />);

  const acf = series.autocorrelation;
  if (acf?.lagS?.length) {
    const data = zipRows(acf.lagS, { rho: acf.rho });
    const e = s.autocorrelation?.eFoldingTimeS;
    const z = s.autocorrelation?.firstZeroCrossingS;
    const legend: LegendItem[] = [{ label: 'ρ(τ)', color: C0 }, { label: 'ρ = 1/e', color: RULE, dashed: true }];
    if (typeof e === 'number') legend.push({ label: `1/e time ${formatNumber(e)} s`, color: C1, dashed: true });
    if (typeof z === 'number') legend.push({ label: `first zero ${formatNumber(z)} s`, color: C2, dashed: true });
    figures.push(
      <Figure
        key="autocorrelation"
        id="autocorrelation"
        title="Velocity autocorrelation ρ(τ)"
        caption="How alike an individual's velocity is to its own velocity a lag τ later, averaged over tracks; 1 at τ = 0."
        legend={legend}
        csv={{ header: ['lag τ (s)', 'autocorrelation ρ (dimensionless)'], rows: data.map((d) => [d.x, d.rho]) }}
      >
        <Chart>
          <LineChart data={data} margin={margin}>
            {grid}
            {xAxis('lag τ (s)', data.map((d) => d.x), true)}
            {yAxis('ρ(τ) (dimensionless)', [...data.map((d) => d.rho), 1])}
            {tooltip}
            <ReferenceLine y={0} stroke={RULE} />
            <ReferenceLine y={1 / Math.E} stroke={RULE} strokeDasharray="5 3" />
            {typeof e === 'number' ? <ReferenceLine x={e} stroke={C1} strokeDasharray="5 3" /> : null}
            {typeof z === 'number' ? <ReferenceLine x={z} stroke={C2} strokeDasharray="5 3" /> : null}
            <Line dataKey="rho" name="ρ" stroke={C0} strokeWidth={1.5} dot={false} isAnimationActive={false} />
          </LineChart>
        </Chart>
      </Figure>,
    );
  } else figures.push(<MissingFigure key="autocorrelation" title="Velocity autocorrelation ρ(τ)" reason="Not computed for this file." />);

  figures.push(<PairTimeline key="pairs" result={result} />);

  return (
    <div className="grid grid-cols-1 gap-4 lg:grid-cols-2" data-testid="ingest-plots">
      {figures}
    </div>
  );
}

const MAX_PAIR_ROWS = 40;

function PairTimeline({ result }: { result: IngestReportResult }) {
  const title = 'Transient pairs';
  const events = result.pairs?.events;
  if (!events) return <MissingFigure title={title} reason="Pairs are found only in the full analysis." />;
  const p = result.summary?.pairs;
  const rule = `separation below ${formatNumber(p?.distanceThreshold)} m for at least ${formatNumber(p?.minDurationS)} s`;
  if (!events.length)
    return (
      <figure className="flex min-w-0 flex-col gap-2 rounded-lg border border-mist bg-white p-3" data-testid="figure-pairs">
        <h3 className="font-serif text-sm font-bold">{title}</h3>
        <p className="py-6 text-center text-sm text-ink/70">No pairs found.</p>
        <figcaption className="text-xs text-ink/75">Two individuals count as a pair while their {rule}.</figcaption>
      </figure>
    );
  const { rows, maxEvents } = pairTimelineRows(events);
  const shown = rows.slice(0, MAX_PAIR_ROWS);
  const end = Math.max(result.summary?.durationS ?? 0, ...events.map((e) => e.endS));
  const more = rows.length > shown.length ? ` The first ${shown.length} of ${rows.length} pairs are drawn; the CSV holds every event.` : '';
  return (
    <Figure
      id="pairs"
      title={title}
      caption={`Each bar is one pair event, from its start to its end, one row per pair of tracks; a pair is two individuals whose ${rule}.${more}`}
      legend={[{ label: `pair event (${events.length})`, color: C0 }]}
      height={Math.max(140, 40 + 22 * shown.length)}
      csv={{
        header: ['track a', 'track b', 'start (s)', 'end (s)', 'duration (s)', 'mean separation (m)', 'oscillation frequency (Hz)'],
        rows: events.map((e) => [e.a, e.b, e.startS, e.endS, e.durationS, e.meanSeparation, e.oscillationFrequencyHz]),
      }}
    >
      <Chart>
        <BarChart data={shown} layout="vertical" margin={margin} barCategoryGap="25%">
          <CartesianGrid stroke="#dfe5e8" strokeDasharray="2 3" horizontal={false} />
          <XAxis type="number" domain={[0, end]} ticks={niceTicks(0, end)} interval={0} tick={tick} stroke={RULE} tickFormatter={fmt} label={{ value: 'time t (s)', position: 'insideBottom', offset: -12, fontSize: 11, fill: INK }} />
          <YAxis type="category" dataKey="pair" tick={tick} stroke={RULE} width={72} />
          {Array.from({ length: maxEvents }, (_, j) => [
            <Bar key={`g${j}`} dataKey={`gap${j}`} stackId="pair" fill="transparent" isAnimationActive={false} />,
            <Bar key={`e${j}`} dataKey={`event${j}`} stackId="pair" fill={C0} isAnimationActive={false} />,
          ]).flat()}
        </BarChart>
      </Chart>
    </Figure>
  );
}
