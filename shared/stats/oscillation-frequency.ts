/**
 * Dominant oscillation frequency of a sampled signal (e.g. a pair's
 * separation), from the crossings of its mean.
 *
 * Method: mean crossings with a hysteresis band of ±0.25 standard deviations
 * so noise does not add crossings; f = (crossings − 1) / (2·(t_last −
 * t_first)) between the first and last crossing (derived: a sinusoid crosses
 * its mean twice per period). Pairs orbiting each other were found by
 * time-frequency analysis in "Time-frequency analysis reveals pairwise
 * interactions in insect swarms" (Phys. Rev. Lett. 114, 2015).
 * Units: Hz for `sampleRate` in Hz. Fewer than 4 crossings (under about
 * two periods: "does not oscillate"), constant or empty input: NaN.
 */
export function oscillationFrequency(series: ArrayLike<number>, sampleRate: number): number {
  const n = series.length;
  let m = 0, k = 0;
  for (let i = 0; i < n; i++) if (Number.isFinite(series[i])) (m += series[i]), k++;
  if (k < 4) return NaN;
  m /= k;
  let ss = 0;
  for (let i = 0; i < n; i++) if (Number.isFinite(series[i])) ss += (series[i] - m) ** 2;
  const band = 0.25 * Math.sqrt(ss / k);
  if (!(band > 0)) return NaN;
  let state = 0;
  let crossings = 0;
  let first = -1, last = -1;
  for (let i = 0; i < n; i++) {
    const d = series[i] - m;
    if (!Number.isFinite(d)) continue;
    const s = d > band ? 1 : d < -band ? -1 : 0;
    if (s !== 0 && s !== state) {
      if (state !== 0) {
        crossings++;
        if (first < 0) first = i;
        last = i;
      }
      state = s;
    }
  }
  if (crossings < 4 || last <= first) return NaN;
  return ((crossings - 1) / 2) / ((last - first) / sampleRate);
}
