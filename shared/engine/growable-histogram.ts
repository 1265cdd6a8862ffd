/**
 * Fixed-count histogram whose range grows by doubling: it covers [0, max)
 * (or [−max, max) when symmetric) with 2B bins; a value beyond the range
 * merges bins pairwise, so memory stays fixed without a first pass over the
 * data. Each bin holds several additive channels (counts, sums).
 */
export class GrowableHistogram {
  max = 0;
  readonly size: number;
  readonly channels: Float64Array[];
  outside = 0;

  constructor(bins: number, channelCount: number, readonly symmetric: boolean) {
    this.size = 2 * Math.max(1, Math.floor(bins));
    this.channels = Array.from({ length: channelCount }, () => new Float64Array(this.size));
  }

  /** Lower edge and bins per unit of the current range (kept in step with max). */
  private lo = 0;
  private scale = 0;

  /** Bin index for v (growing the range if needed), or −1 for non-finite v. */
  index(v: number): number {
    // Common case first: inside the current range (NaN fails the test).
    if ((v < 0 ? -v : v) < this.max) {
      const k = Math.floor((v - this.lo) * this.scale);
      return k < this.size ? (k < 0 ? 0 : k) : this.size - 1;
    }
    return this.indexSlow(v);
  }

  private indexSlow(v: number): number {
    if (!Number.isFinite(v)) return -1;
    const a = Math.abs(v);
    if (this.max === 0) {
      if (a === 0) return this.symmetric ? this.size / 2 : 0;
      // Start with a power-of-two range so growth stays on round numbers.
      this.max = Math.pow(2, Math.ceil(Math.log2(a * 1.25)));
    }
    while (a >= this.max) this.grow();
    this.lo = this.symmetric ? -this.max : 0;
    this.scale = this.size / (this.max - this.lo);
    const k = Math.floor((v - this.lo) * this.scale);
    return Math.min(this.size - 1, Math.max(0, k));
  }

  /** Counts values[0..count) in channel 0 (same as add(v, 0, 1) for each). */
  addCounts(values: ArrayLike<number>, count: number): void {
    const c = this.channels[0];
    for (let i = 0; i < count; i++) {
      const k = this.index(values[i]);
      if (k >= 0) c[k]++;
    }
  }

  /** Range and channel-0 counts, to carry the histogram to another thread (see {@link load}). */
  state(): { max: number; counts: Float64Array } {
    return { max: this.max, counts: this.channels[0].slice() };
  }

  /** Takes over a {@link state} of a histogram made with the same arguments (range and scale computed as in grow). */
  load(st: { max: number; counts: Float64Array }): void {
    this.max = st.max;
    this.lo = this.symmetric ? -this.max : 0;
    this.scale = this.max > 0 ? this.size / (this.max - this.lo) : 0;
    this.channels[0].set(st.counts);
  }

  add(v: number, channel: number, w: number): void {
    const k = this.index(v);
    if (k >= 0) this.channels[channel][k] += w;
  }

  private grow(): void {
    const n = this.size;
    for (const c of this.channels) {
      if (this.symmetric) {
        // Outer halves fold inward: bins [0, n) map to [n/4, 3n/4).
        const merged = new Float64Array(n);
        for (let i = 0; i < n; i++) merged[n / 4 + (i >> 1)] += c[i];
        c.set(merged);
      } else {
        for (let i = 0; i < n / 2; i++) c[i] = c[2 * i] + c[2 * i + 1];
        c.fill(0, n / 2);
      }
    }
    this.max *= 2;
    this.lo = this.symmetric ? -this.max : 0;
    this.scale = this.size / (this.max - this.lo);
  }

  /** Bin edges (size + 1) in the values' units. */
  edges(): Float64Array {
    const lo = this.symmetric ? -this.max : 0;
    const w = (this.max - lo) / this.size;
    return Float64Array.from({ length: this.size + 1 }, (_, i) => lo + i * w);
  }

  /** Range [first, last] of non-empty bins of a channel (−1 if empty). */
  usedRange(channel: number): [number, number] {
    const c = this.channels[channel];
    let a = -1, b = -1;
    for (let i = 0; i < c.length; i++)
      if (c[i] !== 0) {
        if (a < 0) a = i;
        b = i;
      }
    return [a, b];
  }

  /** Type-7-like quantile from the counts of `channel` by linear interpolation within bins. */
  quantile(p: number, channel = 0): number {
    const c = this.channels[channel];
    let total = 0;
    for (let i = 0; i < c.length; i++) total += c[i];
    if (!(total > 0) || !(p >= 0 && p <= 1)) return NaN;
    const target = p * total;
    const e = this.edges();
    let acc = 0;
    for (let i = 0; i < c.length; i++) {
      if (acc + c[i] >= target && c[i] > 0) return e[i] + ((target - acc) / c[i]) * (e[i + 1] - e[i]);
      acc += c[i];
    }
    return e[e.length - 1];
  }
}

/**
 * Bounded time series for plots: bucket means over runs of frames; when the
 * buckets exceed the capacity, neighbours merge and the run length doubles.
 */
export class SeriesDownsampler {
  private t: number[] = [];
  private y: number[] = [];
  private n: number[] = [];
  private every = 1;
  private pending = { t: 0, y: 0, n: 0, count: 0 };

  constructor(private readonly capacity: number) {}

  add(t: number, y: number): void {
    const p = this.pending;
    p.count++;
    if (Number.isFinite(y)) {
      p.t += t;
      p.y += y;
      p.n++;
    }
    if (p.count >= this.every) this.commit();
  }

  private commit(): void {
    const p = this.pending;
    if (p.count === 0) return;
    if (p.n > 0) {
      this.t.push(p.t / p.n);
      this.y.push(p.y / p.n);
      this.n.push(p.n);
    }
    this.pending = { t: 0, y: 0, n: 0, count: 0 };
    if (this.t.length >= this.capacity) {
      const t: number[] = [], y: number[] = [], n: number[] = [];
      for (let i = 0; i < this.t.length; i += 2) {
        const j = Math.min(i + 1, this.t.length - 1);
        const w = j === i ? this.n[i] : this.n[i] + this.n[j];
        t.push(j === i ? this.t[i] : (this.t[i] * this.n[i] + this.t[j] * this.n[j]) / w);
        y.push(j === i ? this.y[i] : (this.y[i] * this.n[i] + this.y[j] * this.n[j]) / w);
        n.push(w);
      }
      this.t = t;
      this.y = y;
      this.n = n;
      this.every *= 2;
    }
  }

  result(): { t: number[]; y: number[] } {
    this.commit();
    return { t: this.t.slice(), y: this.y.slice() };
  }
}
