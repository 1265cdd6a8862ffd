/** Discrete smoothing and differentiating kernels, index j + L for offset j ∈ [−L, L]. */
export interface DerivativeKernels {
  width: number;
  halfLength: number;
  /** Σ = 1: exact on constant and linear signals. */
  smoothing: Float64Array;
  /** Estimate of dx/dj: exact on polynomials up to degree 2. */
  first: Float64Array;
  /** Estimate of d²x/dj²: exact on polynomials up to degree 3. */
  second: Float64Array;
}

/**
 * Gaussian smoothing-differentiating kernels g(j) = exp(−j²/w²) truncated at
 * ±L frames, for position, velocity and acceleration estimates by
 * convolution: x̂(t) = Σ_j k(j) x(t + j).
 *
 * Method: "Experimental Lagrangian acceleration probability density function
 * measurement" (Mordant, Crawford & Bodenschatz, Physica D 193, 2004), with
 * the truncated kernels renormalised so that the velocity kernel j·g(j) is
 * exact for linear (indeed quadratic) signals and the acceleration kernel
 * (j² − β)·g(j) is exact for quadratic (indeed cubic) signals (derived:
 * moment conditions Σk = 0, Σk·j = 1, resp. Σk = 0, Σk·j² = 2). The form
 * exp(−j²/w²) follows the paper [memory].
 * Units: per frame and per frame² — divide by Δt and Δt². Invalid width or
 * L < 1: kernels of NaN.
 */
export function gaussianDerivativeKernels(width: number, halfLength: number): DerivativeKernels {
  const L = Math.floor(halfLength);
  const n = 2 * L + 1;
  const smoothing = new Float64Array(n);
  const first = new Float64Array(n);
  const second = new Float64Array(n);
  if (!(width > 0) || !(L >= 1)) {
    smoothing.fill(NaN);
    first.fill(NaN);
    second.fill(NaN);
    return { width, halfLength: L, smoothing, first, second };
  }
  const g = new Float64Array(n);
  let s0 = 0, s2 = 0;
  for (let j = -L; j <= L; j++) {
    g[j + L] = Math.exp(-(j * j) / (width * width));
    s0 += g[j + L];
    s2 += j * j * g[j + L];
  }
  const beta = s2 / s0;
  let d2 = 0;
  for (let j = -L; j <= L; j++) d2 += (j * j - beta) * j * j * g[j + L];
  for (let j = -L; j <= L; j++) {
    smoothing[j + L] = g[j + L] / s0;
    first[j + L] = (j * g[j + L]) / s2;
    second[j + L] = (2 * (j * j - beta) * g[j + L]) / d2;
  }
  return { width, halfLength: L, smoothing, first, second };
}
