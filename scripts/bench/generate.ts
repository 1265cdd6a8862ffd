import { createWriteStream, existsSync, renameSync, statSync } from 'node:fs';
import { once } from 'node:events';
import { createReadStream } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import { createGzip } from 'node:zlib';
import { createSeededRandom } from '../../shared/engine/seeded-random';

/**
 * Writes a realistic 3D benchmark file: `individuals` present at any time at
 * `fps`, each slot's track ending after an exponential lifetime (mean 20 s)
 * and replaced by a new track id; Langevin motion in a trap (K = 4 s⁻²,
 * T = 0.3 s, σ_v = 0.1 m/s). Sorted by frame then track. Columns
 * track_id,frame,x,y,z,vx,vy,vz. Seeded; cached by the caller.
 */
export async function generateBenchFile(path: string, rows: number, individuals = 100, fps = 100, seed = 2024): Promise<void> {
  if (existsSync(path)) return;
  const rnd = createSeededRandom(seed);
  const tmp = `${path}.part`;
  const out = createWriteStream(tmp, { highWaterMark: 1 << 22 });
  const dt = 1 / fps, K = 4, T = 0.3, sd = 0.1;
  const noise = Math.sqrt((2 * sd * sd * dt) / T);
  const rsd = sd / Math.sqrt(K);
  const pEnd = dt / 20;
  let nextId = 0;
  const slot = Array.from({ length: individuals }, () => ({ id: nextId++, r: [0, 0, 0].map(() => rsd * rnd.normal()), v: [0, 0, 0].map(() => sd * rnd.normal()) }));
  let written = 0;
  let buf = 'track_id,frame,x,y,z,vx,vy,vz\n';
  for (let f = 0; written < rows; f++) {
    for (const s of slot) {
      if (written >= rows) break;
      if (rnd.uniform() < pEnd) {
        s.id = nextId++;
        s.r = s.r.map(() => rsd * rnd.normal());
      }
      buf += `${s.id},${f},${s.r[0].toFixed(6)},${s.r[1].toFixed(6)},${(s.r[2] + 1.5).toFixed(6)},${s.v[0].toFixed(6)},${s.v[1].toFixed(6)},${s.v[2].toFixed(6)}\n`;
      written++;
      for (let k = 0; k < 3; k++) {
        const a = -K * s.r[k] - s.v[k] / T;
        s.r[k] += s.v[k] * dt;
        s.v[k] += a * dt + noise * rnd.normal();
      }
    }
    if (buf.length > 1 << 22) {
      if (!out.write(buf)) await once(out, 'drain');
      buf = '';
    }
  }
  out.end(buf);
  await once(out, 'finish');
  renameSync(tmp, path);
}

export async function gzipFile(src: string, dst: string): Promise<void> {
  if (existsSync(dst) && statSync(dst).size > 0) return;
  await pipeline(createReadStream(src, { highWaterMark: 1 << 20 }), createGzip({ level: 6 }), createWriteStream(`${dst}.part`));
  renameSync(`${dst}.part`, dst);
}
