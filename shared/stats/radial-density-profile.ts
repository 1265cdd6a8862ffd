import { centroid } from './centroid';
import type { FrameView, Vec3 } from './types';

export interface RadialDensityProfile {
  /** Bin edges in metres (bins + 1). */
  edges: Float64Array;
  /** Individuals per shell. */
  counts: Float64Array;
  /** Individuals per shell volume (m⁻³ in 3D, m⁻² in 2D). */
  density: Float64Array;
}

/**
 * Shell volume between radii r0 < r1: (4π/3)(r1³ − r0³) in 3D, π(r1² − r0²)
 * in 2D — the exact form of 4πr²Δr / 2πrΔr (SCIENCE.md).
 */
export function shellVolume(r0: number, r1: number, dims: 2 | 3): number {
  return dims === 3 ? ((4 * Math.PI) / 3) * (r1 * r1 * r1 - r0 * r0 * r0) : Math.PI * (r1 * r1 - r0 * r0);
}

/**
 * Radial density profile n(r) of one frame around its centroid: individuals
 * per shell volume in `bins` shells of width `binWidth`.
 *
 * Method: SCIENCE.md "Radial density profile" (exact shell volumes, see
 * {@link shellVolume}); averaging over frames is done by the caller by
 * summing counts. Units: edges in metres, density in m⁻³ (3D) or m⁻² (2D).
 * Individuals beyond the last edge or with non-finite positions are not
 * counted. Empty frame: zero counts.
 */
export function radialDensityProfile(
  frame: FrameView,
  options: { binWidth: number; bins: number },
  centre: Vec3 = centroid(frame),
): RadialDensityProfile {
  const bins = Math.max(0, Math.floor(options.bins));
  const w = options.binWidth;
  const edges = new Float64Array(bins + 1);
  for (let i = 0; i <= bins; i++) edges[i] = i * w;
  const counts = new Float64Array(bins);
  const { count, dims, x, y, z } = frame;
  if (w > 0)
    for (let i = 0; i < count; i++) {
      const dx = x[i] - centre.x, dy = y[i] - centre.y, dz = dims === 3 ? z[i] - centre.z : 0;
      const r = Math.sqrt(dx * dx + dy * dy + dz * dz);
      if (!Number.isFinite(r)) continue;
      const k = Math.floor(r / w);
      if (k < bins) counts[k]++;
    }
  const density = new Float64Array(bins);
  for (let i = 0; i < bins; i++) density[i] = counts[i] / shellVolume(edges[i], edges[i + 1], frame.dims);
  return { edges, counts, density };
}
