/**
 * Characteristic times of a correlation function sampled every `lagStep`
 * seconds: the first zero crossing and the 1/e (e-folding) time.
 *
 * Method: first lag where ρ ≤ 0 (resp. ρ ≤ 1/e), linearly interpolated with
 * the previous lag [common practice]; SCIENCE.md asks for both.
 * Units: seconds (the unit of lagStep). Not reached within the lags, or
 * empty input: NaN.
 */
export function correlationTimes(rho: ArrayLike<number>, lagStep: number): { firstZeroCrossing: number; eFoldingTime: number } {
  return { firstZeroCrossing: firstBelow(rho, 0) * lagStep, eFoldingTime: firstBelow(rho, 1 / Math.E) * lagStep };
}

function firstBelow(rho: ArrayLike<number>, level: number): number {
  let prev = NaN;
  for (let i = 0; i < rho.length; i++) {
    const r = rho[i];
    if (!Number.isFinite(r)) continue;
    if (r <= level) {
      if (i === 0 || !Number.isFinite(prev)) return i;
      return i - 1 + (prev - level) / (prev - r);
    }
    prev = r;
  }
  return NaN;
}
