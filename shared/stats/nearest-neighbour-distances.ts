import { buildCellGrid } from './cell-grid';
import type { FrameView } from './types';

export type NeighbourMethod = 'auto' | 'brute' | 'grid';

export interface NearestNeighbourOptions {
  /** 'auto' (default) uses brute force below `bruteForceBelow` individuals, else the cell list. */
  method?: NeighbourMethod;
  /** Threshold N for 'auto': the measured crossover of brute force and cell list on the benchmark machine (npm run bench). Default 260. */
  bruteForceBelow?: number;
  /** Optional output array (length ≥ count) to avoid allocation per frame. */
  out?: Float64Array;
  /** Optional output: index of each individual's nearest neighbour (−1 if none). */
  neighbour?: Int32Array;
}

/**
 * Nearest-neighbour distance d_i = min_j |r_i − r_j| for every individual of
 * one frame.
 *
 * Method: exact search, either brute force (O(N²), fastest for small N) or a
 * cell list searched in shells of increasing Chebyshev radius until no
 * closer point can exist (O(N) for roughly uniform groups) [common
 * practice]; the two give identical results. Check value: ideal gas,
 * see {@link idealGasNearestNeighbourDistance}.
 * Units: metres. Individuals with non-finite positions, or alone in the
 * frame, get NaN. Empty frame: empty array.
 */
export function nearestNeighbourDistances(frame: FrameView, options: NearestNeighbourOptions = {}): Float64Array {
  const { count } = frame;
  const method = options.method ?? 'auto';
  const out = options.out ? options.out.subarray(0, count) : new Float64Array(count);
  const nb = options.neighbour;
  const useGrid = method === 'grid' || (method === 'auto' && count >= (options.bruteForceBelow ?? 260));
  if (useGrid) gridSearch(frame, out, nb);
  else bruteSearch(frame, out, nb);
  return out;
}

function bruteSearch(frame: FrameView, out: Float64Array, nb?: Int32Array): void {
  const { count, dims, x, y, z } = frame;
  const three = dims === 3;
  out.fill(Infinity);
  if (nb) nb.fill(-1, 0, count);
  // Hot loop (O(N²)): the row's best is kept in registers; NaN distances fail every comparison.
  for (let i = 0; i < count; i++) {
    const xi = x[i], yi = y[i], zi = three ? z[i] : 0;
    let best = out[i];
    let bestJ = nb ? nb[i] : -1;
    for (let j = i + 1; j < count; j++) {
      const dx = x[j] - xi, dy = y[j] - yi, dz = three ? z[j] - zi : 0;
      const d2 = dx * dx + dy * dy + dz * dz;
      if (d2 < best) {
        best = d2;
        bestJ = j;
      }
      if (d2 < out[j]) {
        out[j] = d2;
        if (nb) nb[j] = i;
      }
    }
    out[i] = best;
    if (nb) nb[i] = bestJ;
  }
  for (let i = 0; i < count; i++) out[i] = out[i] === Infinity ? NaN : Math.sqrt(out[i]);
}

function gridSearch(frame: FrameView, out: Float64Array, nb?: Int32Array): void {
  const { count, dims, x, y, z } = frame;
  let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity, minZ = Infinity, maxZ = -Infinity;
  let finite = 0;
  for (let i = 0; i < count; i++) {
    const zi = dims === 3 ? z[i] : 0;
    if (!Number.isFinite(x[i] + y[i] + zi)) continue;
    finite++;
    if (x[i] < minX) minX = x[i];
    if (x[i] > maxX) maxX = x[i];
    if (y[i] < minY) minY = y[i];
    if (y[i] > maxY) maxY = y[i];
    if (zi < minZ) minZ = zi;
    if (zi > maxZ) maxZ = zi;
  }
  if (finite < 2) {
    out.fill(NaN);
    if (nb) nb.fill(-1, 0, count);
    return;
  }
  // Cell side from the spread (4 sd per axis) rather than the bounding box, so outliers do not coarsen the grid;
  // about a quarter point per cell of the core: small cells mean few distances, and empty cells cost little
  // because the cells of one x-row are scanned as one range (measured best at N = 2,000, npm run bench).
  let mx = 0, my = 0, mz = 0;
  for (let i = 0; i < count; i++) {
    const zi = dims === 3 ? z[i] : 0;
    if (!Number.isFinite(x[i] + y[i] + zi)) continue;
    mx += x[i];
    my += y[i];
    mz += zi;
  }
  mx /= finite;
  my /= finite;
  mz /= finite;
  let vx = 0, vy = 0, vz = 0;
  for (let i = 0; i < count; i++) {
    const zi = dims === 3 ? z[i] : 0;
    if (!Number.isFinite(x[i] + y[i] + zi)) continue;
    vx += (x[i] - mx) ** 2;
    vy += (y[i] - my) ** 2;
    vz += (zi - mz) ** 2;
  }
  const side = (v: number, lo: number, hi: number) => Math.max(Math.min(4 * Math.sqrt(v / finite), hi - lo), 1e-12);
  const vol = side(vx, minX, maxX) * side(vy, minY, maxY) * (dims === 3 ? side(vz, minZ, maxZ) : 1);
  const h0 = Math.pow((0.25 * vol) / finite, 1 / dims);
  const g = buildCellGrid(frame, h0, 16 * finite + 64);
  const { nx, ny, nz, cellStart, items, cellOf, cellSize: h } = g;
  const maxShell = Math.max(nx, ny, nz);
  for (let i = 0; i < count; i++) {
    if (nb) nb[i] = -1;
    const c = cellOf[i];
    if (c < 0) {
      out[i] = NaN;
      continue;
    }
    const cx = c % nx;
    const cy = Math.floor(c / nx) % ny;
    const cz = Math.floor(c / (nx * ny));
    const xi = x[i], yi = y[i], zi = dims === 3 ? z[i] : 0;
    let best = Infinity;
    let bestJ = -1;
    for (let s = 0; s <= maxShell; s++) {
      const z0 = Math.max(0, cz - s), z1 = Math.min(nz - 1, cz + s);
      const y0 = Math.max(0, cy - s), y1 = Math.min(ny - 1, cy + s);
      const x0 = Math.max(0, cx - s), x1 = Math.min(nx - 1, cx + s);
      for (let qz = z0; qz <= z1; qz++) {
        const onZ = qz === cz - s || qz === cz + s;
        for (let qy = y0; qy <= y1; qy++) {
          const onY = onZ || qy === cy - s || qy === cy + s;
          // Only the cells on the surface of the shell are new; cells of one x-row are contiguous in `items`.
          const row = (qz * ny + qy) * nx;
          if (onY) {
            for (let k = cellStart[row + x0], k1 = cellStart[row + x1 + 1]; k < k1; k++) {
              const j = items[k];
              const dx = x[j] - xi, dy = y[j] - yi, dz = dims === 3 ? z[j] - zi : 0;
              const d2 = dx * dx + dy * dy + dz * dz;
              if (d2 < best && j !== i) {
                best = d2;
                bestJ = j;
              }
            }
          } else {
            for (let side = 0, qx = cx - s; side < 2; side++, qx = cx + s) {
              if (qx < 0 || qx >= nx) continue;
              for (let k = cellStart[row + qx], k1 = cellStart[row + qx + 1]; k < k1; k++) {
                const j = items[k];
                const dx = x[j] - xi, dy = y[j] - yi, dz = dims === 3 ? z[j] - zi : 0;
                const d2 = dx * dx + dy * dy + dz * dz;
                if (d2 < best && j !== i) {
                  best = d2;
                  bestJ = j;
                }
              }
            }
          }
        }
      }
      // Points in shells beyond s are at least s·h away.
      if (best <= s * h * (s * h)) break;
    }
    out[i] = best === Infinity ? NaN : Math.sqrt(best);
    if (nb) nb[i] = bestJ;
  }
}
