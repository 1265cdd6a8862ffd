import { buildCellGrid } from './cell-grid';
import type { NeighbourMethod } from './nearest-neighbour-distances';
import type { FrameView } from './types';

/** Index pairs (a[k] < b[k]) of one frame closer than a distance. */
export interface ClosePairs {
  count: number;
  a: Int32Array;
  b: Int32Array;
  distance: Float64Array;
}

/**
 * All pairs of individuals of one frame with |r_a − r_b| < `maxDistance`.
 *
 * Method: brute force for small N, otherwise a cell list of side
 * `maxDistance` searched over the 3^d neighbouring cells ("Computer
 * simulation of liquids", Allen & Tildesley, 1987) [common practice]; both
 * are exact and list pairs in the same canonical order (a ascending, then b).
 * Units: metres. Non-finite positions are skipped. Empty frame or
 * maxDistance ≤ 0: no pairs.
 */
export function pairsWithinDistance(
  frame: FrameView,
  maxDistance: number,
  options: { method?: NeighbourMethod; bruteForceBelow?: number } = {},
): ClosePairs {
  const { count, dims, x, y, z } = frame;
  const a: number[] = [];
  const b: number[] = [];
  const dist: number[] = [];
  const d2max = maxDistance * maxDistance;
  const method = options.method ?? 'auto';
  const useGrid = method === 'grid' || (method === 'auto' && count >= (options.bruteForceBelow ?? 300));
  if (!(maxDistance > 0)) return { count: 0, a: new Int32Array(0), b: new Int32Array(0), distance: new Float64Array(0) };
  if (!useGrid) {
    for (let i = 0; i < count; i++) {
      const zi = dims === 3 ? z[i] : 0;
      for (let j = i + 1; j < count; j++) {
        const dx = x[j] - x[i], dy = y[j] - y[i], dz = dims === 3 ? z[j] - zi : 0;
        const d2 = dx * dx + dy * dy + dz * dz;
        if (d2 < d2max) {
          a.push(i);
          b.push(j);
          dist.push(Math.sqrt(d2));
        }
      }
    }
  } else {
    const g = buildCellGrid(frame, maxDistance);
    const { nx, ny, nz, cellStart, items, cellOf } = g;
    for (let i = 0; i < count; i++) {
      const c = cellOf[i];
      if (c < 0) continue;
      const cx = c % nx, cy = ((c / nx) | 0) % ny, cz = (c / (nx * ny)) | 0;
      const xi = x[i], yi = y[i], zi = dims === 3 ? z[i] : 0;
      for (let qz = Math.max(0, cz - 1); qz <= Math.min(nz - 1, cz + 1); qz++)
        for (let qy = Math.max(0, cy - 1); qy <= Math.min(ny - 1, cy + 1); qy++) {
          const row = (qz * ny + qy) * nx;
          const k0 = cellStart[row + Math.max(0, cx - 1)], k1 = cellStart[row + Math.min(nx - 1, cx + 1) + 1];
          // Cells of one x-row are contiguous in `items`.
          for (let k = k0; k < k1; k++) {
            const j = items[k];
            if (j <= i) continue;
            const dx = x[j] - xi, dy = y[j] - yi, dz = dims === 3 ? z[j] - zi : 0;
            const d2 = dx * dx + dy * dy + dz * dz;
            if (d2 < d2max) {
              a.push(i);
              b.push(j);
              dist.push(Math.sqrt(d2));
            }
          }
        }
    }
    // Canonical order (a, then b), as brute force gives.
    const order = a.map((_, k) => k).sort((p, q) => a[p] - a[q] || b[p] - b[q]);
    return { count: a.length, a: Int32Array.from(order, (k) => a[k]), b: Int32Array.from(order, (k) => b[k]), distance: Float64Array.from(order, (k) => dist[k]) };
  }
  return { count: a.length, a: Int32Array.from(a), b: Int32Array.from(b), distance: Float64Array.from(dist) };
}
