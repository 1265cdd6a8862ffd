import type { Valueof } from './types';

/** A histogram over equal-width bins. */
export interface Histogram {
  /** bins + 1 edges, in the units of the values. */
  edges: Float64Array;
  counts: Float64Array;
  /**
   * Probability density per bin: counts / (in-range total × bin width), so
   * Σ density·width = 1 over the values inside [min, max].
   */
  density: Float64Array;
  /** Finite values below min or above max. */
  outside: number;
}

export interface HistogramOptions {
  min: number;
  max: number;
  bins: number;
}

/**
 * Equal-width histogram normalised to a probability density.
 *
 * Method: bin i holds min + i·w ≤ v < min + (i+1)·w with w = (max−min)/bins;
 * v = max falls in the last bin [common practice, as numpy.histogram].
 * Units: edges in the values' units, density in their inverse.
 * Non-finite values are skipped. Empty input (or no value in range): counts
 * zero and density all zeros. Invalid options (bins < 1, max ≤ min): empty
 * arrays.
 */
export function histogram<T = number>(values: ArrayLike<T>, options: HistogramOptions, valueof?: Valueof<T>): Histogram {
  const { min, max } = options;
  const bins = Math.floor(options.bins);
  if (!(bins >= 1) || !(max > min) || !Number.isFinite(min) || !Number.isFinite(max)) {
    return { edges: new Float64Array(0), counts: new Float64Array(0), density: new Float64Array(0), outside: 0 };
  }
  const width = (max - min) / bins;
  const edges = new Float64Array(bins + 1);
  for (let i = 0; i <= bins; i++) edges[i] = min + i * width;
  const counts = new Float64Array(bins);
  let outside = 0;
  let inside = 0;
  for (let i = 0; i < values.length; i++) {
    const v = valueof ? valueof(values[i], i) : (values[i] as unknown as number);
    if (!Number.isFinite(v)) continue;
    if (v < min || v > max) {
      outside++;
      continue;
    }
    const k = Math.min(bins - 1, Math.floor((v - min) / width));
    counts[k]++;
    inside++;
  }
  const density = new Float64Array(bins);
  if (inside > 0) for (let i = 0; i < bins; i++) density[i] = counts[i] / (inside * width);
  return { edges, counts, density, outside };
}
