// Writes synthetic demo trajectories (seeded) from the SCIENCE.md models.
// npm run demo:generate [-- --out .data/demo] [--fixtures-only]
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { gzipSync } from 'node:zlib';
import {
  generateAdaptiveGravitySwarm,
  generateLangevinSwarm,
  generateVicsekFlock,
  rowsToCsv,
  type SyntheticRow,
} from '../shared/engine/synthetic-trajectories';

interface Scenario {
  file: string;
  /** Invented lab and site; real species. */
  lab: string;
  species: string;
  model: string;
  dims: 2 | 3;
  fps: number;
  velocities: boolean;
  generate(scale: number, emit: (r: SyntheticRow) => void): void;
}

const scenarios: Scenario[] = [
  {
    file: 'trapped-langevin-swarm',
    lab: 'Marsh Hollow Swarm Lab (invented)',
    species: 'Chironomus riparius',
    model: 'Trapped Langevin swarm, K = 4 s⁻², T = 0.3 s, σ_v = 0.1 m/s',
    dims: 3,
    fps: 100,
    velocities: false,
    generate: (s, emit) => generateLangevinSwarm({ seed: 101, individuals: Math.max(10, Math.round(30 * s)), fps: 100, seconds: 60 * s, springConstant: 4, relaxationTime: 0.3, speedSd: 0.1 }, emit),
  },
  {
    file: 'adaptive-gravity-swarm',
    lab: 'Northfen Acoustics Group (invented)',
    species: 'Anopheles gambiae',
    model: 'Adaptive long-range attraction, C = 0.05, R_ad = 0.1 m',
    dims: 3,
    fps: 100,
    velocities: false,
    generate: (s, emit) => generateAdaptiveGravitySwarm({ seed: 202, individuals: Math.max(10, Math.round(25 * s)), fps: 100, seconds: 40 * s, strength: 0.05, adaptiveRadius: 0.1, relaxationTime: 0.5, speedSd: 0.15 }, emit),
  },
  {
    file: 'vicsek-flock-2d',
    lab: 'Lakeside Collective Motion Unit (invented)',
    species: 'Danio rerio',
    model: 'Vicsek flock 2D, η = 0.5',
    dims: 2,
    fps: 25,
    velocities: true,
    generate: (s, emit) => generateVicsekFlock({ seed: 303, individuals: Math.max(20, Math.round(100 * s)), fps: 25, seconds: 60 * s, dims: 2, box: 5, radius: 1, speed: 0.3, noise: 0.5 }, emit),
  },
  {
    file: 'vicsek-flock-3d',
    lab: 'Ridgeway Field Station (invented)',
    species: 'Sturnus vulgaris',
    model: 'Vicsek flock 3D, η = 0.3',
    dims: 3,
    fps: 25,
    velocities: true,
    generate: (s, emit) => generateVicsekFlock({ seed: 404, individuals: Math.max(20, Math.round(200 * s)), fps: 25, seconds: 30 * s, dims: 3, box: 20, radius: 3, speed: 10, noise: 0.3 }, emit),
  },
];

function write(dir: string, scale: number, label: string): void {
  mkdirSync(dir, { recursive: true });
  const manifest = [];
  for (const sc of scenarios) {
    const rows: SyntheticRow[] = [];
    sc.generate(scale, (r) => rows.push(r));
    const csv = rowsToCsv(rows, { dims: sc.dims, velocities: sc.velocities, digits: 6 });
    const name = `${sc.file}.csv.gz`;
    writeFileSync(join(dir, name), gzipSync(csv, { level: 9 }));
    manifest.push({ file: name, lab: sc.lab, species: sc.species, model: sc.model, dims: sc.dims, fps: sc.fps, units: 'm', rows: rows.length, synthetic: true });
    process.stdout.write(`${label}: ${join(dir, name)} (${rows.length.toLocaleString('en-US')} rows)\n`);
  }
  writeFileSync(join(dir, 'manifest.json'), JSON.stringify(manifest, null, 2) + '\n');
}

const { values } = parseArgs({ options: { out: { type: 'string' }, 'fixtures-only': { type: 'boolean' } } });
if (!values['fixtures-only']) write(values.out ?? '.data/demo', 1, 'demo');
write('tests/fixtures/trajectories', 0.08, 'fixture');
