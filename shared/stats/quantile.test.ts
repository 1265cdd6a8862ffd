import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { quantile } from './quantile';

describe('quantile(values, p, valueof?)', () => {
  it('matches simple-statistics quantile (type 7) on random data', () => {
    // Source: simple-statistics 7.12 quantileSorted, numpy type 7.
    const rnd = createSeededRandom(11);
    const x = Array.from({ length: 537 }, () => rnd.normal());
    for (const p of [0, 0.01, 0.05, 0.25, 0.5, 0.77, 0.95, 1]) expect(quantile(x, p)).toBeCloseTo(ss.quantile(x, p), 12);
  });
  it('returns NaN for empty input and p outside [0, 1]', () => {
    expect(quantile([], 0.5)).toBeNaN();
    expect(quantile([1, 2], 1.5)).toBeNaN();
  });
  it('gives the value for one value and skips NaN', () => {
    expect(quantile([3], 0.9)).toBe(3);
    expect(quantile([NaN, 1, 3, NaN], 0.5)).toBe(2);
  });
  it('reads through the accessor and does not mutate the input', () => {
    const rows = [{ v: 3 }, { v: 1 }, { v: 2 }];
    expect(quantile(rows, 0.5, (d) => d.v)).toBe(2);
    expect(rows[0].v).toBe(3);
  });
});
