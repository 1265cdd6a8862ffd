/** Streaming estimator of the velocity autocorrelation over many tracks. */
export interface AutocorrelationAccumulator {
  /**
   * Adds the velocity of `track` at integer `frame`. Frames of one track must
   * arrive in increasing order; a gap simply leaves the skipped lags out.
   * Non-finite velocities are skipped.
   */
  add(track: number, frame: number, vx: number, vy: number, vz: number): void;
  /**
   * Adds the velocities of one frame: rows [0, count) of `track`, `vx`, `vy`, `vz` (the same products as
   * {@link add} row by row, summed per lag over the frame first: equal up to rounding).
   */
  addFrame(frame: number, track: ArrayLike<number>, vx: ArrayLike<number>, vy: ArrayLike<number>, vz: ArrayLike<number>, count: number): void;
  /** Frees the ring buffers of tracks last seen before `frame` (bounded memory). */
  evictBefore(frame: number): void;
  /** ρ(τ) for τ = 0..maxLag frames (NaN where no pair of samples). */
  result(): { rho: Float64Array; pairs: Float64Array };
  readonly activeTracks: number;
}

/**
 * Creates a streaming velocity-autocorrelation estimator
 * ρ(τ) = ⟨v_i(t)·v_i(t+τ)⟩ / ⟨|v_i|²⟩ over tracks i and time origins t.
 *
 * Method: SCIENCE.md; time origins are every `originStride`-th frame
 * (frame % originStride === 0) to bound the cost at maxLag/originStride
 * products per sample — an unbiased subsample of origins [common practice,
 * "Computer simulation of liquids", Allen & Tildesley 1987].
 * Layout: each active track keeps its last samples in time order, a window of
 * B + maxLag frames with B = maxLag + 1 (velocity x, y, z interleaved, and a
 * 0/1 weight; a missing or non-finite sample is a zero of weight 0). Once the
 * window is full, the products of its first B frames as origins with every
 * lag are added, one sequential loop per origin, and the window moves on by B
 * frames: the hot loop reads contiguous memory with no branch per product
 * (gaps add zeros), and the pair counts of a window without gaps are counted
 * per origin, not per product. Same sums as a loop over frames, in another
 * order. Memory: 4 (2 maxLag + 1) numbers per active track. Units:
 * dimensionless; lag in frames. Self-contained (nothing outside its
 * arguments and built-ins): a worker runs its source text
 * (server/ingest/parse-offload.ts).
 */
export function createAutocorrelationAccumulator(maxLag: number, originStride = 1): AutocorrelationAccumulator {
  const M = maxLag + 1;
  const stride = Math.max(1, Math.floor(originStride));
  const B = M; // origins completed per window move
  const C = B + maxLag; // window length (frames)
  const sums = new Float64Array(M);
  const pairs = new Float64Array(M);
  // Origins of gap-free windows whose longest lag is l (pairs[τ] gets the count of those with l ≥ τ at the end).
  const reach = new Float64Array(M);
  let cap = 0;
  let V = new Float64Array(0); // window of ring r at 3 r C (x, y, z per frame)
  let Wt = new Uint8Array(0); // weights of ring r at r C
  let base = new Float64Array(0); // frame of window index 0 per ring
  let len = new Int32Array(0); // window indices in use per ring
  let valid = new Int32Array(0); // weight-1 samples among them
  let last = new Float64Array(0); // last frame seen per ring (NaN: free)
  const owner: number[] = []; // track key per ring
  const free: number[] = [];
  // Ring per track key: dense array for small non-negative integer keys (the engine's track indices), Map otherwise.
  let dense = new Int32Array(0);
  const sparse = new Map<number, number>();
  let active = 0;

  /** Adds the products of origins at window indices [0, upto) of ring r (lags within the window's data). */
  const flush = (r: number, upto: number, S: Float64Array, P: Float64Array, R: Float64Array): void => {
    // Integer hints (| 0): the frame base is a double, and double indices would slow the hot loop down ~2×.
    const n = len[r] | 0, o = (3 * r * C) | 0, ow = (r * C) | 0;
    const v = V, w = Wt;
    const gapFree = valid[r] === n;
    const phase = (((base[r] % stride) + stride) % stride) | 0;
    for (let i = phase === 0 ? 0 : stride - phase; i < upto; i += stride) {
      if (w[ow + i] === 0) continue;
      const qi = o + 3 * i;
      const ox = v[qi], oy = v[qi + 1], oz = v[qi + 2];
      const lmax = Math.min(maxLag, n - 1 - i) | 0;
      // Hot loop: one origin against every lag, contiguous reads.
      for (let l = 0, q = qi; l <= lmax; l++, q += 3) S[l] += ox * v[q] + oy * v[q + 1] + oz * v[q + 2];
      if (gapFree) R[lmax]++;
      else for (let l = 0, q = ow + i; l <= lmax; l++, q++) P[l] += w[q];
    }
  };
  /** Moves ring r's window on by `by` frames (origins before it must be flushed). */
  const shift = (r: number, by: number): void => {
    const n = len[r], o = 3 * r * C, ow = r * C;
    const keep = Math.max(0, n - by);
    for (let q = ow, e = ow + Math.min(by, n); q < e; q++) valid[r] -= Wt[q];
    if (keep > 0) {
      V.copyWithin(o, o + 3 * by, o + 3 * n);
      Wt.copyWithin(ow, ow + by, ow + n);
    }
    V.fill(0, o + 3 * keep, o + 3 * C);
    Wt.fill(0, ow + keep, ow + C);
    len[r] = keep;
    base[r] += by;
  };
  const newRing = (key: number, frame: number): number => {
    if (free.length === 0) {
      const grown = Math.max(16, 2 * cap);
      const V2 = new Float64Array(3 * grown * C), W2 = new Uint8Array(grown * C);
      V2.set(V);
      W2.set(Wt);
      V = V2;
      Wt = W2;
      const b2 = new Float64Array(grown), l2 = new Int32Array(grown), v2 = new Int32Array(grown), t2 = new Float64Array(grown).fill(NaN);
      b2.set(base);
      l2.set(len);
      v2.set(valid);
      t2.set(last);
      base = b2;
      len = l2;
      valid = v2;
      last = t2;
      for (let r = grown - 1; r >= cap; r--) free.push(r);
      cap = grown;
    }
    const r = free.pop()!;
    V.fill(0, 3 * r * C, 3 * (r + 1) * C);
    Wt.fill(0, r * C, (r + 1) * C);
    base[r] = frame;
    len[r] = 0;
    valid[r] = 0;
    last[r] = frame;
    owner[r] = key;
    active++;
    return r;
  };
  const ringOf = (key: number, frame: number): number => {
    if (key >= 0 && key < 16777216 && (key | 0) === key) {
      if (key >= dense.length) {
        const g = new Int32Array(Math.max(key + 1, 2 * dense.length)).fill(-1);
        g.set(dense);
        dense = g;
      }
      let r = dense[key];
      if (r < 0) dense[key] = r = newRing(key, frame);
      return r;
    }
    let r = sparse.get(key);
    if (r === undefined) sparse.set(key, (r = newRing(key, frame)));
    return r;
  };
  /** pairs[τ] plus the gap-free origins reaching τ or further. */
  const pairCounts = (P: Float64Array, R: Float64Array): Float64Array => {
    const out = P.slice();
    for (let l = M - 1, run = 0; l >= 0; l--) out[l] += run += R[l];
    return out;
  };
  const acc: AutocorrelationAccumulator = {
    add(track, frame, vx, vy, vz) {
      acc.addFrame(frame, [track], [vx], [vy], [vz], 1);
    },
    addFrame(frame, track, vx, vy, vz, count) {
      for (let i = 0; i < count; i++) {
        const a = vx[i], b = vy[i], c = vz[i];
        if (!Number.isFinite(a) || !Number.isFinite(b) || !Number.isFinite(c)) continue;
        const r = ringOf(track[i], frame);
        let k = frame - base[r];
        if (k < len[r] || k < 0) continue; // not after the track's last sample: left out
        while (k >= C) {
          // Window full: its first B origins have every lag; a gap longer than the window skips ahead.
          flush(r, Math.min(B, len[r]), sums, pairs, reach);
          shift(r, len[r] === 0 ? k - maxLag : B);
          k = frame - base[r];
        }
        const q = 3 * (r * C + k);
        V[q] = a;
        V[q + 1] = b;
        V[q + 2] = c;
        Wt[r * C + k] = 1;
        valid[r] += 1;
        len[r] = k + 1;
        last[r] = frame;
      }
    },
    evictBefore(frame) {
      for (let r = 0; r < cap; r++) {
        if (!(last[r] < frame)) continue;
        flush(r, len[r], sums, pairs, reach);
        const key = owner[r];
        if (key >= 0 && key < dense.length && dense[key] === r) dense[key] = -1;
        else sparse.delete(key);
        last[r] = NaN;
        free.push(r);
        active--;
      }
    },
    result() {
      // Tracks still open add their pending origins to copies (the accumulator can go on).
      const S = sums.slice(), P = pairs.slice(), R = reach.slice();
      for (let r = 0; r < cap; r++) if (last[r] === last[r]) flush(r, len[r], S, P, R);
      const counts = pairCounts(P, R);
      const rho = new Float64Array(M).fill(NaN);
      const c0 = counts[0] > 0 ? S[0] / counts[0] : NaN;
      for (let l = 0; l < M; l++) if (counts[l] > 0 && c0 > 0) rho[l] = S[l] / counts[l] / c0;
      return { rho, pairs: counts };
    },
    get activeTracks() {
      return active;
    },
  };
  return acc;
}

/**
 * Velocity autocorrelation ρ(τ) = ⟨v_i(t)·v_i(t+τ)⟩ / ⟨|v_i|²⟩ of a set of
 * tracks sampled on consecutive frames, for τ = 0..maxLag frames.
 *
 * Method: SCIENCE.md; estimator of {@link createAutocorrelationAccumulator}
 * (numerator and denominator averaged over the same origins). Check value:
 * an Ornstein–Uhlenbeck velocity with time constant T gives exp(−τ/T).
 * Units: dimensionless. Each track is `{ vx, vy, vz? }` (vz omitted in 2D);
 * non-finite samples are skipped. Empty input: all NaN.
 */
export function velocityAutocorrelation(
  tracks: ReadonlyArray<{ vx: ArrayLike<number>; vy: ArrayLike<number>; vz?: ArrayLike<number> }>,
  maxLag: number,
  originStride = 1,
): Float64Array {
  const acc = createAutocorrelationAccumulator(maxLag, originStride);
  tracks.forEach((t, k) => {
    for (let i = 0; i < t.vx.length; i++) acc.add(k, i, t.vx[i], t.vy[i], t.vz ? t.vz[i] : 0);
  });
  return acc.result().rho;
}
