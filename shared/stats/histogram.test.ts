import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { histogram } from './histogram';

describe('histogram(values, options, valueof?)', () => {
  it('normalises to a density that integrates to 1', () => {
    // Source: derived (definition of a probability density).
    const rnd = createSeededRandom(2);
    const h = histogram(Array.from({ length: 5000 }, () => rnd.normal()), { min: -5, max: 5, bins: 50 });
    const w = 10 / 50;
    expect(h.density.reduce((s, d) => s + d * w, 0)).toBeCloseTo(1, 12);
    // Standard normal density at 0 is 1/sqrt(2π) ≈ 0.399 [common practice]; bin [-0.1, 0.1), 4 SE tolerance.
    expect(h.density[25]).toBeGreaterThan(0.3);
    expect(h.density[25]).toBeLessThan(0.5);
  });
  it('puts max in the last bin and counts values outside', () => {
    const h = histogram([0, 1, 2, 3, 4, -1, 9, NaN], { min: 0, max: 4, bins: 4 });
    expect(Array.from(h.counts)).toEqual([1, 1, 1, 2]);
    expect(h.outside).toBe(2);
  });
  it('returns zero density for empty input and empty arrays for bad options', () => {
    expect(Array.from(histogram([], { min: 0, max: 1, bins: 2 }).density)).toEqual([0, 0]);
    expect(histogram([1], { min: 1, max: 1, bins: 2 }).counts.length).toBe(0);
  });
  it('reads through the accessor', () => {
    expect(Array.from(histogram([{ v: 0.2 }, { v: 0.7 }], { min: 0, max: 1, bins: 2 }, (d) => d.v).counts)).toEqual([1, 1]);
  });
});
