import type { Valueof } from './types';

/**
 * Sorted `Float64Array` copy of the finite values (the input is not mutated).
 */
export function sortedFinite<T = number>(values: ArrayLike<T>, valueof?: Valueof<T>): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < n; i++) {
    const v = valueof ? valueof(values[i], i) : (values[i] as unknown as number);
    if (Number.isFinite(v)) out[k++] = v;
  }
  return out.subarray(0, k).sort();
}

/**
 * The p-quantile of `values` (0 ≤ p ≤ 1).
 *
 * Method: linear interpolation between order statistics at index (n−1)p,
 * type 7 of "Sample quantiles in statistical packages" (Hyndman & Fan, The
 * American Statistician 50, 1996), the default of R and NumPy.
 * Units: those of the values. Non-finite values are skipped; returns NaN for
 * no finite values or p outside [0, 1].
 */
export function quantile<T = number>(values: ArrayLike<T>, p: number, valueof?: Valueof<T>): number {
  return quantileSorted(sortedFinite(values, valueof), p);
}

/** Type-7 quantile of an already sorted array of finite numbers (see {@link quantile}). */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0 || !(p >= 0 && p <= 1)) return NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}
