import { describe, expect, it } from 'vitest';
import { milling } from './milling';
import { frameOf } from './test-support';

const ring = (n: number, omega: number, drift: readonly number[] = [0, 0, 0]) => {
  const r: number[][] = [];
  const v: number[][] = [];
  for (let i = 0; i < n; i++) {
    const a = (2 * Math.PI * i) / n;
    r.push([3 + Math.cos(a), -2 + Math.sin(a), 1]);
    v.push([-omega * Math.sin(a) + drift[0], omega * Math.cos(a) + drift[1], drift[2]]);
  }
  return { r, v };
};

describe('milling(frame, centre?)', () => {
  it('is 1 for a ring rotating rigidly (3D and 2D)', () => {
    // Source: Tunstrøm et al., PLoS Comput. Biol. 9 (2013): O_R = 1 for a perfect mill.
    const { r, v } = ring(24, 2);
    expect(milling(frameOf(3, r, v))).toBeCloseTo(1, 12);
    expect(milling(frameOf(2, r, v))).toBeCloseTo(1, 12);
  });
  it('is about 0 for a translating flock', () => {
    // Source: same paper: O_R ≈ 0 for a polarized, translating group.
    const { r } = ring(24, 0);
    const v = r.map(() => [1, 0.5, 0]);
    expect(milling(frameOf(3, r, v))).toBeCloseTo(0, 12);
  });
  it('is NaN for an empty frame or without velocities', () => {
    expect(milling(frameOf(3, []))).toBeNaN();
    expect(milling(frameOf(3, [[0, 0, 0], [1, 1, 1]]))).toBeNaN();
  });
});
