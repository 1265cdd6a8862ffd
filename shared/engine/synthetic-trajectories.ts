import { createSeededRandom } from './seeded-random';

/** One row of a synthetic trajectory (SI units). */
export interface SyntheticRow {
  track: number;
  frame: number;
  x: number;
  y: number;
  z: number;
  vx: number;
  vy: number;
  vz: number;
  ax: number;
  ay: number;
  az: number;
}

export interface LangevinSwarmOptions {
  seed: number;
  individuals: number;
  fps: number;
  seconds: number;
  /** Spring constant K, s⁻². */
  springConstant: number;
  /** Velocity relaxation time T, s. */
  relaxationTime: number;
  /** Velocity standard deviation σ_v per component, m/s. */
  speedSd: number;
  /** Integration sub-steps per frame. */
  substeps?: number;
  dims?: 2 | 3;
}

/**
 * Trapped Langevin swarm: dv = (−K(r − r_c) − v/T) dt + sqrt(2σ_v²/T) dW
 * around a fixed marker r_c = 0, integrated by Euler–Maruyama sub-steps.
 * Stationary velocities are Gaussian with variance σ_v² per component and
 * positions with variance σ_v²/K (derived: equipartition). Model: "Dynamical
 * aspects of animal grouping: swarms, schools, flocks, and herds" (Okubo,
 * Adv. Biophys. 22, 1986); "Langevin dynamics encapsulate the microscopic and
 * emergent macroscopic properties of midge swarms" (J. R. Soc. Interface 15,
 * 2018). Calls `emit` frame by frame, rows sorted by frame then track;
 * accelerations are the model's deterministic part plus noise averaged over
 * the frame.
 */
export function generateLangevinSwarm(o: LangevinSwarmOptions, emit: (row: SyntheticRow) => void): void {
  const rnd = createSeededRandom(o.seed);
  const dims = o.dims ?? 3;
  const n = o.individuals;
  const sub = o.substeps ?? 10;
  const dt = 1 / o.fps / sub;
  const K = o.springConstant, T = o.relaxationTime, sd = o.speedSd;
  const noise = Math.sqrt((2 * sd * sd * dt) / T);
  const rsd = sd / Math.sqrt(K);
  const r = Array.from({ length: n }, () => [rsd * rnd.normal(), rsd * rnd.normal(), dims === 3 ? rsd * rnd.normal() : 0]);
  const v = Array.from({ length: n }, () => [sd * rnd.normal(), sd * rnd.normal(), dims === 3 ? sd * rnd.normal() : 0]);
  const frames = Math.round(o.seconds * o.fps);
  for (let f = 0; f < frames; f++) {
    for (let i = 0; i < n; i++) {
      const a = [0, 1, 2].map((k) => (k < dims ? -K * r[i][k] - v[i][k] / T : 0));
      emit({ track: i, frame: f, x: r[i][0], y: r[i][1], z: r[i][2], vx: v[i][0], vy: v[i][1], vz: v[i][2], ax: a[0], ay: a[1], az: a[2] });
    }
    for (let s = 0; s < sub; s++)
      for (let i = 0; i < n; i++)
        for (let k = 0; k < dims; k++) {
          const acc = -K * r[i][k] - v[i][k] / T;
          r[i][k] += v[i][k] * dt;
          v[i][k] += acc * dt + noise * rnd.normal();
        }
  }
}

export interface AdaptiveGravityOptions {
  seed: number;
  individuals: number;
  fps: number;
  seconds: number;
  /** Attraction strength C, m³/s² per unit of normalised intensity. */
  strength: number;
  /** Adaptivity radius R_ad, m. */
  adaptiveRadius: number;
  relaxationTime: number;
  speedSd: number;
  substeps?: number;
}

/**
 * Adaptive long-range attraction ("Long-range acoustic interactions in
 * insect swarms: an adaptive gravity model", Gorbonos et al., New J. Phys.
 * 18, 2016) [memory for the exact form]: a_i = C Σ_j r̂_ij/r_ij² /
 * (R_ad⁻² + Σ_k r_ik⁻²) + short-range repulsion − v/T + noise (3D). O(N²) per
 * step; meant for N ≤ a few hundred.
 */
export function generateAdaptiveGravitySwarm(o: AdaptiveGravityOptions, emit: (row: SyntheticRow) => void): void {
  const rnd = createSeededRandom(o.seed);
  const n = o.individuals;
  const sub = o.substeps ?? 5;
  const dt = 1 / o.fps / sub;
  const noise = Math.sqrt((2 * o.speedSd * o.speedSd * dt) / o.relaxationTime);
  const r = Array.from({ length: n }, () => [0.1 * rnd.normal(), 0.1 * rnd.normal(), 0.1 * rnd.normal()]);
  const v = Array.from({ length: n }, () => [o.speedSd * rnd.normal(), o.speedSd * rnd.normal(), o.speedSd * rnd.normal()]);
  const acc = Array.from({ length: n }, () => [0, 0, 0]);
  const rep = 0.01;
  const force = () => {
    for (let i = 0; i < n; i++) {
      let ax = 0, ay = 0, az = 0, intensity = 1 / (o.adaptiveRadius * o.adaptiveRadius);
      for (let j = 0; j < n; j++) {
        if (j === i) continue;
        const dx = r[j][0] - r[i][0], dy = r[j][1] - r[i][1], dz = r[j][2] - r[i][2];
        const d2 = dx * dx + dy * dy + dz * dz + 1e-6;
        const d = Math.sqrt(d2);
        intensity += 1 / d2;
        // Attraction r̂/r² plus a short-range repulsion r̂·(rep/r)⁴ that dominates below ~rep.
        const g = (1 - (rep * rep) / d2) / (d2 * d);
        ax += g * dx;
        ay += g * dy;
        az += g * dz;
      }
      acc[i][0] = (o.strength * ax) / intensity - v[i][0] / o.relaxationTime;
      acc[i][1] = (o.strength * ay) / intensity - v[i][1] / o.relaxationTime;
      acc[i][2] = (o.strength * az) / intensity - v[i][2] / o.relaxationTime;
    }
  };
  const frames = Math.round(o.seconds * o.fps);
  for (let f = 0; f < frames; f++) {
    force();
    for (let i = 0; i < n; i++) emit({ track: i, frame: f, x: r[i][0], y: r[i][1], z: r[i][2], vx: v[i][0], vy: v[i][1], vz: v[i][2], ax: acc[i][0], ay: acc[i][1], az: acc[i][2] });
    for (let s = 0; s < sub; s++) {
      if (s > 0) force();
      for (let i = 0; i < n; i++)
        for (let k = 0; k < 3; k++) {
          r[i][k] += v[i][k] * dt;
          v[i][k] += acc[i][k] * dt + noise * rnd.normal();
        }
    }
  }
}

export interface VicsekOptions {
  seed: number;
  individuals: number;
  fps: number;
  seconds: number;
  dims: 2 | 3;
  /** Periodic box side, m. */
  box: number;
  /** Interaction radius, m. */
  radius: number;
  /** Speed v0, m/s. */
  speed: number;
  /** Noise amplitude η (radians in 2D; size of the random kick in 3D). */
  noise: number;
}

/**
 * Vicsek flock ("Novel type of phase transition in a system of self-driven
 * particles", Phys. Rev. Lett. 75, 1995): each step every individual takes
 * the mean heading of its neighbours within `radius` plus noise η and moves
 * at constant speed in a periodic box. Positions are written unwrapped so
 * tracks stay continuous. One update per frame.
 */
export function generateVicsekFlock(o: VicsekOptions, emit: (row: SyntheticRow) => void): void {
  const rnd = createSeededRandom(o.seed);
  const n = o.individuals, d = o.dims;
  const dt = 1 / o.fps;
  const step = o.speed * dt;
  const r = Array.from({ length: n }, () => [rnd.uniform() * o.box, rnd.uniform() * o.box, d === 3 ? rnd.uniform() * o.box : 0]);
  const unwrapped = r.map((p) => p.slice());
  let h = Array.from({ length: n }, () => rnd.unitVector(d));
  const frames = Math.round(o.seconds * o.fps);
  for (let f = 0; f < frames; f++) {
    for (let i = 0; i < n; i++)
      emit({ track: i, frame: f, x: unwrapped[i][0], y: unwrapped[i][1], z: unwrapped[i][2], vx: o.speed * h[i][0], vy: o.speed * h[i][1], vz: o.speed * h[i][2], ax: NaN, ay: NaN, az: NaN });
    const next: [number, number, number][] = [];
    for (let i = 0; i < n; i++) {
      let sx = 0, sy = 0, sz = 0;
      for (let j = 0; j < n; j++) {
        let dist2 = 0;
        for (let k = 0; k < d; k++) {
          let dd = Math.abs(r[j][k] - r[i][k]);
          if (dd > o.box / 2) dd = o.box - dd;
          dist2 += dd * dd;
        }
        if (dist2 <= o.radius * o.radius) {
          sx += h[j][0];
          sy += h[j][1];
          sz += h[j][2];
        }
      }
      if (d === 2) {
        const a = Math.atan2(sy, sx) + o.noise * (rnd.uniform() - 0.5);
        next.push([Math.cos(a), Math.sin(a), 0]);
      } else {
        const m = Math.sqrt(sx * sx + sy * sy + sz * sz) || 1;
        const kick = rnd.unitVector(3);
        const x = sx / m + o.noise * kick[0], y = sy / m + o.noise * kick[1], z = sz / m + o.noise * kick[2];
        const q = Math.sqrt(x * x + y * y + z * z) || 1;
        next.push([x / q, y / q, z / q]);
      }
    }
    h = next;
    for (let i = 0; i < n; i++)
      for (let k = 0; k < d; k++) {
        r[i][k] = (((r[i][k] + step * h[i][k]) % o.box) + o.box) % o.box;
        unwrapped[i][k] += step * h[i][k];
      }
  }
}

/** Writes rows as CSV text (header track_id,frame,x,y,z[,vx,vy,vz][,ax,ay,az]) with `digits` decimals. */
export function rowsToCsv(
  rows: SyntheticRow[],
  options: { dims?: 2 | 3; velocities?: boolean; accelerations?: boolean; digits?: number; delimiter?: string; scale?: number } = {},
): string {
  const dims = options.dims ?? 3;
  const digits = options.digits ?? 6;
  const sep = options.delimiter ?? ',';
  const k = options.scale ?? 1;
  const axes = dims === 3 ? ['x', 'y', 'z'] : ['x', 'y'];
  const head = ['track_id', 'frame', ...axes];
  if (options.velocities) head.push(...axes.map((a) => `v${a}`));
  if (options.accelerations) head.push(...axes.map((a) => `a${a}`));
  const out = [head.join(sep)];
  for (const r of rows) {
    const cells: (string | number)[] = [r.track, r.frame, (r.x * k).toFixed(digits), (r.y * k).toFixed(digits)];
    if (dims === 3) cells.push((r.z * k).toFixed(digits));
    if (options.velocities) cells.push((r.vx * k).toFixed(digits), (r.vy * k).toFixed(digits), ...(dims === 3 ? [(r.vz * k).toFixed(digits)] : []));
    if (options.accelerations) cells.push((r.ax * k).toFixed(digits), (r.ay * k).toFixed(digits), ...(dims === 3 ? [(r.az * k).toFixed(digits)] : []));
    out.push(cells.join(sep));
  }
  return out.join('\n') + '\n';
}
