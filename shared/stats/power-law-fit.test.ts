import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { powerLawFit } from './power-law-fit';

describe('powerLawFit(x, y, level?)', () => {
  const rnd = createSeededRandom(11);
  const x = Array.from({ length: 80 }, () => 5 + rnd.uniform() * 995);
  // y = 0.3·x^−0.62 with 10 % log-normal noise.
  const y = x.map((v) => 0.3 * v ** -0.62 * Math.exp(0.1 * rnd.normal()));

  it('recovers a known exponent from noisy synthetic points and its 95 % interval covers it', () => {
    // Source: synthetic data with exponent −0.62 and prefactor 0.3.
    const f = powerLawFit(x, y);
    expect(f.count).toBe(80);
    expect(f.exponent).toBeCloseTo(-0.62, 1);
    expect(f.exponentInterval[0]).toBeLessThan(-0.62);
    expect(f.exponentInterval[1]).toBeGreaterThan(-0.62);
    expect(f.prefactor).toBeGreaterThan(0.2);
    expect(f.prefactor).toBeLessThan(0.45);
  });
  it('matches simple-statistics linearRegression on the same log-log data', () => {
    // Source: simple-statistics 7.12 linearRegression / rSquared on (ln x, ln y).
    const pts = x.map((v, i) => [Math.log(v), Math.log(y[i])]);
    const ref = ss.linearRegression(pts);
    const f = powerLawFit(x, y);
    expect(f.exponent).toBeCloseTo(ref.m, 10);
    expect(Math.log(f.prefactor)).toBeCloseTo(ref.b, 10);
    expect(f.rSquared).toBeCloseTo(ss.rSquared(pts, ss.linearRegressionLine(ref)), 10);
  });
  it('uses the Student t quantile for the interval half-width', () => {
    // Source: t(0.975, 3) = 3.182446 (printed tables of Student's t).
    const f = powerLawFit([1, 2, 4, 8, 16], [1, 2.2, 3.7, 8.5, 15]);
    const half = (f.exponentInterval[1] - f.exponentInterval[0]) / 2;
    expect(half / f.exponentStandardError).toBeCloseTo(3.182446, 5);
  });
  it('is exact on a noise-free power law', () => {
    const f = powerLawFit([1, 10, 100], [2, 20, 200]);
    expect(f.exponent).toBeCloseTo(1, 12);
    expect(f.prefactor).toBeCloseTo(2, 12);
  });
  it('skips non-positive and non-finite points and gives NaN on too few points', () => {
    const f = powerLawFit([0, -1, NaN, 2, 4], [1, 1, 1, 3, 5]);
    expect(f.count).toBe(2);
    expect(Number.isNaN(f.exponentInterval[0])).toBe(true);
    const empty = powerLawFit([], []);
    expect(empty.count).toBe(0);
    expect(Number.isNaN(empty.exponent)).toBe(true);
  });
});
