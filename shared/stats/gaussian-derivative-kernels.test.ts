import { describe, expect, it } from 'vitest';
import { gaussianDerivativeKernels } from './gaussian-derivative-kernels';
import { smoothDifferentiate } from './smooth-differentiate';

describe('gaussianDerivativeKernels(width, halfLength)', () => {
  const k = gaussianDerivativeKernels(1.5, 5);
  it('has a unit-sum smoothing kernel and moment conditions of the derivative kernels', () => {
    // Source: derived (SCIENCE.md: normalisation exact for linear / quadratic signals; Physica D 193, 2004).
    const sum = (f: (j: number, c: number) => number, a: Float64Array) => a.reduce((s, c, i) => s + f(i - 5, c), 0);
    expect(sum((_, c) => c, k.smoothing)).toBeCloseTo(1, 14);
    expect(sum((_, c) => c, k.first)).toBeCloseTo(0, 14);
    expect(sum((j, c) => c * j, k.first)).toBeCloseTo(1, 14);
    expect(sum((_, c) => c, k.second)).toBeCloseTo(0, 14);
    expect(sum((j, c) => c * j, k.second)).toBeCloseTo(0, 14);
    expect(sum((j, c) => c * j * j, k.second)).toBeCloseTo(2, 13);
  });
  it('returns NaN kernels for a non-positive width or L < 1', () => {
    expect(gaussianDerivativeKernels(0, 3).first[0]).toBeNaN();
    expect(gaussianDerivativeKernels(1, 0).smoothing[0]).toBeNaN();
  });
});

describe('smoothDifferentiate(values, dt, kernels)', () => {
  const k = gaussianDerivativeKernels(1.5, 5);
  const dt = 0.01;
  it('is exact on polynomial test signals (velocity up to quadratic, acceleration up to cubic)', () => {
    // Source: derived from the moment conditions; x(t) = 2 − 3t + 40t² + 7t³ with t = i·dt.
    const n = 60;
    const quad = Float64Array.from({ length: n }, (_, i) => 2 - 3 * i * dt + 40 * (i * dt) ** 2);
    const cubic = Float64Array.from({ length: n }, (_, i) => 2 - 3 * i * dt + 40 * (i * dt) ** 2 + 7 * (i * dt) ** 3);
    const q = smoothDifferentiate(quad, dt, k);
    const c = smoothDifferentiate(cubic, dt, k);
    for (let i = 5; i < n - 5; i++) {
      const t = i * dt;
      expect(q.velocity[i]).toBeCloseTo(-3 + 80 * t, 9);
      expect(c.acceleration[i]).toBeCloseTo(80 + 42 * t, 7);
    }
    const lin = smoothDifferentiate(Float64Array.from({ length: n }, (_, i) => 1 + 2 * i), dt, k);
    expect(lin.position[10]).toBeCloseTo(21, 12);
  });
  it('loses L frames at each end and gives nothing for tracks shorter than 2L + 1', () => {
    // Source: SCIENCE.md (kinematics).
    const r = smoothDifferentiate(Float64Array.from({ length: 20 }, (_, i) => i), dt, k);
    expect(r.velocity[4]).toBeNaN();
    expect(r.velocity[5]).toBeCloseTo(100, 9);
    expect(r.velocity[15]).toBeNaN();
    expect(smoothDifferentiate(new Float64Array(10), dt, k).velocity.every(Number.isNaN)).toBe(true);
    expect(smoothDifferentiate([], dt, k).velocity.length).toBe(0);
  });
  it('gives NaN where the window holds a NaN', () => {
    const v = Float64Array.from({ length: 30 }, (_, i) => i);
    v[15] = NaN;
    const r = smoothDifferentiate(v, dt, k);
    expect(r.velocity[12]).toBeNaN();
    expect(r.velocity[9]).toBeCloseTo(100, 9);
  });
});
