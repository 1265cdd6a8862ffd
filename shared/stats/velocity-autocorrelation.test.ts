import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '../engine/seeded-random';
import { correlationTimes } from './correlation-times';
import { createAutocorrelationAccumulator, velocityAutocorrelation } from './velocity-autocorrelation';

function ouTracks(tracks: number, frames: number, T: number, seed: number) {
  // Exact OU update: v ← v·e^(−Δ/T) + σ·sqrt(1 − e^(−2Δ/T))·ξ ("On the theory of the Brownian motion", Uhlenbeck & Ornstein, Phys. Rev. 36, 1930).
  const rnd = createSeededRandom(seed);
  const c = Math.exp(-1 / T);
  const s = Math.sqrt(1 - c * c);
  return Array.from({ length: tracks }, () => {
    const vx = new Float64Array(frames), vy = new Float64Array(frames), vz = new Float64Array(frames);
    let a = rnd.normal(), b = rnd.normal(), d = rnd.normal();
    for (let i = 0; i < frames; i++) {
      vx[i] = a;
      vy[i] = b;
      vz[i] = d;
      a = a * c + s * rnd.normal();
      b = b * c + s * rnd.normal();
      d = d * c + s * rnd.normal();
    }
    return { vx, vy, vz };
  });
}

describe('velocityAutocorrelation(tracks, maxLag, originStride?)', () => {
  it('gives ρ(τ) = exp(−τ/T) for an Ornstein–Uhlenbeck velocity', () => {
    // Source: SCIENCE.md check value. 150 tracks × 400 frames, T = 8 frames: ~3.7k independent
    // stretches per component → SE ≈ 0.01; tolerance 0.05.
    const T = 8;
    const rho = velocityAutocorrelation(ouTracks(150, 400, T, 4), 30);
    expect(rho[0]).toBe(1);
    for (const lag of [1, 4, 8, 16, 24]) expect(Math.abs(rho[lag] - Math.exp(-lag / T))).toBeLessThan(0.05);
    const times = correlationTimes(rho, 0.01);
    expect(times.eFoldingTime).toBeCloseTo(0.08, 2);
  });
  it('agrees with every-origin estimates when origins are strided', () => {
    // Source: derived (a subset of origins estimates the same ρ); tolerance 0.06.
    const tracks = ouTracks(100, 300, 6, 5);
    const a = velocityAutocorrelation(tracks, 20, 1);
    const b = velocityAutocorrelation(tracks, 20, 7);
    for (let l = 0; l <= 20; l += 5) expect(Math.abs(a[l] - b[l])).toBeLessThan(0.06);
  });
  it('returns NaN for empty input and skips NaN samples', () => {
    expect(velocityAutocorrelation([], 3)[0]).toBeNaN();
    const rho = velocityAutocorrelation([{ vx: [1, NaN, 1], vy: [0, 0, 0] }], 2);
    expect(rho[0]).toBe(1);
    expect(rho[1]).toBeNaN();
    expect(rho[2]).toBe(1);
  });
  it('frees ring buffers of finished tracks (createAutocorrelationAccumulator)', () => {
    const acc = createAutocorrelationAccumulator(5);
    acc.add(1, 0, 1, 0, 0);
    acc.add(2, 10, 1, 0, 0);
    acc.evictBefore(5);
    expect(acc.activeTracks).toBe(1);
  });
});

describe('createAutocorrelationAccumulator(maxLag, originStride).addFrame(frame, track, vx, vy, vz, count)', () => {
  it('gives the same sums as add() row by row, with gaps and NaN samples', () => {
    // Source: derived (same estimator, summation reordered): pair counts exact, ρ within 1e-12.
    const tracks = ouTracks(12, 120, 5, 9);
    const a = createAutocorrelationAccumulator(17, 3), b = createAutocorrelationAccumulator(17, 3);
    for (let f = 0; f < 120; f++) {
      const ids: number[] = [], x: number[] = [], y: number[] = [], z: number[] = [];
      tracks.forEach((t, k) => {
        if ((f + k) % 23 === 0) return;
        const vx = (f * k) % 31 === 5 ? NaN : t.vx[f];
        a.add(k, f, vx, t.vy[f], t.vz[f]);
        ids.push(k), x.push(vx), y.push(t.vy[f]), z.push(t.vz[f]);
      });
      b.addFrame(f, ids, x, y, z, ids.length);
    }
    expect(Array.from(b.result().pairs)).toEqual(Array.from(a.result().pairs));
    const ra = a.result().rho, rb = b.result().rho;
    for (let l = 0; l < ra.length; l++) expect(Math.abs(rb[l] - ra[l])).toBeLessThan(1e-12);
  });
});

describe('correlationTimes(rho, lagStep)', () => {
  it('interpolates the first zero crossing of cos and the 1/e time of exp', () => {
    // Source: derived: cos(2πτ/P) first crosses zero at P/4; exp(−τ/T) reaches 1/e at T.
    const lag = 0.01;
    const cos = Float64Array.from({ length: 200 }, (_, i) => Math.cos((2 * Math.PI * i * lag) / 1.2));
    expect(correlationTimes(cos, lag).firstZeroCrossing).toBeCloseTo(0.3, 3);
    const ex = Float64Array.from({ length: 200 }, (_, i) => Math.exp((-i * lag) / 0.37));
    expect(correlationTimes(ex, lag).eFoldingTime).toBeCloseTo(0.37, 3);
    expect(correlationTimes(ex, lag).firstZeroCrossing).toBeNaN();
    expect(correlationTimes([], lag).eFoldingTime).toBeNaN();
  });
});

describe('createAutocorrelationAccumulator: windows, long gaps and reading the result early', () => {
  /** Reference: every pair (origin on the stride, later sample of the same track within maxLag), summed directly. */
  function direct(samples: Map<number, Map<number, [number, number, number]>>, maxLag: number, stride: number) {
    const sums = new Float64Array(maxLag + 1), pairs = new Float64Array(maxLag + 1);
    for (const track of samples.values())
      for (const [f, a] of track) {
        if (((f % stride) + stride) % stride !== 0) continue;
        for (let l = 0; l <= maxLag; l++) {
          const b = track.get(f + l);
          if (!b) continue;
          sums[l] += a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
          pairs[l]++;
        }
      }
    return { rho: Array.from(sums, (s, l) => (pairs[l] > 0 ? s / pairs[l] / (sums[0] / pairs[0]) : NaN)), pairs: Array.from(pairs) };
  }

  it('agrees with the direct sum over pairs for tracks with short and long gaps, ends and restarts', () => {
    // Source: derived (the estimator's definition, summed pair by pair); gaps of 1 frame, of more than the
    // window (2 maxLag + 1 frames) and tracks ending early exercise every path of the windows.
    const rnd = createSeededRandom(77);
    const maxLag = 12, stride = 3;
    const acc = createAutocorrelationAccumulator(maxLag, stride);
    const samples = new Map<number, Map<number, [number, number, number]>>();
    const gapAt = (k: number, f: number) => (k === 1 && f >= 40 && f < 41) || (k === 2 && f >= 30 && f < 95) || (k === 3 && f > 70) || (k === 4 && f < 20);
    for (let f = 0; f < 200; f++) {
      const ids: number[] = [], x: number[] = [], y: number[] = [], z: number[] = [];
      for (let k = 0; k < 6; k++) {
        if (gapAt(k, f)) continue;
        const v: [number, number, number] = [rnd.normal(), rnd.normal(), rnd.normal()];
        if (!samples.has(k)) samples.set(k, new Map());
        samples.get(k)!.set(f, v);
        ids.push(k), x.push(v[0]), y.push(v[1]), z.push(v[2]);
      }
      acc.addFrame(f, ids, x, y, z, ids.length);
      if (f === 120) acc.evictBefore(100); // track 3 ended at frame 70: its ring is freed, its products kept
    }
    const ref = direct(samples, maxLag, stride);
    const got = acc.result();
    expect(Array.from(got.pairs)).toEqual(ref.pairs);
    for (let l = 0; l <= maxLag; l++) expect(Math.abs(got.rho[l] - ref.rho[l])).toBeLessThan(1e-12);
  });

  it('gives the same result when read twice, and goes on after an early read', () => {
    // Source: derived (result() adds the pending origins to copies, not to the running sums).
    const tracks = ouTracks(5, 90, 4, 12);
    const a = createAutocorrelationAccumulator(10, 2), b = createAutocorrelationAccumulator(10, 2);
    for (let f = 0; f < 90; f++)
      tracks.forEach((t, k) => {
        a.add(k, f, t.vx[f], t.vy[f], t.vz[f]);
        b.add(k, f, t.vx[f], t.vy[f], t.vz[f]);
        if (f === 45 && k === 4) b.result(); // read half way
      });
    expect(Array.from(a.result().pairs)).toEqual(Array.from(b.result().pairs));
    expect(Array.from(a.result().rho)).toEqual(Array.from(b.result().rho));
    expect(Array.from(a.result().rho)).toEqual(Array.from(a.result().rho));
  });
});
