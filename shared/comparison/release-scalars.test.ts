import { describe, expect, it } from 'vitest';
import { pickRepresentativeFile, releaseCurves, releaseScalars } from './release-scalars';

const doc = (frames: number, dims: 2 | 3) => ({
  parameters: { dims, fps: 50, units: 'mm', metresPerUnit: 0.001 },
  summary: {
    frames,
    tracks: 12,
    durationS: 4,
    individualsPerFrame: { mean: 10, max: 12 },
    radius: { mean: 0.5 },
    velocity: { components: [{ name: 'vx', mean: 0.1, standardDeviation: 0.2 }], speed: { mean: 0.25, kurtosis: 3.1 } },
    polarization: { mean: 0.2 },
    milling: null,
    nearestNeighbour: { mean: 0.05 },
    springConstant: { throughOrigin: { springConstant: 4, standardError: 0.2, rSquared: 0.9 } },
    autocorrelation: { eFoldingTimeS: 0.3, firstZeroCrossingS: null },
    pairs: { pairedFraction: 0.15 },
  },
  series: { histograms: { speed: { edges: [0, 0.25, 0.5], density: [2, 2] }, vx: { edges: [-0.1, 0.1, 0.3], density: [2.5, 2.5] } }, profiles: null, autocorrelation: null },
});

describe('releaseScalars(result)', () => {
  it('reads the SI fields as they are and derives the number density inside the RMS radius', () => {
    const s = releaseScalars(doc(100, 3));
    expect(s.meanSpeedMS).toBe(0.25);
    expect(s.nearestNeighbourM).toBe(0.05);
    expect(s.frameRateHz).toBe(50);
    expect(s.numberDensity).toBeCloseTo(10 / ((4 / 3) * Math.PI * 0.125), 12);
    expect(releaseScalars(doc(100, 2)).numberDensity).toBeCloseTo(10 / (Math.PI * 0.25), 12);
    expect(s.springConstantS2).toBe(4);
  });
  it('gives null for what the engine did not compute, and for an empty document', () => {
    const s = releaseScalars(doc(100, 3));
    expect(s.milling).toBeNull();
    expect(s.firstZeroCrossingS).toBeNull();
    expect(Object.values(releaseScalars(null)).every((v) => v === null)).toBe(true);
  });
});

describe('pickRepresentativeFile(files)', () => {
  it('takes the trajectory file with the most frames and skips files without a summary', () => {
    const files = [{ fileName: 'a.csv', result: doc(10, 3) }, { fileName: 'b.csv', result: doc(99, 3) }, { fileName: 'c.csv', result: { summary: null } }];
    expect(pickRepresentativeFile(files)?.fileName).toBe('b.csv');
    expect(pickRepresentativeFile([])).toBeNull();
  });
});

describe('releaseCurves(suffix, result)', () => {
  it('rescales speed by its mean and components to standard units, keeping a probability density', () => {
    const c = releaseCurves('x.v1', doc(100, 3));
    expect(c.speed?.x).toEqual([0.5, 1.5]);
    // ∫ density d(v/⟨v⟩) stays 1: density × ⟨v⟩ over bins of width 1.
    expect(c.speed!.y.reduce((a, b) => a! + b!, 0)).toBeCloseTo(1, 12);
    expect(c.components[0].x).toEqual([-0.5, 0.5]);
    expect(c.radialDensity).toBeNull();
  });
});
