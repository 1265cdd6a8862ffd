import { centroid } from './centroid';
import type { FrameView, Vec3 } from './types';

/**
 * Group size R = sqrt(mean |r_i − r_c|²), the RMS radius (radius of
 * gyration) about the frame's centroid.
 *
 * Method: deviations are taken from the centroid (two passes, no
 * cancellation) as in SCIENCE.md "Centroid and size"; definition as in
 * "Emergent dynamics of laboratory insect swarms" (Scientific Reports 3, 2013).
 * Units: metres. Individuals with non-finite coordinates are skipped.
 * Empty frame: NaN. One individual: 0.
 */
export function radiusOfGyration(frame: FrameView, centre: Vec3 = centroid(frame)): number {
  const { count, dims, x, y, z } = frame;
  let n = 0;
  let s = 0;
  for (let i = 0; i < count; i++) {
    const dx = x[i] - centre.x;
    const dy = y[i] - centre.y;
    const dz = dims === 3 ? z[i] - centre.z : 0;
    const d2 = dx * dx + dy * dy + dz * dz;
    if (!Number.isFinite(d2)) continue;
    n++;
    s += d2;
  }
  return n === 0 ? NaN : Math.sqrt(s / n);
}
