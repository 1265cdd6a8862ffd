import { describe, expect, it } from 'vitest';
import { QuickLookSampler } from './quick-look';
import { decodeQuickLook, decodeQuickLookFrame } from './quick-look-decode';
import type { EmittedFrame } from './frame-statistics';

/** A frame as the pipeline emits it, with only what the sampler reads. */
function frame(n: number, time: number, pts: number[][]): EmittedFrame {
  const col = (a: number) => Float64Array.from(pts, (p) => p[a] ?? NaN);
  return {
    frame: n,
    time,
    view: { count: pts.length, x: col(0), y: col(1), z: col(2) } as unknown as EmittedFrame['view'],
    track: Int32Array.from(pts, (_, i) => i),
    line: Int32Array.from(pts, (_, i) => i + 2),
  };
}

describe('decodeQuickLook(sample)', () => {
  it('decodeQuickLook(sample) returns the sampled 3D positions within half a quantisation step', () => {
    const s = new QuickLookSampler(10, 10, 10, 3);
    const truth: number[][][] = [];
    for (let k = 0; k < 20; k++) {
      const pts = [0, 1, 2].map((i) => [Math.cos(k / 3 + i) * 0.2 - 1.5, Math.sin(k / 5 + i) * 0.1 + 3, 0.01 * k * (i + 1)]);
      truth.push(pts);
      s.add(frame(k, k / 10, pts), ['a', 'b', 'c']);
    }
    const ql = s.result();
    const decoded = decodeQuickLook(ql);
    expect(decoded).toHaveLength(20);
    for (let k = 0; k < 20; k++) {
      expect(decoded[k].t).toBeCloseTo(k / 10, 12);
      expect(decoded[k].ids).toEqual([0, 1, 2]);
      for (let i = 0; i < 3; i++)
        for (let a = 0; a < 3; a++) {
          const span = ql.bounds.max[a] - ql.bounds.min[a];
          // Half a step, plus the 7-significant-digit rounding of the stored bounds.
          const tol = span / 131070 + 1e-6 * Math.max(Math.abs(ql.bounds.min[a]), Math.abs(ql.bounds.max[a]));
          expect(Math.abs(decoded[k].positions[i * 3 + a] - truth[k][i][a])).toBeLessThanOrEqual(tol);
        }
    }
  });

  it('decodeQuickLookFrame(sample, frame) maps 0 and 65535 to the bounds in 2D', () => {
    const out = decodeQuickLookFrame({ dims: 2, bounds: { min: [-1, 2], max: [1, 4] } }, { t: 0.5, ids: [7, 8], q: [0, 65535, 65535, 0] });
    expect(Array.from(out.positions)).toEqual([-1, 4, 1, 2]);
    expect(out.t).toBe(0.5);
  });

  it('decodeQuickLookFrame(sample, frame) decodes an axis with zero span to its minimum', () => {
    const out = decodeQuickLookFrame({ dims: 2, bounds: { min: [0, 5], max: [1, 5] } }, { t: 0, ids: [0], q: [32768, 0] });
    expect(out.positions[1]).toBe(5);
    expect(out.positions[0]).toBeCloseTo(32768 / 65535, 15);
  });

  it('decodeQuickLook(sample) is empty for a sample without frames, and NaN for a missing value', () => {
    expect(decodeQuickLook({ dims: 3, bounds: { min: [0, 0, 0], max: [0, 0, 0] }, frames: [] })).toEqual([]);
    const out = decodeQuickLookFrame({ dims: 2, bounds: { min: [0, 0], max: [1, 1] } }, { t: 0, ids: [0], q: [null as unknown as number, 1] });
    expect(out.positions[0]).toBeNaN();
  });
});
