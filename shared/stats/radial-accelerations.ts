import { centroid } from './centroid';
import type { FrameView, Vec3 } from './types';

/**
 * Distance from the centroid and radial acceleration
 * a_r = a_i·(r_i − r_c)/|r_i − r_c| of every individual of one frame.
 *
 * Method: SCIENCE.md "Effective spring constant"; as in "Emergent dynamics
 * of laboratory insect swarms" (Scientific Reports 3, 2013). Units: metres
 * and m/s². Individuals without a finite acceleration or at the centroid get
 * NaN. Empty frame: empty arrays.
 */
export function radialAccelerations(
  frame: FrameView,
  centre: Vec3 = centroid(frame),
): { distance: Float64Array; radialAcceleration: Float64Array } {
  const { count, dims, x, y, z, ax, ay, az } = frame;
  const distance = new Float64Array(count);
  const radialAcceleration = new Float64Array(count).fill(NaN);
  for (let i = 0; i < count; i++) {
    const dx = x[i] - centre.x, dy = y[i] - centre.y, dz = dims === 3 ? z[i] - centre.z : 0;
    const r = Math.sqrt(dx * dx + dy * dy + dz * dz);
    distance[i] = r;
    if (!ax || !ay || !(r > 0)) continue;
    const azi = dims === 3 ? (az ? az[i] : NaN) : 0;
    radialAcceleration[i] = (ax[i] * dx + ay[i] * dy + azi * dz) / r;
  }
  return { distance, radialAcceleration };
}
