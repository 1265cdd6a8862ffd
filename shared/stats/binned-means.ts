
export interface BinnedMeans {
  edges: Float64Array;
  centres: Float64Array;
  counts: Float64Array;
  means: Float64Array;
  /** Standard error of each bin mean (NaN for fewer than two values). */
  standardErrors: Float64Array;
}

/**
 * Mean of y in equal-width bins of x (e.g. mean speed versus distance from
 * the centroid, mean radial acceleration versus distance).
 *
 * Method: bin i holds min + i·w ≤ x < min + (i+1)·w; per-bin mean and its
 * standard error s/√n [common practice]. Units: edges in x-units, means in
 * y-units. Pairs with a non-finite x or y are skipped; empty bins have mean
 * NaN. Empty input: all counts 0.
 */
export function binnedMeans(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  options: { min: number; max: number; bins: number },
): BinnedMeans {
  const bins = Math.max(0, Math.floor(options.bins));
  const { min, max } = options;
  const w = (max - min) / bins;
  const edges = new Float64Array(bins + 1);
  const centres = new Float64Array(bins);
  for (let i = 0; i <= bins; i++) edges[i] = min + i * w;
  for (let i = 0; i < bins; i++) centres[i] = min + (i + 0.5) * w;
  const counts = new Float64Array(bins);
  const sums = new Float64Array(bins);
  const n = Math.min(x.length, y.length);
  if (w > 0)
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) continue;
      const k = Math.floor((x[i] - min) / w);
      if (k < 0 || k >= bins) continue;
      counts[k]++;
      sums[k] += y[i];
    }
  const means = new Float64Array(bins);
  for (let i = 0; i < bins; i++) means[i] = counts[i] > 0 ? sums[i] / counts[i] : NaN;
  const ss = new Float64Array(bins);
  if (w > 0)
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) continue;
      const k = Math.floor((x[i] - min) / w);
      if (k < 0 || k >= bins) continue;
      const d = y[i] - means[k];
      ss[k] += d * d;
    }
  const standardErrors = new Float64Array(bins);
  for (let i = 0; i < bins; i++) standardErrors[i] = counts[i] >= 2 ? Math.sqrt(ss[i] / (counts[i] - 1) / counts[i]) : NaN;
  return { edges, centres, counts, means, standardErrors };
}
