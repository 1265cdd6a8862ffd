/** Γ(4/3), for the 3D ideal-gas nearest-neighbour mean. */
const GAMMA_4_3 = 0.8929795115692492;

/**
 * Mean nearest-neighbour distance ⟨d⟩ of an ideal gas (Poisson points) of
 * number density n: Γ(4/3)(4πn/3)^(−1/3) ≈ 0.554 n^(−1/3) in 3D and
 * 1/(2√n) in 2D.
 *
 * Method: derived — P(d > r) = exp(−n·V(r)) with V the ball volume
 * (SCIENCE.md, nearest-neighbour check value; the 2D form by the same
 * derivation with V = πr²). Γ(4/3) = 0.8929795115692492 [memory, checked
 * numerically in the test]. Units: metres for n in m⁻³ (m⁻² in 2D).
 * n ≤ 0 or non-finite: NaN.
 */
export function idealGasNearestNeighbourDistance(density: number, dims: 2 | 3): number {
  if (!(density > 0) || !Number.isFinite(density)) return NaN;
  return dims === 3 ? GAMMA_4_3 * Math.pow((4 * Math.PI * density) / 3, -1 / 3) : 1 / (2 * Math.sqrt(density));
}
