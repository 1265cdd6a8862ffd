import { linearFit } from './linear-fit';

export interface SpringConstantFit {
  /** Fit ⟨a_r⟩ = −K r. */
  throughOrigin: { springConstant: number; standardError: number; rSquared: number };
  /** Fit ⟨a_r⟩ = −K r + c. */
  withIntercept: { springConstant: number; intercept: number; standardError: number; rSquared: number };
  /** Bins that entered the fit. */
  binsUsed: number;
}

/**
 * Effective spring constant K from binned mean radial acceleration versus
 * distance from the centroid, fitted as ⟨a_r⟩ = −K r by least squares, with
 * and without intercept, each bin weighted by its number of samples (a bin
 * mean's variance falls as 1/count).
 *
 * Method: "Emergent dynamics of laboratory insect swarms" (Scientific
 * Reports 3, 2013), SCIENCE.md; weighted least squares via
 * {@link linearFit}. Check value: a harmonic trap a = −k r gives K = k.
 * Units: K in s⁻², intercept in m/s². Bins with fewer than `minCount`
 * samples or non-finite means are skipped; fewer than 2 bins: NaN.
 */
export function springConstantFit(
  distance: ArrayLike<number>,
  meanRadialAcceleration: ArrayLike<number>,
  counts: ArrayLike<number>,
  minCount = 10,
): SpringConstantFit {
  const w = new Float64Array(counts.length);
  let used = 0;
  for (let i = 0; i < counts.length; i++) {
    w[i] = counts[i] >= minCount && Number.isFinite(meanRadialAcceleration[i]) ? counts[i] : 0;
    if (w[i] > 0) used++;
  }
  const origin = used >= 2 ? linearFit(distance, meanRadialAcceleration, { weights: w, throughOrigin: true }) : undefined;
  const free = used >= 2 ? linearFit(distance, meanRadialAcceleration, { weights: w }) : undefined;
  return {
    throughOrigin: {
      springConstant: origin ? -origin.slope : NaN,
      standardError: origin ? origin.slopeStandardError : NaN,
      rSquared: origin ? origin.rSquared : NaN,
    },
    withIntercept: {
      springConstant: free ? -free.slope : NaN,
      intercept: free ? free.intercept : NaN,
      standardError: free ? free.slopeStandardError : NaN,
      rSquared: free ? free.rSquared : NaN,
    },
    binsUsed: used,
  };
}
