/**
 * Expected polarization E[φ] of N independent, uniformly random headings:
 * sqrt(8/(3πN)) in 3D and sqrt(π/(4N)) in 2D — the baseline against which a
 * measured polarization near 0 is judged.
 *
 * Method: derived (SCIENCE.md): Σ of N unit vectors is near-Gaussian with
 * variance N/d per axis, so |Σ| follows a Maxwell (3D) or Rayleigh (2D) law
 * with means sqrt(8N/(3π)) and sqrt(πN/4); divide by N. Exact only as N → ∞.
 * Units: dimensionless. N < 1: NaN.
 */
export function randomHeadingPolarization(n: number, dims: 2 | 3): number {
  if (!(n >= 1)) return NaN;
  return dims === 3 ? Math.sqrt(8 / (3 * Math.PI * n)) : Math.sqrt(Math.PI / (4 * n));
}
