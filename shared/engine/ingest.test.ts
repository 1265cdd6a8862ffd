import Ajv from 'ajv';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeBytes } from './ingest';
import { parseNumberBytes } from './text-parser';
import { createSeededRandom } from './seeded-random';
import { generateLangevinSwarm, generateVicsekFlock, rowsToCsv, type SyntheticRow } from './synthetic-trajectories';

const schema = JSON.parse(readFileSync(join(import.meta.dirname, '../../schemas/ingest-result.schema.json'), 'utf8'));
const validate = new Ajv({ allErrors: true, strict: false }).compile(schema);
const enc = (s: string) => new TextEncoder().encode(s);

const swarmRows: SyntheticRow[] = [];
// K = 4 s⁻², T = 0.3 s, σ_v = 0.1 m/s, 25 individuals, 20 s at 100 fps.
generateLangevinSwarm({ seed: 42, individuals: 25, fps: 100, seconds: 20, springConstant: 4, relaxationTime: 0.3, speedSd: 0.1 }, (r) => swarmRows.push(r));
const swarmCsv = rowsToCsv(swarmRows, { digits: 7 });
const swarm = analyzeBytes(enc(swarmCsv), { settings: { fps: 100 } });

describe('analyzeBytes(data, options) on a trapped Langevin swarm (positions only)', () => {
  it('produces a result document valid against schemas/ingest-result.schema.json', () => {
    // Source: ajv 8 against our schema.
    const ok = validate(swarm);
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
    expect(swarm.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
  });
  it('recovers the spring constant K from kernel-derived accelerations', () => {
    // Source: model definition (J. R. Soc. Interface 15, 2018); K = k for a harmonic trap (SCIENCE.md). 10 % tolerance for kernel smoothing.
    const K = swarm.summary!.springConstant!.throughOrigin.springConstant!;
    expect(Math.abs(K / 4 - 1)).toBeLessThan(0.1);
    expect(swarm.summary!.springConstant!.throughOrigin.rSquared!).toBeGreaterThan(0.9);
  });
  it('gives near-Gaussian velocity components with σ ≈ σ_v and kurtosis ≈ 3', () => {
    // Source: derived (stationary OU-type velocities are Gaussian with variance σ_v²); kernel smoothing lowers σ by a few %.
    for (const c of swarm.summary!.velocity.components) {
      expect(Math.abs(c.standardDeviation! / 0.1 - 1)).toBeLessThan(0.1);
      expect(Math.abs(c.kurtosis! - 3)).toBeLessThan(0.3);
    }
    // Polarization of an unaligned swarm sits at the random-heading baseline (Sci. Rep. 3, 2013: midges near 0).
    expect(Math.abs(swarm.summary!.polarization.mean! - swarm.summary!.polarization.randomHeadingsBaseline!)).toBeLessThan(0.05);
  });
  it('gives the same result whatever the chunk size and whether sorted by frame or by track', () => {
    // Source: derived (streaming must not depend on chunk boundaries; reordering is exact).
    const small = analyzeBytes(enc(swarmCsv), { settings: { fps: 100 } }, 4093);
    expect(small.summary).toEqual(swarm.summary);
    const byTrack = [...swarmRows].sort((a, b) => a.track - b.track || a.frame - b.frame);
    const t = analyzeBytes(enc(rowsToCsv(byTrack, { digits: 7 })), { settings: { fps: 100 } });
    expect(t.summary).toEqual(swarm.summary);
  });
  it('keeps the plot series bounded and the quick-look sample compact', () => {
    expect(swarm.series!.time.polarization.t.length).toBeLessThanOrEqual(500);
    expect(swarm.quickLook!.frames.length).toBe(100);
    expect(JSON.stringify(swarm.quickLook).length).toBeLessThan(60_000);
  });
  it('flags given velocities that disagree with the positions (kinematics-mismatch)', () => {
    // Source: derived: velocities written in mm/s while positions are in m differ 1000-fold.
    const rows = swarmRows.slice(0, 5000).map((r) => ({ ...r, vx: r.vx * 1000, vy: r.vy * 1000, vz: r.vz * 1000 }));
    const doc = analyzeBytes(enc(rowsToCsv(rows, { velocities: true })), { settings: { fps: 100 } });
    expect(doc.validation.warnings.map((w) => w.kind)).toContain('kinematics-mismatch');
  });
  it('estimates the velocity mismatch as well on every 4th frame as on every frame (kinematicsCheckInterval)', () => {
    // Source: derived (a strided sample of an RMS over ~100k samples); tolerance 2 % relative. Velocities 10 % too
    // large: the mismatch is then about 0.1 on top of the kernel smoothing's own small share.
    const rows = swarmRows.slice(0, 50000).map((r) => ({ ...r, vx: r.vx * 1.1, vy: r.vy * 1.1, vz: r.vz * 1.1 }));
    const csv = enc(rowsToCsv(rows, { velocities: true }));
    const every = analyzeBytes(csv, { settings: { fps: 100, kinematicsCheckInterval: 0 } });
    const strided = analyzeBytes(csv, { settings: { fps: 100 } });
    const a = every.summary!.kinematics.velocityMismatch!, b = strided.summary!.kinematics.velocityMismatch!;
    expect(a).toBeGreaterThan(0.05);
    expect(Math.abs(b / a - 1)).toBeLessThan(0.02);
    expect(strided.parameters.kinematicsCheckInterval).toBe(0.04);
  });
  it('runs in basic mode with given velocities (counts, centroid, speed, polarization only)', () => {
    const doc = analyzeBytes(enc(rowsToCsv(swarmRows, { velocities: true })), { settings: { fps: 100, mode: 'basic' } });
    expect(doc.status).toBe('ok');
    expect(doc.summary!.nearestNeighbour).toBeNull();
    expect(doc.summary!.velocity.speed.mean!).toBeCloseTo(swarm.summary!.velocity.speed.mean!, 1);
    expect(validate(doc)).toBe(true);
  });
});

describe('analyzeBytes(data, options) on a Vicsek flock', () => {
  it('gives polarization near 1 at low noise and the random baseline at full noise', () => {
    // Source: Vicsek et al., Phys. Rev. Lett. 75 (1995): ordered phase at low noise, disordered at η = 2π.
    const run = (noise: number) => {
      const rows: SyntheticRow[] = [];
      generateVicsekFlock({ seed: 3, individuals: 60, fps: 25, seconds: 12, dims: 2, box: 3, radius: 1, speed: 0.3, noise }, (r) => rows.push(r));
      return analyzeBytes(enc(rowsToCsv(rows, { dims: 2, velocities: true })), { settings: { fps: 25 } });
    };
    const ordered = run(0.2);
    expect(ordered.summary!.polarization.mean!).toBeGreaterThan(0.9);
    const disordered = run(2 * Math.PI);
    expect(disordered.summary!.polarization.mean!).toBeLessThan(0.25);
  });
});

describe('parseNumberBytes(bytes, start, end, decimalComma)', () => {
  it('equals Number() on random decimals, exponents and signs', () => {
    // Source: ECMAScript Number() as reference.
    const rnd = createSeededRandom(77);
    for (let i = 0; i < 3000; i++) {
      const v = (rnd.uniform() - 0.5) * 10 ** Math.floor(rnd.uniform() * 12 - 6);
      for (const s of [v.toFixed(6), v.toPrecision(9), v.toExponential(5), String(v)]) {
        const b = enc(s);
        expect(parseNumberBytes(b, 0, b.length, false)).toBe(Number(s));
      }
    }
    const b = enc('"-1,5"');
    expect(parseNumberBytes(b, 0, b.length, true)).toBe(-1.5);
  });
});
