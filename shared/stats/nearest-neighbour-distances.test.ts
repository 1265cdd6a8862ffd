import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { idealGasNearestNeighbourDistance } from './ideal-gas-nearest-neighbour-distance';
import { nearestNeighbourDistances } from './nearest-neighbour-distances';
import { nearestNeighboursAndPairs, pairsWithinDistance, SweepOrder } from './pairs-within-distance';
import { frameOf } from './test-support';

function uniformCube(n: number, dims: 2 | 3, seed: number) {
  const rnd = createSeededRandom(seed);
  return Array.from({ length: n }, () => [rnd.uniform(), rnd.uniform(), dims === 3 ? rnd.uniform() : 0]);
}

describe('nearestNeighbourDistances(frame, options?)', () => {
  it('gives the same distances and neighbours by brute force and by the cell list', () => {
    // Source: derived (both are exact searches). Clustered points plus a far outlier.
    const rnd = createSeededRandom(9);
    const pts = Array.from({ length: 700 }, (_, i) => [rnd.normal() * (i % 3 ? 1 : 0.01), rnd.normal(), rnd.normal()]);
    pts.push([1e4, -1e4, 3]);
    const f = frameOf(3, pts);
    const nbA = new Int32Array(pts.length);
    const nbB = new Int32Array(pts.length);
    const a = nearestNeighbourDistances(f, { method: 'brute', neighbour: nbA });
    const b = nearestNeighbourDistances(f, { method: 'grid', neighbour: nbB });
    for (let i = 0; i < pts.length; i++) expect(b[i]).toBe(a[i]);
    expect(Array.from(nbB)).toEqual(Array.from(nbA));
  });
  for (const dims of [3, 2] as const) {
    it(`matches the ideal-gas mean for uniform random points in ${dims}D`, () => {
      // Source: SCIENCE.md (derived) ⟨d⟩ = Γ(4/3)(4πn/3)^(−1/3) in 3D, 1/(2√n) in 2D.
      // Interior points only (margin ≫ ⟨d⟩) to avoid the wall effect. Tolerance 5 SE with the theoretical
      // coefficient of variation sd(d)/⟨d⟩ = sqrt(Γ(5/3)/Γ(4/3)² − 1) ≈ 0.363 (3D), sqrt(4/π − 1) ≈ 0.523 (2D) (derived).
      const n = dims === 3 ? 4000 : 3000;
      const pts = uniformCube(n, dims, 20 + dims);
      const d = nearestNeighbourDistances(frameOf(dims, pts));
      const margin = 0.15;
      let s = 0, k = 0;
      pts.forEach((p, i) => {
        const inside = p.slice(0, dims).every((c) => c > margin && c < 1 - margin);
        if (inside) (s += d[i]), k++;
      });
      const cv = dims === 3 ? 0.363 : 0.523;
      expect(Math.abs(s / k / idealGasNearestNeighbourDistance(n, dims) - 1)).toBeLessThan((5 * cv) / Math.sqrt(k));
    });
  }
  it('returns NaN for a lone individual or a non-finite position, empty for an empty frame', () => {
    expect(nearestNeighbourDistances(frameOf(3, [])).length).toBe(0);
    expect(nearestNeighbourDistances(frameOf(3, [[0, 0, 0]]))[0]).toBeNaN();
    const d = nearestNeighbourDistances(frameOf(2, [[0, 0], [3, 4], [NaN, 0]]), { method: 'grid' });
    expect(Array.from(d.subarray(0, 2))).toEqual([5, 5]);
    expect(d[2]).toBeNaN();
    expect(nearestNeighbourDistances(frameOf(2, [[0, 0], [3, 4], [NaN, 0]]), { method: 'brute' })[2]).toBeNaN();
  });
});

describe('idealGasNearestNeighbourDistance(density, dims)', () => {
  it('equals ∫ exp(−n·4πr³/3) dr numerically (3D) and 0.554 n^(−1/3)', () => {
    // Source: derived; Γ(4/3) ≈ 0.89298 [memory], checked here by quadrature.
    const n = 1000;
    let s = 0;
    const h = 1e-5;
    for (let r = h / 2; r < 0.5; r += h) s += Math.exp((-n * 4 * Math.PI * r ** 3) / 3) * h;
    expect(idealGasNearestNeighbourDistance(n, 3)).toBeCloseTo(s, 6);
    expect(idealGasNearestNeighbourDistance(n, 3) * Math.cbrt(n)).toBeCloseTo(0.554, 3);
    expect(idealGasNearestNeighbourDistance(0, 3)).toBeNaN();
  });
});

describe('pairsWithinDistance(frame, maxDistance, options?)', () => {
  it('lists the same pairs by brute force and by the cell list', () => {
    // Source: derived (both exact).
    const f = frameOf(3, uniformCube(800, 3, 4));
    const a = pairsWithinDistance(f, 0.05, { method: 'brute' });
    const b = pairsWithinDistance(f, 0.05, { method: 'grid' });
    expect(b.count).toBe(a.count);
    expect(Array.from(b.a)).toEqual(Array.from(a.a));
    expect(Array.from(b.b)).toEqual(Array.from(a.b));
    expect(a.count).toBeGreaterThan(10);
  });
  it('finds nothing in an empty frame or for a non-positive distance', () => {
    expect(pairsWithinDistance(frameOf(3, []), 1).count).toBe(0);
    expect(pairsWithinDistance(frameOf(3, [[0, 0, 0], [0, 0, 0]]), 0).count).toBe(0);
  });
});

describe('nearestNeighboursAndPairs(frame, maxDistance, out, neighbour)', () => {
  it('gives the distances, neighbours and pairs of the separate brute-force functions', () => {
    // Source: derived (one pass computes the same exact quantities). Includes a NaN position.
    for (const dims of [3, 2] as const) {
      const pts = uniformCube(150, dims, 11 + dims);
      pts[7] = [NaN, 0.5, 0.5];
      const f = frameOf(dims, pts);
      const nbA = new Int32Array(150), nbB = new Int32Array(150), out = new Float64Array(150);
      const d = nearestNeighbourDistances(f, { method: 'brute', neighbour: nbA });
      const p = pairsWithinDistance(f, 0.08, { method: 'brute' });
      const q = nearestNeighboursAndPairs(f, 0.08, out, nbB);
      expect(Array.from(out)).toEqual(Array.from(d));
      expect(Array.from(nbB)).toEqual(Array.from(nbA));
      expect([q.count, Array.from(q.a), Array.from(q.b), Array.from(q.distance)]).toEqual([p.count, Array.from(p.a), Array.from(p.b), Array.from(p.distance)]);
      expect(p.count).toBeGreaterThan(10);
    }
  });
});

describe('pairsWithinDistance(frame, maxDistance, { sweep })', () => {
  it('lists the same pairs by sort-and-sweep as by brute force, frame after frame', () => {
    // Source: derived (both exact); the kept x-order is re-sorted on each moving frame.
    const rnd = createSeededRandom(31);
    const pts = uniformCube(200, 3, 5);
    const sweep = new SweepOrder();
    for (let t = 0; t < 5; t++) {
      for (const p of pts) for (let a = 0; a < 3; a++) p[a] += 0.01 * rnd.normal();
      const f = frameOf(3, t === 3 ? pts.slice(0, 150) : pts);
      const a = pairsWithinDistance(f, 0.06, { method: 'brute' });
      const b = pairsWithinDistance(f, 0.06, { method: 'sweep', sweep });
      expect([b.count, Array.from(b.a), Array.from(b.b), Array.from(b.distance)]).toEqual([a.count, Array.from(a.a), Array.from(a.b), Array.from(a.distance)]);
    }
  });
});
