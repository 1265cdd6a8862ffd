import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { linearFit } from './linear-fit';

describe('linearFit(x, y, options?)', () => {
  const rnd = createSeededRandom(5);
  const x = Array.from({ length: 300 }, () => rnd.uniform() * 10);
  const y = x.map((v) => 2.5 - 0.7 * v + rnd.normal() * 0.3);

  it('matches simple-statistics linearRegression and rSquared on random data', () => {
    // Source: simple-statistics 7.12 linearRegression / rSquared.
    const f = linearFit(x, y);
    const pts = x.map((v, i) => [v, y[i]]);
    const ref = ss.linearRegression(pts);
    expect(f.slope).toBeCloseTo(ref.m, 10);
    expect(f.intercept).toBeCloseTo(ref.b, 10);
    expect(f.rSquared).toBeCloseTo(ss.rSquared(pts, ss.linearRegressionLine(ref)), 10);
  });
  it('gives the textbook slope standard error sqrt(SSres/(n−2)/Sxx)', () => {
    // Source: derived (OLS), with sums from simple-statistics sumNthPowerDeviations.
    const f = linearFit(x, y);
    const res = y.map((v, i) => v - f.intercept - f.slope * x[i]);
    const se = Math.sqrt(res.reduce((s, r) => s + r * r, 0) / (x.length - 2) / ss.sumNthPowerDeviations(x, 2));
    expect(f.slopeStandardError).toBeCloseTo(se, 12);
  });
  it('fits through the origin as Σxy/Σx² with uncentred R²', () => {
    // Source: derived (least squares without intercept).
    const f = linearFit(x, y, { throughOrigin: true });
    const sxy = x.reduce((s, v, i) => s + v * y[i], 0);
    const sxx = x.reduce((s, v) => s + v * v, 0);
    expect(f.slope).toBeCloseTo(sxy / sxx, 12);
    expect(f.intercept).toBe(0);
    const ssr = y.reduce((s, v, i) => s + (v - f.slope * x[i]) ** 2, 0);
    expect(f.rSquared).toBeCloseTo(1 - ssr / y.reduce((s, v) => s + v * v, 0), 12);
  });
  it('treats integer weights like repeated points', () => {
    // Source: derived (a weight of 2 equals a duplicated point for the estimates).
    const f = linearFit([1, 2, 3], [1, 3, 2], { weights: [1, 2, 1] });
    const g = linearFit([1, 2, 2, 3], [1, 3, 3, 2]);
    expect(f.slope).toBeCloseTo(g.slope, 12);
    expect(f.intercept).toBeCloseTo(g.intercept, 12);
  });
  it('returns NaN for empty, one-point and constant-x input, and skips NaN', () => {
    expect(linearFit([], []).slope).toBeNaN();
    expect(linearFit([1], [2]).slope).toBeNaN();
    expect(linearFit([2, 2, 2], [1, 2, 3]).slope).toBeNaN();
    const f = linearFit([0, 1, NaN, 2], [1, 3, 100, 5]);
    expect(f.count).toBe(3);
    expect(f.slope).toBeCloseTo(2, 12);
    expect(f.rSquared).toBeCloseTo(1, 12);
    expect(f.slopeStandardError).toBeCloseTo(0, 12);
  });
});
