import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { binnedMeans } from './binned-means';
import { radialDensityProfile, shellVolume } from './radial-density-profile';
import { frameOf } from './test-support';

describe('radialDensityProfile(frame, options, centre?)', () => {
  it('is flat at n = N/V inside a uniformly filled ball', () => {
    // Source: derived (uniform density); binomial SE per shell, tolerance 15 % on shells with ≥ 300 points.
    const rnd = createSeededRandom(31);
    const N = 20000;
    const pts: number[][] = [];
    while (pts.length < N) {
      const p = [rnd.uniform() * 2 - 1, rnd.uniform() * 2 - 1, rnd.uniform() * 2 - 1];
      if (p[0] ** 2 + p[1] ** 2 + p[2] ** 2 < 1) pts.push(p);
    }
    const prof = radialDensityProfile(frameOf(3, pts), { binWidth: 0.1, bins: 10 }, { x: 0, y: 0, z: 0 });
    const n = N / ((4 / 3) * Math.PI);
    for (let i = 3; i < 10; i++) expect(prof.density[i] / n).toBeCloseTo(1, 0.8);
    expect(prof.counts.reduce((s, c) => s + c, 0)).toBe(N);
  });
  it('uses exact shell volumes that add up to the ball (3D) and disc (2D)', () => {
    expect(shellVolume(0, 1, 3) + shellVolume(1, 2, 3)).toBeCloseTo((4 / 3) * Math.PI * 8, 12);
    expect(shellVolume(0, 2, 2)).toBeCloseTo(4 * Math.PI, 12);
  });
  it('has zero counts for an empty frame', () => {
    expect(Array.from(radialDensityProfile(frameOf(2, []), { binWidth: 1, bins: 2 }).counts)).toEqual([0, 0]);
  });
});

describe('binnedMeans(x, y, options)', () => {
  it('averages y per x-bin, skips NaN and leaves empty bins NaN', () => {
    const b = binnedMeans([0.1, 0.2, 1.5, NaN, 5], [1, 3, 10, 7, 1], { min: 0, max: 3, bins: 3 });
    expect(b.means[0]).toBe(2);
    expect(b.means[1]).toBe(10);
    expect(b.means[2]).toBeNaN();
    expect(Array.from(b.counts)).toEqual([2, 1, 0]);
    expect(b.standardErrors[0]).toBeCloseTo(Math.sqrt(2 / 2), 12);
  });
});
