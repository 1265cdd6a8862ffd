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

/** Growable typed-array list of pairs (no per-pair allocation); pass one in to reuse it frame after frame. */
export class PairList {
  count = 0;
  a = new Int32Array(16);
  b = new Int32Array(16);
  d = new Float64Array(16);

  push(i: number, j: number, dist: number): void {
    if (this.count === this.a.length) {
      const grow = <T extends Int32Array | Float64Array>(old: T, make: (n: number) => T) => {
        const g = make(2 * old.length);
        g.set(old);
        return g;
      };
      this.a = grow(this.a, (n) => new Int32Array(n));
      this.b = grow(this.b, (n) => new Int32Array(n));
      this.d = grow(this.d, (n) => new Float64Array(n));
    }
    this.a[this.count] = i;
    this.b[this.count] = j;
    this.d[this.count] = dist;
    this.count++;
  }

  /** The pairs as views of the list's arrays (valid until the list is reused). */
  view(): ClosePairs {
    return { count: this.count, a: this.a, b: this.b, distance: this.d };
  }

  /** Exact-size copy. */
  toClosePairs(): ClosePairs {
    return { count: this.count, a: this.a.slice(0, this.count), b: this.b.slice(0, this.count), distance: this.d.slice(0, this.count) };
  }
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
  options: { method?: NeighbourMethod | 'sweep'; bruteForceBelow?: number; sweep?: SweepOrder; list?: PairList } = {},
): ClosePairs {
  const { count } = frame;
  const method = options.method ?? 'auto';
  const useGrid = method === 'grid' || (method === 'auto' && count >= (options.bruteForceBelow ?? 260));
  if (!(maxDistance > 0)) return { count: 0, a: new Int32Array(0), b: new Int32Array(0), distance: new Float64Array(0) };
  const list = options.list ?? new PairList();
  list.count = 0;
  if (useGrid) gridPairs(frame, maxDistance, list);
  else if (method === 'sweep' || options.sweep) sweepPairs(frame, maxDistance, list, options.sweep ?? new SweepOrder());
  else brutePairs(frame, maxDistance, list);
  return options.list ? list.view() : list.toClosePairs();
}

/**
 * Order of a frame's individuals by x kept from one frame to the next: the
 * sweep re-sorts it by insertion, which is O(N) when the order barely changes
 * between frames (temporal coherence).
 */
export class SweepOrder {
  order = new Int32Array(0);
  key = new Float64Array(0);
  count = -1;
}

/**
 * Sort-and-sweep ("sweep and prune", Baraff, "Dynamic simulation of
 * non-penetrating rigid bodies", PhD thesis, Cornell 1992): individuals
 * sorted by x; only pairs with |Δx| < maxDistance are measured. Exact.
 */
function sweepPairs(frame: FrameView, maxDistance: number, list: PairList, st: SweepOrder): void {
  const { count, dims, x, y, z } = frame;
  const three = dims === 3;
  const d2max = maxDistance * maxDistance;
  if (st.order.length < count) {
    st.order = new Int32Array(2 * count);
    st.key = new Float64Array(2 * count);
    st.count = -1;
  }
  const order = st.order, key = st.key;
  if (st.count !== count) for (let k = 0; k < count; k++) order[k] = k;
  st.count = count;
  for (let i = 0; i < count; i++) {
    const ok = Number.isFinite(x[i]) && Number.isFinite(y[i]) && (!three || Number.isFinite(z[i]));
    key[i] = ok ? x[i] : Infinity;
  }
  // Insertion sort from last frame's order: nearly sorted, so about N steps.
  for (let k = 1; k < count; k++) {
    const o = order[k], v = key[o];
    let m = k - 1;
    while (m >= 0 && key[order[m]] > v) {
      order[m + 1] = order[m];
      m--;
    }
    order[m + 1] = o;
  }
  for (let p = 0; p < count; p++) {
    const i = order[p];
    const xi = key[i];
    if (xi === Infinity) break;
    const yi = y[i], zi = three ? z[i] : 0;
    for (let q = p + 1; q < count; q++) {
      const j = order[q];
      const dx = key[j] - xi;
      if (dx >= maxDistance) break;
      const dy = y[j] - yi, dz = three ? z[j] - zi : 0;
      const d2 = dx * dx + dy * dy + dz * dz;
      if (d2 < d2max) {
        if (i < j) list.push(i, j, Math.sqrt(d2));
        else list.push(j, i, Math.sqrt(d2));
      }
    }
  }
  sortPairs(list);
}

/** Sorts a pair list into canonical order (a, then b). */
function sortPairs(list: PairList): void {
  const { a, b, d, count } = list;
  for (let k = 1; k < count; k++) {
    const ak = a[k], bk = b[k], dk = d[k];
    let m = k - 1;
    while (m >= 0 && (a[m] > ak || (a[m] === ak && b[m] > bk))) {
      a[m + 1] = a[m];
      b[m + 1] = b[m];
      d[m + 1] = d[m];
      m--;
    }
    a[m + 1] = ak;
    b[m + 1] = bk;
    d[m + 1] = dk;
  }
}

function brutePairs(frame: FrameView, maxDistance: number, list: PairList): void {
  const { count, dims, x, y, z } = frame;
  const three = dims === 3;
  const d2max = maxDistance * maxDistance;
  for (let i = 0; i < count; i++) {
    const xi = x[i], yi = y[i], zi = three ? z[i] : 0;
    for (let j = i + 1; j < count; j++) {
      const dx = x[j] - xi, dy = y[j] - yi, dz = three ? z[j] - zi : 0;
      const d2 = dx * dx + dy * dy + dz * dz;
      if (d2 < d2max) list.push(i, j, Math.sqrt(d2));
    }
  }
}

function gridPairs(frame: FrameView, maxDistance: number, list: PairList): void {
  const { count, dims, x, y, z } = frame;
  const d2max = maxDistance * maxDistance;
  // Up to 16 cells per point: cells no larger than maxDistance where possible (x-rows make empty cells cheap).
  const g = buildCellGrid(frame, maxDistance, 16 * count + 64);
  const { nx, ny, nz, cellStart, items, cellOf } = g;
  for (let i = 0; i < count; i++) {
    const c = cellOf[i];
    if (c < 0) continue;
    const first = list.count;
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
          if (d2 < d2max) list.push(i, j, Math.sqrt(d2));
        }
      }
    // Canonical order (a, then b), as brute force gives: insertion sort of this i's few partners by b.
    const { b, d } = list;
    for (let k = first + 1; k < list.count; k++) {
      const bk = b[k], dk = d[k];
      let m = k - 1;
      while (m >= first && b[m] > bk) {
        b[m + 1] = b[m];
        d[m + 1] = d[m];
        m--;
      }
      b[m + 1] = bk;
      d[m + 1] = dk;
    }
  }
}

/**
 * Nearest-neighbour distances and all pairs closer than `maxDistance` of one
 * frame in a single brute-force pass over the N(N−1)/2 pairs (the engine's
 * per-frame step for small groups; for large N use the cell-list forms of
 * {@link nearestNeighbourDistances} and {@link pairsWithinDistance}).
 *
 * Method: exact, identical results to the two separate functions (same
 * canonical pair order, same neighbour ties). Units: metres. Individuals
 * alone or with non-finite positions get NaN; maxDistance ≤ 0: no pairs.
 * `out` (length ≥ count) receives the distances, `neighbour` the index of
 * each nearest neighbour (−1 if none); with `reuse` the pairs are views of
 * that list's arrays.
 */
export function nearestNeighboursAndPairs(frame: FrameView, maxDistance: number, out: Float64Array, neighbour: Int32Array, reuse?: PairList): ClosePairs {
  const { count, dims, x, y } = frame;
  // In 2D a zero z column keeps one loop for both cases.
  const z = dims === 3 ? frame.z : zeros(count);
  const d2max = maxDistance > 0 ? maxDistance * maxDistance : -1;
  const list = reuse ?? new PairList();
  list.count = 0;
  out.fill(Infinity, 0, count);
  neighbour.fill(-1, 0, count);
  // Hot loop (O(N²)): one distance per pair feeds both statistics.
  for (let i = 0; i < count; i++) {
    const xi = x[i], yi = y[i], zi = z[i];
    let best = out[i];
    let bestJ = neighbour[i];
    for (let j = i + 1; j < count; j++) {
      const dx = x[j] - xi, dy = y[j] - yi, dz = z[j] - zi;
      const d2 = dx * dx + dy * dy + dz * dz;
      if (d2 < best) {
        best = d2;
        bestJ = j;
      }
      if (d2 < out[j]) {
        out[j] = d2;
        neighbour[j] = i;
      }
      if (d2 < d2max) list.push(i, j, Math.sqrt(d2));
    }
    out[i] = best;
    neighbour[i] = bestJ;
  }
  for (let i = 0; i < count; i++) out[i] = out[i] === Infinity ? NaN : Math.sqrt(out[i]);
  return reuse ? list.view() : list.toClosePairs();
}

let zeroColumn = new Float64Array(0);
function zeros(n: number): Float64Array {
  if (zeroColumn.length < n) zeroColumn = new Float64Array(2 * n);
  return zeroColumn;
}
