import type { FrameView, Vec3 } from './types';

/**
 * Centroid r_c = mean of the positions r_i of one frame.
 *
 * Method: arithmetic mean per axis (SCIENCE.md, "Centroid and size").
 * Units: metres. Individuals with a non-finite coordinate are skipped.
 * Empty frame: `{ x: NaN, y: NaN, z: NaN }`. In 2D, z is 0.
 */
export function centroid(frame: FrameView): Vec3 {
  const { count, dims, x, y, z } = frame;
  let n = 0;
  let sx = 0;
  let sy = 0;
  let sz = 0;
  for (let i = 0; i < count; i++) {
    const zi = dims === 3 ? z[i] : 0;
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i]) || !Number.isFinite(zi)) continue;
    n++;
    sx += x[i];
    sy += y[i];
    sz += zi;
  }
  if (n === 0) return { x: NaN, y: NaN, z: NaN };
  return { x: sx / n, y: sy / n, z: sz / n };
}
