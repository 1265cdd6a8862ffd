import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { oscillationFrequency } from './oscillation-frequency';
import { transientPairs } from './transient-pairs';

describe('transientPairs(frames, options)', () => {
  it('finds planted orbiting pairs with the right members and durations, and no false pairs', () => {
    // Source: SCIENCE.md "Transient pairs" (Phys. Rev. Lett. 114, 2015). Derived scenario: 30 individuals on
    // a 1 m lattice; tracks 3 and 17 orbit each other (radius 0.04 m, 2.5 Hz) for frames 100–349, 8 and 9
    // for frames 500–549 (0.5 s, shorter than τ* = 1 s: not a pair); d* = 0.2 m.
    const fps = 100;
    const rnd = createSeededRandom(12);
    const home = Array.from({ length: 30 }, (_, i) => [i % 5, Math.floor(i / 5) % 3, Math.floor(i / 15)]);
    const frames = [];
    for (let f = 0; f < 700; f++) {
      const ids: number[] = [], x: number[] = [], y: number[] = [], z: number[] = [];
      home.forEach((h, i) => {
        let p = h.map((c) => c + 0.01 * rnd.normal());
        const orbit = (centre: number[], sign: number) => {
          const a = (2 * Math.PI * 2.5 * f) / fps;
          const r = 0.04 + 0.01 * Math.sin((2 * Math.PI * 4 * f) / fps);
          return [centre[0] + sign * r * Math.cos(a), centre[1] + sign * r * Math.sin(a), centre[2]];
        };
        if ((i === 3 || i === 17) && f >= 100 && f < 350) p = orbit([10, 10, 10], i === 3 ? 1 : -1);
        if ((i === 8 || i === 9) && f >= 500 && f < 550) p = orbit([20, 20, 20], i === 8 ? 1 : -1);
        ids.push(i);
        x.push(p[0]);
        y.push(p[1]);
        z.push(p[2]);
      });
      frames.push({ frame: f, ids, x, y, z });
    }
    const events = transientPairs(frames, { maxDistance: 0.2, minDurationFrames: 100, fps });
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ a: 3, b: 17, startFrame: 100, endFrame: 349 });
    // Separation 2r oscillates at 4 Hz (derived from the planted r(t)).
    expect(events[0].oscillationFrequency).toBeCloseTo(4, 0);
    expect(events[0].meanSeparation).toBeCloseTo(0.08, 2);
  });
  it('returns no events for no frames', () => {
    expect(transientPairs([], { maxDistance: 1, minDurationFrames: 2, fps: 10 })).toEqual([]);
  });
});

describe('oscillationFrequency(series, sampleRate)', () => {
  it('recovers the frequency of a noisy sinusoid and is NaN for a constant or short series', () => {
    // Source: derived (two mean crossings per period).
    const rnd = createSeededRandom(2);
    const s = Float64Array.from({ length: 500 }, (_, i) => 1 + Math.sin((2 * Math.PI * 3 * i) / 100) + 0.05 * rnd.normal());
    expect(oscillationFrequency(s, 100)).toBeCloseTo(3, 1);
    expect(oscillationFrequency(new Float64Array(50).fill(2), 100)).toBeNaN();
    expect(oscillationFrequency([1, 2], 100)).toBeNaN();
  });
});
