import type { ReleaseCurves, ReleaseScalars } from '../contracts/comparisons';

// The ingest result document (schemas/ingest-result.schema.json) is already in SI units: the engine scales
// positions by the file's declared unit (m, cm, mm, px × scale) before any statistic, and records that factor
// as parameters.metresPerUnit. Harmonising is therefore reading the SI fields and never rescaling them again.

type Num = number | null | undefined;
type Doc = {
  parameters?: { dims?: Num; fps?: Num; units?: string | null; metresPerUnit?: Num };
  summary?: {
    frames?: Num;
    tracks?: Num;
    durationS?: Num;
    individualsPerFrame?: { mean?: Num; max?: Num };
    radius?: { mean?: Num };
    velocity?: { components?: { name: string; mean?: Num; standardDeviation?: Num }[]; speed?: { mean?: Num; kurtosis?: Num } };
    polarization?: { mean?: Num } | null;
    milling?: { mean?: Num } | null;
    nearestNeighbour?: { mean?: Num } | null;
    springConstant?: { throughOrigin?: { springConstant?: Num; standardError?: Num; rSquared?: Num } } | null;
    autocorrelation?: { eFoldingTimeS?: Num; firstZeroCrossingS?: Num } | null;
    pairs?: { pairedFraction?: Num } | null;
  } | null;
  series?: {
    histograms?: Record<string, { edges: number[]; density: number[] }> | null;
    profiles?: {
      radialDensity?: { r: Num[]; density: Num[] };
      radialAcceleration?: { r: Num[]; meanRadialAcceleration: Num[] };
    } | null;
    autocorrelation?: { lagS: Num[]; rho: Num[] } | null;
  } | null;
};

const num = (v: Num): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** The file whose numbers stand for a release: the trajectory file with the most frames (first by name on a tie). */
export function pickRepresentativeFile<T extends { fileName: string; result: unknown }>(files: T[]): T | null {
  let best: T | null = null;
  let most = -1;
  for (const f of [...files].sort((a, b) => a.fileName.localeCompare(b.fileName))) {
    const frames = num((f.result as Doc | null)?.summary?.frames) ?? -1;
    if ((f.result as Doc | null)?.summary && frames > most) {
      best = f;
      most = frames;
    }
  }
  return best;
}

/**
 * The scalar statistics of one ingest result in SI units: lengths m, speeds m/s,
 * K in s⁻² (unit-free in length), times s; number density per m³ in 3D, per m² in 2D
 * (N over the area or volume of the RMS radius, the engine's core density). Missing values: null.
 */
export function releaseScalars(result: unknown): ReleaseScalars {
  const d = (result ?? {}) as Doc;
  const s = d.summary ?? {};
  const dims = num(d.parameters?.dims);
  const N = num(s.individualsPerFrame?.mean);
  const R = num(s.radius?.mean);
  const density = N !== null && R !== null && R > 0 && dims !== null ? (dims === 3 ? N / ((4 / 3) * Math.PI * R ** 3) : N / (Math.PI * R * R)) : null;
  const k = s.springConstant?.throughOrigin;
  return {
    individuals: N,
    individualsMax: num(s.individualsPerFrame?.max),
    tracks: num(s.tracks),
    durationS: num(s.durationS),
    frameRateHz: num(d.parameters?.fps),
    dimension: dims,
    radiusM: R,
    meanSpeedMS: num(s.velocity?.speed?.mean),
    speedKurtosis: num(s.velocity?.speed?.kurtosis),
    polarization: num(s.polarization?.mean),
    milling: num(s.milling?.mean),
    nearestNeighbourM: num(s.nearestNeighbour?.mean),
    numberDensity: density,
    springConstantS2: num(k?.springConstant),
    springConstantStandardError: num(k?.standardError),
    springConstantRSquared: num(k?.rSquared),
    autocorrelationTimeS: num(s.autocorrelation?.eFoldingTimeS),
    firstZeroCrossingS: num(s.autocorrelation?.firstZeroCrossingS),
    pairedFraction: num(s.pairs?.pairedFraction),
  };
}

/** Bin centres of a histogram and its density, with x mapped by `toX` and density scaled by `densityScale`. */
function rescaledHistogram(h: { edges: number[]; density: number[] } | undefined, toX: (x: number) => number, densityScale: number) {
  if (!h || h.density.length === 0) return null;
  return { x: h.density.map((_, i) => toX((h.edges[i] + h.edges[i + 1]) / 2)), y: h.density.map((v) => num(v) === null ? null : v * densityScale) };
}

/**
 * The curves overlaid on the comparison page. Speeds are shown as v/⟨v⟩ and velocity
 * components as (u − ū)/σ_u, each with its density rescaled so it stays a probability
 * density: groups of different speeds then share one axis (as laboratory swarm studies plot them).
 */
export function releaseCurves(suffix: string, result: unknown): ReleaseCurves {
  const d = (result ?? {}) as Doc;
  const h = d.series?.histograms ?? null;
  const v = d.summary?.velocity;
  const meanSpeed = num(v?.speed?.mean);
  const speed = h?.speed && meanSpeed && meanSpeed > 0 ? rescaledHistogram(h.speed, (x) => x / meanSpeed, meanSpeed) : null;
  const components = (v?.components ?? []).flatMap((c) => {
    const mu = num(c.mean), sd = num(c.standardDeviation);
    const curve = h?.[c.name] && mu !== null && sd && sd > 0 ? rescaledHistogram(h[c.name], (x) => (x - mu) / sd, sd) : null;
    return curve ? [{ name: c.name, ...curve }] : [];
  });
  const p = d.series?.profiles;
  const clean = (a: Num[] | undefined) => (a ?? []).map(num);
  const ac = d.series?.autocorrelation;
  return {
    suffix,
    speed,
    components,
    radialDensity: p?.radialDensity ? { x: clean(p.radialDensity.r), y: clean(p.radialDensity.density) } : null,
    radialAcceleration: p?.radialAcceleration ? { x: clean(p.radialAcceleration.r), y: clean(p.radialAcceleration.meanRadialAcceleration) } : null,
    autocorrelation: ac ? { x: clean(ac.lagS), y: clean(ac.rho) } : null,
  };
}
