import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { binnedMeans } from './binned-means';
import { radialAccelerations } from './radial-accelerations';
import { springConstantFit } from './spring-constant-fit';
import { frameOf } from './test-support';

describe('springConstantFit(distance, meanRadialAcceleration, counts, minCount?)', () => {
  it('recovers K = k for a harmonic trap a = −k (r − r_c)', () => {
    // Source: SCIENCE.md check value; "Emergent dynamics of laboratory insect swarms" (Sci. Rep. 3, 2013).
    const rnd = createSeededRandom(8);
    const k = 3.7;
    const r = Array.from({ length: 3000 }, () => [rnd.normal(), rnd.normal(), rnd.normal()]);
    const f = frameOf(3, r, undefined, r.map((p) => p.map((c) => -k * c)));
    // Centre at the exact trap centre so a is exactly radial.
    const { distance, radialAcceleration } = radialAccelerations(f, { x: 0, y: 0, z: 0 });
    const b = binnedMeans(distance, radialAcceleration, { min: 0, max: 3, bins: 15 });
    const fit = springConstantFit(b.centres, b.means, b.counts);
    // Bin means of a_r = −k r over a bin are −k·(mean r in bin), not −k·centre: allow 2 %.
    expect(fit.throughOrigin.springConstant).toBeCloseTo(k, 1);
    expect(Math.abs(fit.withIntercept.springConstant / k - 1)).toBeLessThan(0.02);
    expect(fit.throughOrigin.rSquared).toBeGreaterThan(0.999);
  });
  it('is exact when the bins are given at their mean distance', () => {
    // Source: derived (noise-free linear data).
    const fit = springConstantFit([0.5, 1, 1.5, 2], [-1, -2, -3, -4], [20, 20, 20, 20]);
    expect(fit.throughOrigin.springConstant).toBeCloseTo(2, 12);
    expect(fit.withIntercept.intercept).toBeCloseTo(0, 12);
    expect(fit.withIntercept.rSquared).toBeCloseTo(1, 12);
    expect(fit.binsUsed).toBe(4);
  });
  it('returns NaN with fewer than two usable bins', () => {
    const fit = springConstantFit([1, 2], [-1, NaN], [100, 100]);
    expect(fit.throughOrigin.springConstant).toBeNaN();
    expect(springConstantFit([], [], []).withIntercept.springConstant).toBeNaN();
  });
});

describe('radialAccelerations(frame, centre?)', () => {
  it('projects a onto the outward unit vector and gives NaN without accelerations', () => {
    const f = frameOf(2, [[2, 0], [0, -1]], undefined, [[-4, 1], [0, 3]]);
    const { distance, radialAcceleration } = radialAccelerations(f, { x: 0, y: 0, z: 0 });
    expect(Array.from(distance)).toEqual([2, 1]);
    expect(Array.from(radialAcceleration)).toEqual([-4, -3]);
    expect(radialAccelerations(frameOf(2, [[1, 1]])).radialAcceleration[0]).toBeNaN();
  });
});
