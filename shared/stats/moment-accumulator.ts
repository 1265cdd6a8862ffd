/** Streaming central moments up to order four. */
export interface MomentAccumulator {
  /** Adds one value; non-finite values are skipped. */
  add(value: number): void;
  /** Merges another accumulator into this one (parallel formula). */
  merge(other: MomentAccumulator): void;
  /**
   * Adds values[0..count) (non-finite skipped) as one group: two-pass central moments of the group, then the
   * parallel merge — a few flops per value instead of a full update, and no less accurate.
   */
  addBatch(values: ArrayLike<number>, count: number): void;
  readonly count: number;
  readonly mean: number;
  /** Sums of powers of deviations from the mean (M2, M3, M4). */
  readonly m2: number;
  readonly m3: number;
  readonly m4: number;
}

/**
 * Creates a streaming accumulator of the mean and the second to fourth
 * central moments.
 *
 * Method: one-pass update of Welford generalised to higher moments, and the
 * pairwise merge formula, from "Formulas for robust, one-pass parallel
 * computation of covariances and arbitrary-order statistical moments"
 * (Pébay, Sandia report SAND2008-6212, 2008). No catastrophic cancellation:
 * deviations are taken from the running mean.
 *
 * Units: those of the values. Empty: `count` 0, `mean` NaN, moments 0.
 */
export function createMomentAccumulator(): MomentAccumulator {
  let n = 0;
  let mean = 0;
  let m2 = 0;
  let m3 = 0;
  let m4 = 0;
  const mergeRaw = (nb: number, meanb: number, m2b: number, m3b: number, m4b: number): void => {
    if (nb === 0) return;
    if (n === 0) {
      n = nb;
      mean = meanb;
      m2 = m2b;
      m3 = m3b;
      m4 = m4b;
      return;
    }
    const na = n;
    const nx = na + nb;
    const delta = meanb - mean;
    const d2 = delta * delta;
    const d3 = d2 * delta;
    const d4 = d2 * d2;
    const newM4 =
      m4 + m4b + (d4 * na * nb * (na * na - na * nb + nb * nb)) / (nx * nx * nx) +
      (6 * d2 * (na * na * m2b + nb * nb * m2)) / (nx * nx) +
      (4 * delta * (na * m3b - nb * m3)) / nx;
    const newM3 =
      m3 + m3b + (d3 * na * nb * (na - nb)) / (nx * nx) + (3 * delta * (na * m2b - nb * m2)) / nx;
    const newM2 = m2 + m2b + (d2 * na * nb) / nx;
    mean += (delta * nb) / nx;
    n = nx;
    m2 = newM2;
    m3 = newM3;
    m4 = newM4;
  };
  const acc: MomentAccumulator = {
    add(value: number): void {
      if (!Number.isFinite(value)) return;
      const n1 = n;
      n += 1;
      const delta = value - mean;
      const deltaN = delta / n;
      const deltaN2 = deltaN * deltaN;
      const term1 = delta * deltaN * n1;
      mean += deltaN;
      m4 += term1 * deltaN2 * (n * n - 3 * n + 3) + 6 * deltaN2 * m2 - 4 * deltaN * m3;
      m3 += term1 * deltaN * (n - 2) - 3 * deltaN * m2;
      m2 += term1;
    },
    merge(other: MomentAccumulator): void {
      mergeRaw(other.count, other.mean, other.m2, other.m3, other.m4);
    },
    addBatch(values: ArrayLike<number>, count: number): void {
      let k = 0, sum = 0;
      for (let i = 0; i < count; i++) {
        const v = values[i];
        if (v - v === 0) {
          sum += v;
          k++;
        }
      }
      if (k === 0) return;
      const mb = sum / k;
      let b2 = 0, b3 = 0, b4 = 0, corr = 0;
      for (let i = 0; i < count; i++) {
        const v = values[i];
        if (!(v - v === 0)) continue;
        const d = v - mb;
        const d2 = d * d;
        corr += d;
        b2 += d2;
        b3 += d2 * d;
        b4 += d2 * d2;
      }
      // Compensate the rounding of the group mean (corrected two-pass algorithm, Chan, Golub & LeVeque 1983).
      const c = corr / k;
      const mean2 = mb + c;
      b4 = b4 - 4 * c * b3 + 6 * c * c * b2 - 3 * k * c ** 4;
      b3 = b3 - 3 * c * b2 + 2 * k * c ** 3;
      b2 = b2 - k * c * c;
      mergeRaw(k, mean2, b2, b3, b4);
    },
    get count() {
      return n;
    },
    get mean() {
      return n === 0 ? NaN : mean;
    },
    get m2() {
      return m2;
    },
    get m3() {
      return m3;
    },
    get m4() {
      return m4;
    },
  };
  return acc;
}
