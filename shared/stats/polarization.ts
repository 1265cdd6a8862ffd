import type { FrameView } from './types';

/**
 * Polarization (Vicsek order parameter) φ = |Σ v_i/|v_i|| / N of one frame.
 *
 * Method: "Novel type of phase transition in a system of self-driven
 * particles" (Vicsek et al., Phys. Rev. Lett. 75, 1995). N counts the
 * individuals with a finite, non-zero velocity; the others are skipped.
 * Units: dimensionless, in [0, 1]. Empty frame (or no velocities): NaN.
 */
export function polarization(frame: FrameView): number {
  const { count, dims, vx, vy, vz } = frame;
  if (!vx || !vy || (dims === 3 && !vz)) return NaN;
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sz = 0;
  for (let i = 0; i < count; i++) {
    const ux = vx[i];
    const uy = vy[i];
    const uz = dims === 3 ? vz![i] : 0;
    const s = Math.sqrt(ux * ux + uy * uy + uz * uz);
    if (!(s > 0) || !Number.isFinite(s)) continue;
    n++;
    sx += ux / s;
    sy += uy / s;
    sz += uz / s;
  }
  return n === 0 ? NaN : Math.sqrt(sx * sx + sy * sy + sz * sz) / n;
}
