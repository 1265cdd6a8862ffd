import { centroid } from './centroid';
import type { FrameView, Vec3 } from './types';

/**
 * Milling (rotation) order parameter O_R = |Σ (r̂_ic × v̂_i)| / N of one frame,
 * with r̂_ic the unit vector from the centroid to individual i.
 *
 * Method: "Collective states, multistability and transitional behavior in
 * schooling fish" (Tunstrøm et al., PLoS Comput. Biol. 9, 2013). In 2D the
 * cross product is the scalar z-component. N counts individuals with a
 * finite non-zero velocity and a non-zero distance from the centroid.
 * Units: dimensionless, in [0, 1]. Empty frame or no velocities: NaN.
 */
export function milling(frame: FrameView, centre: Vec3 = centroid(frame)): number {
  const { count, dims, x, y, z, vx, vy, vz } = frame;
  if (!vx || !vy || (dims === 3 && !vz)) return NaN;
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sz = 0;
  for (let i = 0; i < count; i++) {
    const rx = x[i] - centre.x;
    const ry = y[i] - centre.y;
    const rz = dims === 3 ? z[i] - centre.z : 0;
    const ux = vx[i];
    const uy = vy[i];
    const uz = dims === 3 ? vz![i] : 0;
    const rn = Math.sqrt(rx * rx + ry * ry + rz * rz);
    const un = Math.sqrt(ux * ux + uy * uy + uz * uz);
    if (!(rn > 0) || !(un > 0) || !Number.isFinite(rn) || !Number.isFinite(un)) continue;
    const k = 1 / (rn * un);
    n++;
    sx += (ry * uz - rz * uy) * k;
    sy += (rz * ux - rx * uz) * k;
    sz += (rx * uy - ry * ux) * k;
  }
  return n === 0 ? NaN : Math.sqrt(sx * sx + sy * sy + sz * sz) / n;
}
