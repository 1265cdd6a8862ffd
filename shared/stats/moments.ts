import { createMomentAccumulator, type MomentAccumulator } from './moment-accumulator';
import type { Valueof } from './types';

/** Summary of a distribution by its first four moments. */
export interface Moments {
  count: number;
  mean: number;
  /** Population variance ⟨(u−ū)²⟩ (divides by n). */
  variance: number;
  standardDeviation: number;
  /** Population skewness ⟨(u−ū)³⟩/⟨(u−ū)²⟩^{3/2}. */
  skewness: number;
  /** Population (non-excess) kurtosis κ = ⟨(u−ū)⁴⟩/⟨(u−ū)²⟩²; 3 for a Gaussian. */
  kurtosis: number;
}

/**
 * Reads the moments out of a {@link MomentAccumulator}.
 * Rule: mean is NaN for no values; variance and standard deviation are NaN
 * for fewer than two values; skewness and kurtosis are NaN when the variance
 * is zero or there are fewer than two values.
 */
export function momentsFromAccumulator(acc: MomentAccumulator): Moments {
  const n = acc.count;
  const variance = n >= 2 ? acc.m2 / n : NaN;
  const shaped = n >= 2 && acc.m2 > 0;
  return {
    count: n,
    mean: acc.mean,
    variance,
    standardDeviation: Math.sqrt(variance),
    skewness: shaped ? (Math.sqrt(n) * acc.m3) / Math.pow(acc.m2, 1.5) : NaN,
    kurtosis: shaped ? (n * acc.m4) / (acc.m2 * acc.m2) : NaN,
  };
}

/**
 * Mean, population variance, skewness and kurtosis of `values`, in one pass.
 *
 * Method: one-pass central-moment update ("Formulas for robust, one-pass
 * parallel computation of covariances and arbitrary-order statistical
 * moments", Pébay, 2008). Kurtosis as defined in SCIENCE.md,
 * κ = ⟨(u−ū)⁴⟩/⟨(u−ū)²⟩² (Gaussian: 3), as used in "Emergent dynamics of
 * laboratory insect swarms" (Scientific Reports 3, 2013).
 *
 * Units: mean and standard deviation in the units of the values, variance in
 * their square; skewness and kurtosis are dimensionless.
 * Non-finite values (after `valueof`) are skipped. Empty input: count 0 and
 * every other field NaN (see {@link momentsFromAccumulator} for the rule).
 */
export function moments<T = number>(values: ArrayLike<T>, valueof?: Valueof<T>): Moments {
  const acc = createMomentAccumulator();
  const n = values.length;
  if (valueof) for (let i = 0; i < n; i++) acc.add(valueof(values[i], i));
  else for (let i = 0; i < n; i++) acc.add(values[i] as unknown as number);
  return momentsFromAccumulator(acc);
}
