/**
 * Downsamples a series to at most `points` values for a sparkline: the mean
 * of each of `points` equal index bins (bin means keep the level of a noisy
 * series; min/max picking would draw its noise). Non-finite values are
 * skipped; a bin with none is left out. Empty input gives [].
 */
export function sparklinePoints(values: ArrayLike<number | null>, points = 32): number[] {
  const n = values.length;
  if (n === 0 || points < 1) return [];
  const bins = Math.min(points, n);
  const out: number[] = [];
  for (let b = 0; b < bins; b++) {
    const from = Math.floor((b * n) / bins);
    const to = Math.floor(((b + 1) * n) / bins);
    let sum = 0;
    let count = 0;
    for (let i = from; i < to; i++) {
      const v = values[i];
      if (typeof v === 'number' && Number.isFinite(v)) {
        sum += v;
        count++;
      }
    }
    if (count > 0) out.push(sum / count);
  }
  return out;
}
