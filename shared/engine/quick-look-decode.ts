import type { QuickLook } from './quick-look';

/** One decoded playback frame: positions in metres, `dims` numbers per individual, in the order of `ids`. */
export interface DecodedQuickLookFrame {
  t: number;
  ids: number[];
  positions: Float64Array;
}

const Q_MAX = 65535;

/**
 * Inverse of QuickLookSampler's 16-bit quantisation: v = min + q / 65535 · (max − min)
 * per axis; an axis whose bounds coincide (span ≤ 0) decodes to its minimum.
 * The error is at most half a step, (max − min) / 131070, plus the 7-digit
 * rounding of the stored bounds. Non-finite stored values decode to NaN.
 */
export function decodeQuickLookFrame(ql: Pick<QuickLook, 'dims' | 'bounds'>, frame: QuickLook['frames'][number]): DecodedQuickLookFrame {
  const d = ql.dims;
  const { min, max } = ql.bounds;
  const positions = new Float64Array(frame.q.length);
  for (let i = 0; i < frame.q.length; i++) {
    const a = i % d;
    const span = max[a] - min[a];
    const q = frame.q[i];
    positions[i] = typeof q === 'number' && Number.isFinite(q) ? (span > 0 ? min[a] + (q / Q_MAX) * span : min[a]) : NaN;
  }
  return { t: frame.t, ids: frame.ids, positions };
}

/** Every frame of the sample, decoded (the sample is small: seconds at a low frame rate). */
export function decodeQuickLook(ql: Pick<QuickLook, 'dims' | 'bounds' | 'frames'>): DecodedQuickLookFrame[] {
  return ql.frames.map((f) => decodeQuickLookFrame(ql, f));
}
