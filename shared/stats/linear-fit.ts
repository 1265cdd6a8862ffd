/** Result of a least-squares straight-line fit y ≈ slope·x + intercept. */
export interface LinearFit {
  /** Number of points used (finite x, y and positive weight). */
  count: number;
  slope: number;
  /** 0 for a fit through the origin. */
  intercept: number;
  /** Standard error of the slope from the residual variance. */
  slopeStandardError: number;
  /** Standard error of the intercept (NaN for a fit through the origin). */
  interceptStandardError: number;
  /**
   * Coefficient of determination. With an intercept: 1 − SS_res/SS_tot about
   * the mean; through the origin: the uncentred form 1 − SS_res/Σw·y².
   */
  rSquared: number;
}

export interface LinearFitOptions {
  /** Fit y = slope·x (no intercept). Default false. */
  throughOrigin?: boolean;
  /** Optional non-negative weights (e.g. bin counts). */
  weights?: ArrayLike<number>;
}

/**
 * Weighted ordinary least squares of y on x, with or without intercept.
 *
 * Method: closed-form normal equations on centred sums (centring avoids the
 * cancellation of Σx² − (Σx)²/n); standard errors from the residual variance
 * with n − p degrees of freedom (p = 1 or 2) [common practice]; the uncentred
 * R² for regression through the origin follows "Regression through the
 * origin" (Eisenhauer, Teaching Statistics 25, 2003) [memory].
 * Units: slope in y-units per x-unit, intercept in y-units.
 * Points with a non-finite x, y or weight, or weight ≤ 0, are skipped.
 * Empty or degenerate input (fewer than p points, or all x equal): every
 * estimate NaN; standard errors NaN when n ≤ p.
 */
export function linearFit(x: ArrayLike<number>, y: ArrayLike<number>, options: LinearFitOptions = {}): LinearFit {
  const { throughOrigin = false, weights } = options;
  const n = Math.min(x.length, y.length);
  let count = 0;
  let sw = 0;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i]) || !(w > 0) || !Number.isFinite(w)) continue;
    count++;
    sw += w;
    sx += w * x[i];
    sy += w * y[i];
  }
  const p = throughOrigin ? 1 : 2;
  const nan: LinearFit = {
    count,
    slope: NaN,
    intercept: throughOrigin ? 0 : NaN,
    slopeStandardError: NaN,
    interceptStandardError: NaN,
    rSquared: NaN,
  };
  if (count < p) return nan;
  const mx = throughOrigin ? 0 : sx / sw;
  const my = throughOrigin ? 0 : sy / sw;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i]) || !(w > 0) || !Number.isFinite(w)) continue;
    const dx = x[i] - mx;
    const dy = y[i] - my;
    sxx += w * dx * dx;
    sxy += w * dx * dy;
    syy += w * dy * dy;
  }
  if (!(sxx > 0)) return nan;
  const slope = sxy / sxx;
  const intercept = throughOrigin ? 0 : my - slope * mx;
  let ssRes = 0;
  for (let i = 0; i < n; i++) {
    const w = weights ? weights[i] : 1;
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i]) || !(w > 0) || !Number.isFinite(w)) continue;
    const r = y[i] - intercept - slope * x[i];
    ssRes += w * r * r;
  }
  // Weights are inverse variances up to a common scale (e.g. bin counts for bin means).
  const dof = count - p;
  const sigma2 = dof > 0 ? ssRes / dof : NaN;
  const slopeStandardError = Math.sqrt(sigma2 / sxx);
  const interceptStandardError = throughOrigin ? NaN : Math.sqrt(sigma2 * (1 / sw + (mx * mx) / sxx));
  return {
    count,
    slope,
    intercept,
    slopeStandardError,
    interceptStandardError,
    rSquared: syy > 0 ? 1 - ssRes / syy : NaN,
  };
}
