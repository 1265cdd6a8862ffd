import { oscillationFrequency } from './oscillation-frequency';

/** One transient pair: two tracks closer than d* for at least τ*. */
export interface PairEvent {
  /** Track keys, a < b. */
  a: number;
  b: number;
  startFrame: number;
  /** Last frame of the pair (inclusive). */
  endFrame: number;
  /** Mean separation in metres. */
  meanSeparation: number;
  /** Oscillation frequency of the separation in Hz, NaN where it does not oscillate. */
  oscillationFrequency: number;
}

export interface PairTrackerOptions {
  /** d*, metres. */
  maxDistance: number;
  /** τ* in frames (inclusive count of consecutive frames). */
  minDurationFrames: number;
  /** Frames per second, for the oscillation frequency. */
  fps: number;
  /** Separation samples kept per pair for the frequency (longer pairs are decimated). Default 4096. */
  maxSeparationSamples?: number;
}

/** Streaming transient-pair detector fed one frame at a time. */
export interface PairTracker {
  /**
   * Feeds the close pairs (already filtered to separation < d*) of `frame`;
   * frames must increase. Candidates not present in this frame end.
   */
  update(frame: number, a: ArrayLike<number>, b: ArrayLike<number>, separation: ArrayLike<number>, count: number): PairEvent[];
  /** Ends every open candidate and returns the events among them. */
  finish(): PairEvent[];
  readonly openCandidates: number;
}

interface Candidate {
  a: number;
  b: number;
  start: number;
  last: number;
  sum: number;
  n: number;
  series: number[];
  every: number;
}

/**
 * Creates a streaming transient-pair detector: a pair exists while the two
 * individuals' separation stays below d* on consecutive frames for at least
 * τ*; the events carry who, start, end, mean separation and oscillation
 * frequency.
 *
 * Method: SCIENCE.md "Transient pairs" after "Time-frequency analysis
 * reveals pairwise interactions in insect swarms" (Phys. Rev. Lett. 114,
 * 2015); an active-candidate map keyed by the track pair keeps memory
 * proportional to the number of close pairs, not to the file.
 * Units: frames, metres, Hz.
 */
export function createPairTracker(options: PairTrackerOptions): PairTracker {
  const cap = options.maxSeparationSamples ?? 4096;
  const active = new Map<number, Candidate>();
  const close = (c: Candidate, out: PairEvent[]) => {
    if (c.last - c.start + 1 >= options.minDurationFrames) {
      out.push({
        a: c.a,
        b: c.b,
        startFrame: c.start,
        endFrame: c.last,
        meanSeparation: c.sum / c.n,
        oscillationFrequency: oscillationFrequency(c.series, options.fps / c.every),
      });
    }
  };
  return {
    update(frame, a, b, sep, count) {
      const out: PairEvent[] = [];
      for (let k = 0; k < count; k++) {
        const lo = Math.min(a[k], b[k]);
        const hi = Math.max(a[k], b[k]);
        const key = lo * 4294967296 + hi;
        let c = active.get(key);
        if (c && c.last !== frame - 1) {
          active.delete(key);
          close(c, out);
          c = undefined;
        }
        if (!c) {
          c = { a: lo, b: hi, start: frame, last: frame, sum: 0, n: 0, series: [], every: 1 };
          active.set(key, c);
        }
        c.last = frame;
        c.sum += sep[k];
        c.n++;
        if ((frame - c.start) % c.every === 0) c.series.push(sep[k]);
        if (c.series.length >= cap) {
          // Decimate by two to stay bounded; the sampling rate halves.
          c.series = c.series.filter((_, i) => i % 2 === 0);
          c.every *= 2;
        }
      }
      for (const [key, c] of active)
        if (c.last !== frame) {
          active.delete(key);
          close(c, out);
        }
      return out;
    },
    finish() {
      const out: PairEvent[] = [];
      for (const c of active.values()) close(c, out);
      active.clear();
      return out;
    },
    get openCandidates() {
      return active.size;
    },
  };
}

/**
 * Transient pair events of a sequence of frames (batch form of
 * {@link createPairTracker}). Each frame lists track keys and positions;
 * close pairs are found by exact distance (O(N²) per frame — the engine uses
 * the cell list instead).
 * Empty input: no events.
 */
export function transientPairs(
  frames: ReadonlyArray<{ frame: number; ids: ArrayLike<number>; x: ArrayLike<number>; y: ArrayLike<number>; z?: ArrayLike<number> }>,
  options: PairTrackerOptions,
): PairEvent[] {
  const tracker = createPairTracker(options);
  const events: PairEvent[] = [];
  const d2 = options.maxDistance * options.maxDistance;
  for (const f of frames) {
    const a: number[] = [], b: number[] = [], s: number[] = [];
    for (let i = 0; i < f.ids.length; i++)
      for (let j = i + 1; j < f.ids.length; j++) {
        const dx = f.x[j] - f.x[i], dy = f.y[j] - f.y[i], dz = f.z ? f.z[j] - f.z[i] : 0;
        const q = dx * dx + dy * dy + dz * dz;
        if (q < d2) {
          a.push(f.ids[i]);
          b.push(f.ids[j]);
          s.push(Math.sqrt(q));
        }
      }
    events.push(...tracker.update(f.frame, a, b, s, a.length));
  }
  events.push(...tracker.finish());
  return events.sort((p, q) => p.startFrame - q.startFrame || p.a - q.a || p.b - q.b);
}
