import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { polarization } from './polarization';
import { randomHeadingPolarization } from './random-heading-polarization';
import { frameOf } from './test-support';

describe('polarization(frame)', () => {
  it('is 1 for parallel velocities of any speed', () => {
    // Source: Vicsek et al., Phys. Rev. Lett. 75 (1995): φ = 1 for perfect alignment.
    const f = frameOf(3, [[0, 0, 0], [1, 2, 3], [4, 4, 4]], [[1, 1, 0], [2, 2, 0], [0.1, 0.1, 0]]);
    expect(polarization(f)).toBeCloseTo(1, 14);
  });
  it('is 0 for two opposite velocities', () => {
    expect(polarization(frameOf(2, [[0, 0], [1, 0]], [[1, 0], [-3, 0]]))).toBeCloseTo(0, 14);
  });
  it('is NaN for an empty frame, no velocity columns, or only zero velocities', () => {
    expect(polarization(frameOf(3, []))).toBeNaN();
    expect(polarization(frameOf(3, [[0, 0, 0]]))).toBeNaN();
    expect(polarization(frameOf(3, [[0, 0, 0]], [[0, 0, 0]]))).toBeNaN();
  });
  it('skips NaN velocities', () => {
    expect(polarization(frameOf(2, [[0, 0], [1, 1]], [[1, 0], [NaN, 0]]))).toBe(1);
  });
  for (const dims of [3, 2] as const) {
    it(`averages to sqrt(${dims === 3 ? '8/(3πN)' : 'π/(4N)'}) for random headings in ${dims}D`, () => {
      // Source: derived in SCIENCE.md (Maxwell/Rayleigh law of a sum of N unit vectors).
      // Tolerance: per-frame sd of φ ≈ sqrt((1 − E²N)/N); 400 frames → SE ≈ 0.003; allow 5 SE + O(1/N) bias.
      const rnd = createSeededRandom(dims);
      const N = 50;
      let s = 0;
      const frames = 400;
      for (let k = 0; k < frames; k++) {
        const v = Array.from({ length: N }, () => rnd.unitVector(dims));
        s += polarization(frameOf(dims, v.map(() => [0, 0, 0]), v));
      }
      expect(Math.abs(s / frames - randomHeadingPolarization(N, dims))).toBeLessThan(0.015);
    });
  }
});

describe('randomHeadingPolarization(n, dims)', () => {
  it('gives sqrt(8/(3πN)) in 3D and sqrt(π/(4N)) in 2D, NaN for N < 1', () => {
    // Source: SCIENCE.md (derived).
    expect(randomHeadingPolarization(100, 3)).toBeCloseTo(Math.sqrt(8 / (300 * Math.PI)), 14);
    expect(randomHeadingPolarization(100, 2)).toBeCloseTo(Math.sqrt(Math.PI / 400), 14);
    expect(randomHeadingPolarization(0, 3)).toBeNaN();
  });
});
