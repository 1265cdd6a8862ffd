import tQuantile from '@stdlib/stats-base-dists-t-quantile';
import { linearFit } from './linear-fit';

/** Result of fitting y = a·x^b. */
export interface PowerLawFit {
  /** Number of points used (both coordinates finite and positive). */
  count: number;
  /** Prefactor a, in y-units per (x-unit)^b. */
  prefactor: number;
  /** Exponent b (unit-free). */
  exponent: number;
  /** Standard error of b from the residual variance on the log-log scale. */
  exponentStandardError: number;
  /** Two-sided confidence interval of b at `level`, from the Student t quantile with n − 2 degrees of freedom. */
  exponentInterval: [number, number];
  /** Confidence level of the interval (default 0.95). */
  level: number;
  /** R² of the straight-line fit of ln y on ln x. */
  rSquared: number;
}

/**
 * Power law y = a·x^b fitted by ordinary least squares of ln y on ln x.
 *
 * Method: ln y = ln a + b·ln x by OLS (`linearFit`); the confidence interval of
 * b is b ± t(1 − (1 − level)/2, n − 2)·SE(b) [common practice, e.g. "Power-law
 * distributions in empirical data", SIAM Review 51 (2009) for its caveats: the
 * errors are assumed log-normal and equal in variance].
 * Units: b is unit-free; a is in y-units per (x-unit)^b.
 * Points with a non-finite or non-positive x or y are skipped (no logarithm).
 * Fewer than two points, or all x equal: every estimate NaN; fewer than three
 * points: the interval is [NaN, NaN] (no residual degrees of freedom).
 */
export function powerLawFit(x: ArrayLike<number>, y: ArrayLike<number>, level = 0.95): PowerLawFit {
  const n = Math.min(x.length, y.length);
  const lx: number[] = [];
  const ly: number[] = [];
  for (let i = 0; i < n; i++) {
    if (x[i] > 0 && y[i] > 0 && Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      lx.push(Math.log(x[i]));
      ly.push(Math.log(y[i]));
    }
  }
  const f = linearFit(lx, ly);
  const dof = lx.length - 2;
  const t = dof > 0 ? tQuantile(1 - (1 - level) / 2, dof) : NaN;
  const half = t * f.slopeStandardError;
  return {
    count: lx.length,
    prefactor: Math.exp(f.intercept),
    exponent: f.slope,
    exponentStandardError: f.slopeStandardError,
    exponentInterval: Number.isFinite(half) ? [f.slope - half, f.slope + half] : [NaN, NaN],
    level,
    rSquared: f.rSquared,
  };
}
