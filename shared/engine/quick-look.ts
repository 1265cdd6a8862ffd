import type { EmittedFrame } from './frame-statistics';

/** Compact playback sample: positions quantised to 0..65535 within the bounds, one frame per step. */
export interface QuickLook {
  fps: number;
  dims: 2 | 3;
  startTime: number;
  /** Bounds in metres per axis: [min, max]. */
  bounds: { min: number[]; max: number[] };
  /** Track names appearing in the sample; frames refer to them by index. */
  tracks: string[];
  /** Per frame: time (s), track indices into `tracks`, quantised coordinates interleaved (x, y[, z]). */
  frames: { t: number; ids: number[]; q: number[] }[];
}

/**
 * Keeps the first `seconds` of the data at `sampleFps` for in-browser
 * playback, quantised to 16 bits within the bounding box so the sample stays
 * compact.
 */
export class QuickLookSampler {
  private readonly stride: number;
  private start = NaN;
  private raw: { t: number; ids: number[]; p: number[] }[] = [];
  private readonly names = new Map<number, number>();
  private readonly trackList: string[] = [];

  constructor(private readonly seconds: number, sampleFps: number, private readonly fps: number, private readonly dims: 2 | 3) {
    this.stride = Math.max(1, Math.round(fps / sampleFps));
  }

  add(f: EmittedFrame, trackNames: string[]): void {
    if (!(this.start === this.start)) this.start = f.time;
    if (f.time - this.start >= this.seconds || f.frame % this.stride !== 0) return;
    const ids: number[] = [];
    const p: number[] = [];
    const { view } = f;
    for (let i = 0; i < view.count; i++) {
      const xs = [view.x[i], view.y[i], view.z[i]].slice(0, this.dims);
      if (!xs.every(Number.isFinite)) continue;
      let k = this.names.get(f.track[i]);
      if (k === undefined) {
        k = this.trackList.length;
        this.names.set(f.track[i], k);
        this.trackList.push(trackNames[f.track[i]]);
      }
      ids.push(k);
      p.push(...xs);
    }
    this.raw.push({ t: f.time, ids, p });
  }

  result(): QuickLook {
    const d = this.dims;
    const min = new Array(d).fill(Infinity), max = new Array(d).fill(-Infinity);
    for (const f of this.raw)
      for (let i = 0; i < f.p.length; i++) {
        const a = i % d;
        if (f.p[i] < min[a]) min[a] = f.p[i];
        if (f.p[i] > max[a]) max[a] = f.p[i];
      }
    for (let a = 0; a < d; a++)
      if (!Number.isFinite(min[a])) {
        min[a] = 0;
        max[a] = 0;
      }
    const round = (v: number) => Number(v.toPrecision(7));
    return {
      fps: this.fps / this.stride,
      dims: d,
      startTime: Number.isFinite(this.start) ? round(this.start) : 0,
      bounds: { min: min.map(round), max: max.map(round) },
      tracks: this.trackList,
      frames: this.raw.map((f) => ({
        t: round(f.t),
        ids: f.ids,
        q: f.p.map((v, i) => {
          const a = i % d;
          const span = max[a] - min[a];
          return span > 0 ? Math.round(((v - min[a]) / span) * 65535) : 0;
        }),
      })),
    };
  }
}
