import type { Histogram, PairEvent } from './types';

type Num = number | null;
const finite = (v: Num | undefined): v is number => typeof v === 'number' && Number.isFinite(v);

/** Normal probability density with mean `mean` and standard deviation `sd` at x; NaN when sd ≤ 0. */
export function gaussianDensity(x: number, mean: number, sd: number): number {
  if (!(sd > 0)) return Number.NaN;
  const z = (x - mean) / sd;
  return Math.exp(-0.5 * z * z) / (sd * Math.sqrt(2 * Math.PI));
}

/**
 * Points for drawing a histogram as a step line: one per left bin edge with
 * that bin's density, and the last edge repeating the last bin. With
 * `gaussian`, each point also carries the normal density at its edge.
 */
export function histogramSteps(h: Histogram, gaussian?: { mean: number; sd: number }): { x: number; density: number | null; gaussian?: number }[] {
  const out: { x: number; density: number | null; gaussian?: number }[] = [];
  const n = Math.min(h.density.length, h.edges.length - 1);
  for (let i = 0; i <= n; i++) {
    const x = h.edges[i];
    if (!finite(x)) continue;
    const d = h.density[Math.min(i, n - 1)];
    const p: { x: number; density: number | null; gaussian?: number } = { x, density: finite(d) ? d : null };
    if (gaussian) p.gaussian = gaussianDensity(x, gaussian.mean, gaussian.sd);
    out.push(p);
  }
  return out;
}

/** CSV rows of a histogram: one per bin, with its edges and density. */
export const histogramRows = (h: Histogram): Num[][] => h.density.map((d, i) => [h.edges[i], h.edges[i + 1], d]);

/** Zips parallel columns into row objects, keeping rows whose x is finite. */
export function zipRows<K extends string>(x: Num[], columns: Record<K, Num[]>): ({ x: number } & Record<K, number | null>)[] {
  const keys = Object.keys(columns) as K[];
  const rows: ({ x: number } & Record<K, number | null>)[] = [];
  x.forEach((xv, i) => {
    if (!finite(xv)) return;
    const row = { x: xv } as { x: number } & Record<K, number | null>;
    for (const k of keys) {
      const v = columns[k][i];
      (row as Record<string, number | null>)[k] = finite(v) ? v : null;
    }
    rows.push(row);
  });
  return rows;
}

export type PairRow = { pair: string; total: number } & Record<string, number | string>;

/**
 * One row per pair of tracks for a timeline drawn as stacked bars: alternating
 * transparent gaps (`gap{j}`) and events (`event{j}`), so each event spans
 * startS..endS on a shared time axis. Rows are ordered by first start.
 */
export function pairTimelineRows(events: PairEvent[]): { rows: PairRow[]; maxEvents: number } {
  const byPair = new Map<string, PairEvent[]>();
  for (const e of events) {
    if (!finite(e.startS) || !finite(e.endS)) continue;
    const key = [e.a, e.b].sort().join(' – ');
    const list = byPair.get(key) ?? [];
    list.push(e);
    byPair.set(key, list);
  }
  let maxEvents = 0;
  const rows = [...byPair.entries()]
    .map(([pair, list]) => {
      list.sort((p, q) => p.startS - q.startS);
      const row: PairRow = { pair, total: 0 };
      let end = 0;
      list.forEach((e, j) => {
        const start = Math.max(e.startS, end);
        row[`gap${j}`] = start - end;
        row[`event${j}`] = Math.max(0, e.endS - start);
        row.total += e.endS - e.startS;
        end = Math.max(end, e.endS);
      });
      maxEvents = Math.max(maxEvents, list.length);
      return { row, first: list[0].startS };
    })
    .sort((p, q) => p.first - q.first)
    .map((p) => p.row);
  return { rows, maxEvents };
}

/**
 * Round tick values (steps of 1, 2, 2.5 or 5 × 10^k) inside [lo, hi], about
 * `count` of them, so an axis can end at the data instead of at the next
 * round number. Empty for a non-finite range; [lo] when lo = hi.
 */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || hi < lo) return [];
  if (hi === lo) return [lo];
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw * 0.7) ?? 10 * mag;
  const out: number[] = [];
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + step * 1e-9; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

/** The extent [min, max] of the finite values; undefined when there are none. */
export function extent(values: Iterable<number | null | undefined>): [number, number] | undefined {
  let lo = Infinity, hi = -Infinity;
  for (const v of values) if (typeof v === 'number' && Number.isFinite(v)) (lo = Math.min(lo, v)), (hi = Math.max(hi, v));
  return lo <= hi ? [lo, hi] : undefined;
}

/**
 * A value axis widened to round numbers: the domain runs from the round tick at
 * or below `lo` to the one at or above `hi`, with the ticks between.
 */
export function niceScale(lo: number, hi: number, count = 5): { domain: [number, number]; ticks: number[] } {
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || hi < lo) return { domain: [0, 1], ticks: [0, 0.5, 1] };
  if (hi === lo) {
    const d = Math.abs(lo) || 1;
    (lo -= d / 2), (hi += d / 2);
  }
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw * 0.7) ?? 10 * mag;
  const a = Math.floor(lo / step + 1e-9), b = Math.ceil(hi / step - 1e-9);
  const ticks: number[] = [];
  for (let k = a; k <= b; k++) ticks.push(Number((k * step).toPrecision(12)));
  return { domain: [ticks[0], ticks[ticks.length - 1]], ticks };
}
