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

const COLS = 12; // frame, x, y, z, vx, vy, vz, ax, ay, az, track, line

/**
 * Frame-ordered pipeline: rows arrive sorted by frame; per-track Gaussian
 * kinematics over a sliding window of ±L frames fill in missing velocities
 * and accelerations; a frame is emitted once every derivative it needs is
 * known (L frames later). Memory: rows of L + 2 frames and one ring of
 * 2L + 1 positions per active track.
 */
export class FramePipeline {
  private cap = 1 << 12;
  private ring: Float64Array[] = Array.from({ length: COLS }, () => new Float64Array(this.cap));
  private seq = 0;
  private oldestLive = 0;
  private window: { frame: number; start: number; count: number }[] = [];
  private current = -Infinity;
  private currentStart = 0;
  private readonly L: number;
  private readonly kernels: DerivativeKernels | null;
  private readonly states: (TrackState | undefined)[] = [];
  readonly tracks: (TrackSummary | undefined)[] = [];
  private readonly deriveV: boolean;
  private readonly deriveA: boolean;
  private readonly checkV: boolean;
  private mismatch = 0;
  private mismatchRef = 0;
  private scratch: { x: Float64Array; y: Float64Array; z: Float64Array; vx: Float64Array; vy: Float64Array; vz: Float64Array; ax: Float64Array; ay: Float64Array; az: Float64Array; track: Int32Array; line: Int32Array };
  private readonly dt: number;
  private framesSinceEvict = 0;

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
    this.deriveV = full && !haveV;
    this.deriveA = full && !haveA;
    this.checkV = full && haveV;
    const needKernel = this.deriveV || this.deriveA || this.checkV;
    const L = s.kernelHalfLength ?? Math.ceil(3 * s.kernelWidth);
    this.L = needKernel ? L : 0;
    this.kernels = needKernel ? gaussianDerivativeKernels(s.kernelWidth, L) : null;
    this.dt = 1 / fps;
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
    const { track, line, x, y, z, vx, vy, vz, ax, ay, az } = c;
    for (let k = from; k < to; k++) {
      const i = order ? order[k] : k;
      if (!this.push(track[i], frames[k - from], x[i], y[i], z[i], vx[i], vy[i], vz[i], ax[i], ay[i], az[i], line[i])) return k;
    }
    return -1;
  }

  /** Adds one row; returns false if its frame is earlier than the current one (input not sorted by frame). */
  push(track: number, frame: number, x: number, y: number, z: number, vx: number, vy: number, vz: number, ax: number, ay: number, az: number, line: number): boolean {
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
    if (this.s.mode === 'full' && ts.last > -Infinity && ts.px === ts.px) {
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
    r[4][k] = vx;
    r[5][k] = vy;
    r[6][k] = vz;
    r[7][k] = ax;
    r[8][k] = ay;
    r[9][k] = az;
    r[10][k] = track;
    r[11][k] = line;
    if (this.kernels) this.kinematics(ts, x, y, z);
    this.seq++;
    return true;
  }

  private kinematics(ts: TrackState, x: number, y: number, z: number): void {
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
    let vx = 0, vy = 0, vz = 0, ax = 0, ay = 0, az = 0;
    const base = ts.run % W;
    for (let j = 0, q = 3 * base; j < W; j++, q += 3) {
      const px = pos[q], py = pos[q + 1], pz = pos[q + 2];
      const c1 = k1[j], c2 = k2[j];
      vx += c1 * px;
      vy += c1 * py;
      vz += c1 * pz;
      ax += c2 * px;
      ay += c2 * py;
      az += c2 * pz;
    }
    const inv = 1 / this.dt;
    const inv2 = inv * inv;
    const centre = ts.seq![(base + L) % W] & (this.cap - 1);
    const r = this.ring;
    if (this.deriveV) {
      r[4][centre] = vx * inv;
      r[5][centre] = vy * inv;
      r[6][centre] = vz * inv;
    } else if (this.checkV) {
      const gx = r[4][centre], gy = r[5][centre], gz = this.dims === 3 ? r[6][centre] : 0;
      const d2 = (gx - vx * inv) ** 2 + (gy - vy * inv) ** 2 + (gz - vz * inv) ** 2;
      if (d2 === d2) {
        this.mismatch += d2;
        this.mismatchRef += (vx * inv) ** 2 + (vy * inv) ** 2 + (vz * inv) ** 2;
      }
    }
    if (this.deriveA) {
      r[7][centre] = ax * inv2;
      r[8][centre] = ay * inv2;
      r[9][centre] = az * inv2;
    }
  }

  private grow(): void {
    const cap = this.cap * 2;
    const ring = Array.from({ length: COLS }, () => new Float64Array(cap));
    for (let s = this.oldestLive; s < this.seq; s++) {
      const a = s & (this.cap - 1), b = s & (cap - 1);
      for (let c = 0; c < COLS; c++) ring[c][b] = this.ring[c][a];
    }
    this.ring = ring;
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
    if (this.scratch.x.length < n) this.scratch = this.makeScratch(2 * n);
    const sc = this.scratch;
    const r = this.ring;
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
      sc.track[i] = r[10][k];
      sc.line[i] = r[11][k];
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
