import { describe, expect, it } from 'vitest';
import { centroid } from './centroid';
import { radiusOfGyration } from './radius-of-gyration';
import { frameOf } from './test-support';

describe('centroid(frame)', () => {
  it('is the mean position and skips non-finite coordinates', () => {
    const c = centroid(frameOf(3, [[0, 0, 0], [2, 4, 6], [NaN, 1, 1]]));
    expect(c).toEqual({ x: 1, y: 2, z: 3 });
  });
  it('is NaN for an empty frame and has z = 0 in 2D', () => {
    expect(centroid(frameOf(3, [])).x).toBeNaN();
    expect(centroid(frameOf(2, [[1, 1], [3, 3]])).z).toBe(0);
  });
  it('keeps precision for large coordinates', () => {
    expect(centroid(frameOf(2, [[1e9 + 1, 0], [1e9 + 3, 0]])).x).toBe(1e9 + 2);
  });
});

describe('radiusOfGyration(frame, centre?)', () => {
  it('is the RMS distance from the centroid', () => {
    // derived: square of side 2 centred at the origin has R = sqrt(2).
    expect(radiusOfGyration(frameOf(2, [[1, 1], [-1, 1], [-1, -1], [1, -1]]))).toBeCloseTo(Math.SQRT2, 14);
  });
  it('is 0 for one individual and NaN for none', () => {
    expect(radiusOfGyration(frameOf(3, [[5, 5, 5]]))).toBe(0);
    expect(radiusOfGyration(frameOf(3, []))).toBeNaN();
  });
  it('does not lose precision far from the origin', () => {
    expect(radiusOfGyration(frameOf(2, [[1e8 + 1, 1e8], [1e8 - 1, 1e8]]))).toBeCloseTo(1, 8);
  });
});
