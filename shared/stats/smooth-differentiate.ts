import type { DerivativeKernels } from './gaussian-derivative-kernels';

/**
 * Smoothed position, velocity and acceleration of one evenly sampled,
 * gap-free track by convolution with Gaussian kernels.
 *
 * Method: "Experimental Lagrangian acceleration probability density function
 * measurement" (Physica D 193, 2004); kernels from
 * {@link gaussianDerivativeKernels}. Units: the values' unit, per second and
 * per second² for `dt` in seconds. The first and last L samples, and any
 * sample whose window holds a non-finite value, get NaN (SCIENCE.md: L
 * frames are lost at each end; tracks shorter than 2L + 1 frames get none).
 * Empty input: empty arrays.
 */
export function smoothDifferentiate(
  values: ArrayLike<number>,
  dt: number,
  kernels: DerivativeKernels,
): { position: Float64Array; velocity: Float64Array; acceleration: Float64Array } {
  const n = values.length;
  const L = kernels.halfLength;
  const position = new Float64Array(n).fill(NaN);
  const velocity = new Float64Array(n).fill(NaN);
  const acceleration = new Float64Array(n).fill(NaN);
  for (let i = L; i < n - L; i++) {
    let p = 0, v = 0, a = 0;
    for (let j = -L; j <= L; j++) {
      const x = values[i + j];
      p += kernels.smoothing[j + L] * x;
      v += kernels.first[j + L] * x;
      a += kernels.second[j + L] * x;
    }
    if (!Number.isFinite(p + v + a)) continue;
    position[i] = p;
    velocity[i] = v / dt;
    acceleration[i] = a / (dt * dt);
  }
  return { position, velocity, acceleration };
}
