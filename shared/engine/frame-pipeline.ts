import { gaussianDerivativeKernels, type DerivativeKernels } from '../stats/index';
import type { EmittedFrame } from './frame-statistics';
import { IssueCollector, rowLabel } from './issues';
import type { RowColumns } from './ingest';
import type { EngineSettings } from './settings';

/** Per-track summary kept for the whole file (a few numbers per track). */
export interface TrackSummary {
  firstFrame: number;
  lastFrame: number;
  rows: number;
  firstLine: number;
}

interface TrackState {
  last: number;
  run: number;
  /** Ring of the last 2L+1 positions (x, y, z) and their row sequence numbers. */
  pos: Float64Array | null;
  seq: Float64Array | null;
  px: number;
  py: number;
  pz: number;
}

/** Σ_j kernel[j]·pos[3(base + j) + a] for a = x, y, z into `out` (W samples, interleaved x, y, z). */
function applyKernel(kernel: Float64Array, pos: Float64Array, base: number, W: number, out: Float64Array): Float64Array {
  let sx = 0, sy = 0, sz = 0;
  for (let j = 0, q = 3 * base; j < W; j++, q += 3) {
    const c = kernel[j];
    sx += c * pos[q];
    sy += c * pos[q + 1];
    sz += c * pos[q + 2];
  }
  out[0] = sx;
  out[1] = sy;
  out[2] = sz;
  return out;
}

const COLS = 10; // frame, x, y, z, vx, vy, vz, ax, ay, az (track and line: Int32 rings)

/**
 * Frame-ordered pipeline: rows arrive sorted by frame; per-track Gaussian
 * kinematics over a sliding window of ±L frames fill in missing velocities
 * and accelerations; a frame is emitted once every derivative it needs is
 * known (L frames later). Memory: rows of L + 2 frames and one ring of
 * 2L + 1 positions per active track.
 */
export class FramePipeline {
  private cap = 1 << 14;
  private ring: Float64Array[] = Array.from({ length: COLS }, () => new Float64Array(this.cap));
  private ringTrack = new Int32Array(this.cap);
  private ringLine = new Int32Array(this.cap);
  private seq = 0;
  private oldestLive = 0;
  private window: { frame: number; start: number; count: number }[] = [];
  private current = -Infinity;
  private currentStart = 0;
  private readonly L: number;
  private readonly kernels: DerivativeKernels | null;
  private readonly states: (TrackState | undefined)[] = [];
  readonly tracks: (TrackSummary | undefined)[] = [];
  /** Mode 'full' (accelerations and the speed-jump check are used only then). */
  private readonly full: boolean;
  private readonly deriveV: boolean;
  private readonly deriveA: boolean;
  private readonly checkV: boolean;
  private mismatch = 0;
  private mismatchRef = 0;
  private scratch: { x: Float64Array; y: Float64Array; z: Float64Array; vx: Float64Array; vy: Float64Array; vz: Float64Array; ax: Float64Array; ay: Float64Array; az: Float64Array; track: Int32Array; line: Int32Array };
  private readonly dt: number;
  /** Frames between the velocity checks (kinematicsCheckInterval × fps, at least 1). */
  private readonly checkStride: number;
  private framesSinceEvict = 0;
  /** Scratch of applyKernel (x, y, z sums). */
  private readonly sum3 = new Float64Array(3);

  constructor(
    private readonly s: EngineSettings,
    private readonly dims: 2 | 3,
    private readonly fps: number,
    private readonly haveV: boolean,
    private readonly haveA: boolean,
    private readonly issues: IssueCollector,
    private readonly trackNames: string[],
    private readonly emit: (f: EmittedFrame) => void,
  ) {
    const full = s.mode === 'full';
    this.full = full;
    this.deriveV = full && !haveV;
    this.deriveA = full && !haveA;
    this.checkV = full && haveV;
    const needKernel = this.deriveV || this.deriveA || this.checkV;
    const L = s.kernelHalfLength ?? Math.ceil(3 * s.kernelWidth);
    this.L = needKernel ? L : 0;
    this.kernels = needKernel ? gaussianDerivativeKernels(s.kernelWidth, L) : null;
    this.dt = 1 / fps;
    this.checkStride = Math.max(1, Math.round(s.kinematicsCheckInterval * fps));
    this.scratch = this.makeScratch(256);
  }

  private makeScratch(n: number) {
    const f = () => new Float64Array(n);
    return { x: f(), y: f(), z: f(), vx: f(), vy: f(), vz: f(), ax: f(), ay: f(), az: f(), track: new Int32Array(n), line: new Int32Array(n) };
  }

  /** Relative RMS difference between given and kernel-derived velocities (NaN if not checked). */
  get kinematicsMismatch(): number {
    return this.mismatchRef > 0 ? Math.sqrt(this.mismatch / this.mismatchRef) : NaN;
  }

  /**
   * Adds rows [from, to) of `c` (row `order[k]` if given) with their integer frames in `frames[k − from]`;
   * returns the first k whose frame is earlier than the current one (input not sorted by frame), else −1.
   */
  pushRows(c: RowColumns, frames: Float64Array, order: Uint32Array | null, from: number, to: number): number {
    for (let k = from; k < to; k++) if (!this.pushRow(c, order ? order[k] : k, frames, k - from)) return k;
    return -1;
  }

  /**
   * Adds row i of `c` at frame frames[f]; returns false if its frame is earlier than the current one (input not
   * sorted by frame). Takes indices, not values: doubles passed to a call that is not inlined are boxed (GC).
   */
  private pushRow(c: RowColumns, i: number, frames: Float64Array, f: number): boolean {
    const frame = frames[f];
    const track = c.track[i], line = c.line[i];
    const x = c.x[i], y = c.y[i], z = c.z[i];
    if (frame !== this.current) {
      if (frame < this.current) return false;
      this.closeFrame(frame);
    }
    let ts = this.states[track];
    let sum = this.tracks[track];
    if (!sum) {
      sum = { firstFrame: frame, lastFrame: frame, rows: 0, firstLine: line };
      this.tracks[track] = sum;
    }
    if (!ts) {
      // A track evicted after a pause keeps its last frame in the summary, so the gap is still seen.
      ts = { last: sum.rows > 0 ? sum.lastFrame : -Infinity, run: 0, pos: null, seq: null, px: NaN, py: NaN, pz: NaN };
      this.states[track] = ts;
    }
    // Duplicates and out-of-order rows were reported on arrival; keep the first.
    if (frame <= ts.last) return true;
    if (ts.last > -Infinity && frame > ts.last + 1) {
      const gap = frame - ts.last - 1;
      const from = ts.last;
      this.issues.add('track-gap', () => `${rowLabel(line)}: track ${this.trackNames[track]} jumps from frame ${from} to frame ${frame} (${gap} frame${gap === 1 ? '' : 's'} missing); derivatives are not taken across the gap.`, line);
      ts.run = 0;
    }
    if (this.full && ts.last > -Infinity && ts.px === ts.px) {
      const dx = x - ts.px, dy = y - ts.py, dz = this.dims === 3 ? z - ts.pz : 0;
      const speed = Math.sqrt(dx * dx + dy * dy + dz * dz) / ((frame - ts.last) * this.dt);
      if (speed > this.s.jumpSpeedLimit)
        this.issues.add('speed-jump', () => `${rowLabel(line)}: track ${this.trackNames[track]} moves at ${speed.toPrecision(3)} m/s between frames ${ts!.last} and ${frame}, above the limit of ${this.s.jumpSpeedLimit} m/s (kept, not clipped; a tracking error or a real fast manoeuvre).`, line);
    }
    ts.last = frame;
    ts.px = x;
    ts.py = y;
    ts.pz = z;
    sum.lastFrame = frame;
    sum.rows++;
    if (this.seq - this.oldestLive >= this.cap) this.grow();
    const k = this.seq & (this.cap - 1);
    const r = this.ring;
    r[0][k] = frame;
    r[1][k] = x;
    r[2][k] = y;
    r[3][k] = z;
    r[4][k] = c.vx[i];
    r[5][k] = c.vy[i];
    r[6][k] = c.vz[i];
    if (this.full) {
      r[7][k] = c.ax[i];
      r[8][k] = c.ay[i];
      r[9][k] = c.az[i];
    }
    this.ringTrack[k] = track;
    this.ringLine[k] = line;
    if (this.kernels) this.kinematics(ts, k);
    this.seq++;
    return true;
  }

  /** Adds ring slot k (just written) to its track's window; derives the window centre's kinematics once full. */
  private kinematics(ts: TrackState, k: number): void {
    const x = this.ring[1][k], y = this.ring[2][k], z = this.ring[3][k];
    const L = this.L;
    const W = 2 * L + 1;
    if (!ts.pos) {
      ts.pos = new Float64Array(6 * W);
      ts.seq = new Float64Array(W);
    }
    // Each sample is written twice (slots s and s + W) so the window of the last W samples is contiguous.
    const slot = ts.run % W;
    const pos = ts.pos;
    const zz = this.dims === 3 ? z : 0;
    pos[3 * slot] = pos[3 * (slot + W)] = x;
    pos[3 * slot + 1] = pos[3 * (slot + W) + 1] = y;
    pos[3 * slot + 2] = pos[3 * (slot + W) + 2] = zz;
    ts.seq![slot] = this.seq;
    ts.run++;
    if (ts.run < W) return;
    // Window complete: oldest sample is at slot run % W.
    const k1 = this.kernels!.first, k2 = this.kernels!.second;
    const base = ts.run % W;
    const inv = 1 / this.dt;
    const centre = ts.seq![(base + L) % W] & (this.cap - 1);
    const r = this.ring;
    // Given velocities are compared on every checkStride-th frame only (setting kinematicsCheckInterval); floor,
    // not %, since % of a double is a slow library call.
    const cf = r[0][centre], cs = this.checkStride;
    const velocity = this.deriveV || (this.checkV && cf === Math.floor(cf / cs) * cs);
    if (velocity) {
      const d = applyKernel(k1, pos, base, W, this.sum3);
      const vx = d[0] * inv, vy = d[1] * inv, vz = d[2] * inv;
      if (this.deriveV) {
        r[4][centre] = vx;
        r[5][centre] = vy;
        r[6][centre] = vz;
      } else {
        const gx = r[4][centre], gy = r[5][centre], gz = this.dims === 3 ? r[6][centre] : 0;
        const d2 = (gx - vx) ** 2 + (gy - vy) ** 2 + (gz - vz) ** 2;
        if (d2 === d2) {
          this.mismatch += d2;
          this.mismatchRef += vx * vx + vy * vy + vz * vz;
        }
      }
    }
    if (this.deriveA) {
      const d = applyKernel(k2, pos, base, W, this.sum3);
      const inv2 = inv * inv;
      r[7][centre] = d[0] * inv2;
      r[8][centre] = d[1] * inv2;
      r[9][centre] = d[2] * inv2;
    }
  }

  private grow(): void {
    const cap = this.cap * 2;
    const ring = Array.from({ length: COLS }, () => new Float64Array(cap));
    const rt = new Int32Array(cap), rl = new Int32Array(cap);
    for (let s = this.oldestLive; s < this.seq; s++) {
      const a = s & (this.cap - 1), b = s & (cap - 1);
      for (let c = 0; c < COLS; c++) ring[c][b] = this.ring[c][a];
      rt[b] = this.ringTrack[a];
      rl[b] = this.ringLine[a];
    }
    this.ring = ring;
    this.ringTrack = rt;
    this.ringLine = rl;
    this.cap = cap;
  }

  private closeFrame(next: number): void {
    if (this.current > -Infinity) this.window.push({ frame: this.current, start: this.currentStart, count: this.seq - this.currentStart });
    this.current = next;
    this.currentStart = this.seq;
    while (this.window.length > 0 && this.window[0].frame + this.L < next) this.emitOldest();
    if (++this.framesSinceEvict >= 256) {
      this.framesSinceEvict = 0;
      // Free kinematic rings of tracks not seen for a while (bounded memory for files with many short tracks).
      for (let i = 0; i < this.states.length; i++) {
        const ts = this.states[i];
        if (ts && ts.last < next - 2) this.states[i] = undefined;
      }
    }
  }

  private emitOldest(): void {
    const w = this.window.shift()!;
    const n = w.count;
    const r = this.ring;
    const a = w.start & (this.cap - 1);
    let sc: { x: Float64Array; y: Float64Array; z: Float64Array; vx: Float64Array; vy: Float64Array; vz: Float64Array; ax: Float64Array; ay: Float64Array; az: Float64Array; track: Int32Array; line: Int32Array };
    if (a + n <= this.cap) {
      // The frame's rows are contiguous in the ring (the usual case): hand out views, no copy.
      const e = a + n;
      sc = { x: r[1].subarray(a, e), y: r[2].subarray(a, e), z: r[3].subarray(a, e), vx: r[4].subarray(a, e), vy: r[5].subarray(a, e), vz: r[6].subarray(a, e), ax: r[7].subarray(a, e), ay: r[8].subarray(a, e), az: r[9].subarray(a, e), track: this.ringTrack.subarray(a, e), line: this.ringLine.subarray(a, e) };
    } else {
      if (this.scratch.x.length < n) this.scratch = this.makeScratch(2 * n);
      sc = this.scratch;
      for (let i = 0; i < n; i++) {
        const k = (w.start + i) & (this.cap - 1);
        sc.x[i] = r[1][k];
        sc.y[i] = r[2][k];
        sc.z[i] = r[3][k];
        sc.vx[i] = r[4][k];
        sc.vy[i] = r[5][k];
        sc.vz[i] = r[6][k];
        sc.ax[i] = r[7][k];
        sc.ay[i] = r[8][k];
        sc.az[i] = r[9][k];
        sc.track[i] = this.ringTrack[k];
        sc.line[i] = this.ringLine[k];
      }
    }
    this.oldestLive = w.start + n;
    const full = this.s.mode === 'full';
    const hasV = this.haveV || this.deriveV;
    const hasA = this.haveA || this.deriveA;
    this.emit({
      frame: w.frame,
      time: w.frame / this.fps,
      track: sc.track,
      line: sc.line,
      view: {
        count: n,
        dims: this.dims,
        x: sc.x,
        y: sc.y,
        z: sc.z,
        vx: hasV ? sc.vx : undefined,
        vy: hasV ? sc.vy : undefined,
        vz: hasV ? sc.vz : undefined,
        ax: full && hasA ? sc.ax : undefined,
        ay: full && hasA ? sc.ay : undefined,
        az: full && hasA ? sc.az : undefined,
      },
    });
  }

  /** Emits the remaining frames. */
  finish(): void {
    this.closeFrame(Infinity);
    while (this.window.length > 0) this.emitOldest();
  }
}
