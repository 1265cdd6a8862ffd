import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { createMomentAccumulator } from './moment-accumulator';
import { moments, momentsFromAccumulator } from './moments';

describe('moments(values, valueof?)', () => {
  it('returns count 0 and NaN fields for empty input', () => {
    const m = moments([]);
    expect(m.count).toBe(0);
    expect(m.mean).toBeNaN();
    expect(m.variance).toBeNaN();
    expect(m.kurtosis).toBeNaN();
  });
  it('gives the value as mean and NaN variance for one value', () => {
    const m = moments([4.5]);
    expect(m.mean).toBe(4.5);
    expect(m.variance).toBeNaN();
  });
  it('skips NaN and infinities', () => {
    const m = moments([1, NaN, 3, Infinity, -Infinity]);
    expect(m.count).toBe(2);
    expect(m.mean).toBe(2);
    expect(m.variance).toBe(1);
  });
  it('reads through the accessor the same as plain values', () => {
    const rows = [{ u: 1 }, { u: 2 }, { u: 7 }, { u: -3 }];
    expect(moments(rows, (d) => d.u)).toEqual(moments(rows.map((d) => d.u)));
  });
  it('matches simple-statistics on random data (mean, variance, skewness, kurtosis)', () => {
    // Source: simple-statistics 7.12 (population variance, biased skewness, Σ(x−x̄)⁴/n / var²).
    const rnd = createSeededRandom(1);
    const x = Array.from({ length: 2000 }, () => Math.exp(rnd.normal()));
    const m = moments(x);
    expect(m.mean).toBeCloseTo(ss.mean(x), 12);
    expect(m.variance / ss.variance(x)).toBeCloseTo(1, 12);
    expect(m.skewness / ss.sampleSkewness(x, true)).toBeCloseTo(1, 10);
    const k = ss.sumNthPowerDeviations(x, 4) / x.length / ss.variance(x) ** 2;
    expect(m.kurtosis / k).toBeCloseTo(1, 10);
  });
  it('keeps precision for large values with small spread (no cancellation)', () => {
    // derived: variance of 1e9 + {0,1,2,3} is 1.25 exactly.
    const m = moments([1e9, 1e9 + 1, 1e9 + 2, 1e9 + 3]);
    expect(m.variance).toBeCloseTo(1.25, 9);
    expect(m.skewness).toBeCloseTo(0, 9);
  });
  it('gives kurtosis 3 and skewness 0 for Gaussian values', () => {
    // Source: Gaussian kurtosis 3 (SCIENCE.md); SE ≈ sqrt(24/n), sqrt(6/n) [common practice]; tolerance 4 SE.
    const rnd = createSeededRandom(7);
    const n = 20000;
    const m = moments(Float64Array.from({ length: n }, () => rnd.normal()));
    expect(Math.abs(m.kurtosis - 3)).toBeLessThan(4 * Math.sqrt(24 / n));
    expect(Math.abs(m.skewness)).toBeLessThan(4 * Math.sqrt(6 / n));
  });
  it('merges two accumulators to the same result as one pass', () => {
    // Source: Pébay (2008) pairwise merge; checked against a single pass.
    const rnd = createSeededRandom(3);
    const x = Array.from({ length: 999 }, () => rnd.normal() * 3 + 1);
    const a = createMomentAccumulator();
    const b = createMomentAccumulator();
    x.forEach((v, i) => (i < 400 ? a : b).add(v));
    a.merge(b);
    const one = moments(x);
    const merged = momentsFromAccumulator(a);
    expect(merged.mean).toBeCloseTo(one.mean, 12);
    expect(merged.variance).toBeCloseTo(one.variance, 10);
    expect(merged.skewness).toBeCloseTo(one.skewness, 10);
    expect(merged.kurtosis).toBeCloseTo(one.kurtosis, 10);
  });
});

describe('createMomentAccumulator().addBatch(values, count)', () => {
  it('gives the moments of adding the values one by one, skipping non-finite values', () => {
    // Source: derived (two-pass group moments merged by Pébay's formula equal the one-pass update); tolerance 1e-12 relative.
    const rnd = createSeededRandom(8);
    const one = createMomentAccumulator(), batch = createMomentAccumulator();
    for (let g = 0; g < 50; g++) {
      const vals = Float64Array.from({ length: 1 + (g % 7) * 20 }, () => 1e3 + rnd.normal() ** 3);
      vals[0] = g % 5 === 0 ? NaN : vals[0];
      for (const v of vals) one.add(v);
      batch.addBatch(vals, vals.length);
    }
    batch.addBatch([], 0);
    expect(batch.count).toBe(one.count);
    for (const k of ['mean', 'm2', 'm3', 'm4'] as const) expect(Math.abs(batch[k] / one[k] - 1)).toBeLessThan(1e-12);
  });
});
