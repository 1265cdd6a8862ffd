import { describe, expect, it } from 'vitest';
import { extent, gaussianDensity, histogramRows, histogramSteps, niceScale, niceTicks, pairTimelineRows, zipRows } from './plot-data';

describe('gaussianDensity(x, mean, sd)', () => {
  it('gaussianDensity(x, mean, sd) is 1/(sd·√(2π)) at the mean and NaN for sd ≤ 0', () => {
    // Standard normal density at 0 is 0.3989422804 (a fact of the trade).
    expect(gaussianDensity(0, 0, 1)).toBeCloseTo(0.3989422804, 10);
    expect(gaussianDensity(2, 2, 0.5)).toBeCloseTo(0.7978845608, 10);
    expect(gaussianDensity(1, 0, 0)).toBeNaN();
  });
});

describe('histogramSteps(h, gaussian?)', () => {
  it('histogramSteps(h) repeats the last bin at the last edge and keeps nulls', () => {
    expect(histogramSteps({ edges: [0, 1, 2], density: [0.25, null] })).toEqual([
      { x: 0, density: 0.25 },
      { x: 1, density: null },
      { x: 2, density: null },
    ]);
  });
  it('histogramSteps(h, gaussian) carries the normal density at each edge', () => {
    const s = histogramSteps({ edges: [-1, 0, 1], density: [0.5, 0.5] }, { mean: 0, sd: 1 });
    expect(s[1].gaussian).toBeCloseTo(0.3989422804, 10);
  });
  it('histogramSteps(h) is empty for an empty histogram', () => {
    expect(histogramSteps({ edges: [], density: [] })).toEqual([]);
  });
  it('histogramRows(h) gives one row per bin with both edges', () => {
    expect(histogramRows({ edges: [0, 1, 2], density: [0.25, 0.75] })).toEqual([[0, 1, 0.25], [1, 2, 0.75]]);
  });
});

describe('zipRows(x, columns)', () => {
  it('zipRows(x, columns) skips rows with no finite x and keeps null values', () => {
    expect(zipRows([0, null, 2], { a: [1, 2, null] })).toEqual([{ x: 0, a: 1 }, { x: 2, a: null }]);
  });
});

describe('pairTimelineRows(events)', () => {
  const ev = (a: string, b: string, startS: number, endS: number) => ({ a, b, startS, endS, durationS: endS - startS, meanSeparation: 0.01, oscillationFrequencyHz: null });
  it('pairTimelineRows(events) puts each pair on one row with gaps between its events', () => {
    const { rows, maxEvents } = pairTimelineRows([ev('7', '3', 4, 5), ev('3', '7', 1, 2.5), ev('1', '2', 0.5, 1.5)]);
    expect(maxEvents).toBe(2);
    expect(rows.map((r) => r.pair)).toEqual(['1 – 2', '3 – 7']);
    expect(rows[1]).toMatchObject({ gap0: 1, event0: 1.5, gap1: 1.5, event1: 1, total: 2.5 });
  });
  it('pairTimelineRows(events) is empty for no events', () => {
    expect(pairTimelineRows([])).toEqual({ rows: [], maxEvents: 0 });
  });
});

describe('niceTicks(lo, hi, count)', () => {
  it('niceTicks(lo, hi) gives round steps inside the range', () => {
    expect(niceTicks(0, 4.76)).toEqual([0, 1, 2, 3, 4]);
    expect(niceTicks(0.0026, 0.159)).toEqual([0.025, 0.05, 0.075, 0.1, 0.125, 0.15]);
    expect(niceTicks(-0.275, 0.342)).toEqual([-0.2, -0.1, 0, 0.1, 0.2, 0.3]);
  });
  it('niceTicks(lo, hi) is [lo] for an empty range and [] for a non-finite one', () => {
    expect(niceTicks(2, 2)).toEqual([2]);
    expect(niceTicks(0, Number.NaN)).toEqual([]);
  });
  it('extent(values) skips nulls and NaN, and is undefined for none', () => {
    expect(extent([3, null, -1, Number.NaN, 2])).toEqual([-1, 3]);
    expect(extent([])).toBeUndefined();
  });
});

describe('niceScale(lo, hi, count)', () => {
  it('niceScale(lo, hi) widens the range to round ticks', () => {
    expect(niceScale(0, 21121)).toEqual({ domain: [0, 25000], ticks: [0, 5000, 10000, 15000, 20000, 25000] });
    expect(niceScale(-0.19, 1)).toEqual({ domain: [-0.2, 1], ticks: [-0.2, 0, 0.2, 0.4, 0.6, 0.8, 1] });
  });
  it('niceScale(lo, hi) opens a zero-width range and falls back to [0, 1] for a non-finite one', () => {
    expect(niceScale(2, 2).domain[0]).toBeLessThan(2);
    expect(niceScale(Number.NaN, 1).domain).toEqual([0, 1]);
  });
});
