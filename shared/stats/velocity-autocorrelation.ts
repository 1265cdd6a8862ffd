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
 * "Computer simulation of liquids", Allen & Tildesley 1987]. Memory: one ring
 * buffer of maxLag/originStride + 1 origin velocities per active track.
 * Units: dimensionless; lag in frames. Self-contained (nothing outside its
 * arguments and built-ins): a worker runs its source text
 * (server/ingest/parse-offload.ts).
 */
export function createAutocorrelationAccumulator(maxLag: number, originStride = 1): AutocorrelationAccumulator {
  const M = maxLag + 1;
  const stride = Math.max(1, Math.floor(originStride));
  // Only origin samples are ever looked back at: a ring of P origins per track. Flat arrays, origin-major
  // (slot o of ring r at o·cap + r), so one origin's samples of a frame's tracks sit close together.
  const P = Math.floor(maxLag / stride) + 1;
  const sums = new Float64Array(M);
  const pairs = new Float64Array(M);
  let cap = 0;
  let V = new Float64Array(0); // velocity of origin slot o of ring r at 3 (o cap + r)
  let F = new Float64Array(0); // its frame (NaN: empty)
  let last = new Float64Array(0); // last frame seen per ring
  let owner: number[] = []; // track key per ring (NaN: free)
  const free: number[] = [];
  // Ring per track key: dense array for small non-negative integer keys (the engine's track indices), Map otherwise.
  let dense = new Int32Array(0);
  const sparse = new Map<number, number>();
  let active = 0;
  const slots = new Int32Array(P + 1), lags = new Int32Array(P + 1), origins = new Float64Array(P + 1);
  let rowRing = new Int32Array(0), ux = new Float64Array(0), uy = new Float64Array(0), uz = new Float64Array(0);

  const newRing = (key: number, frame: number): number => {
    if (free.length === 0) {
      const grown = Math.max(64, 2 * cap);
      const V2 = new Float64Array(3 * grown * P), F2 = new Float64Array(grown * P).fill(NaN);
      for (let o = 0; o < P; o++) {
        F2.set(F.subarray(o * cap, (o + 1) * cap), o * grown);
        V2.set(V.subarray(3 * o * cap, 3 * (o + 1) * cap), 3 * o * grown);
      }
      V = V2;
      F = F2;
      const l2 = new Float64Array(grown).fill(NaN);
      l2.set(last);
      last = l2;
      for (let r = grown - 1; r >= cap; r--) free.push(r);
      cap = grown;
    }
    const r = free.pop()!;
    for (let o = 0; o < P; o++) F[o * cap + r] = NaN;
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
  const acc: AutocorrelationAccumulator = {
    add(track, frame, vx, vy, vz) {
      acc.addFrame(frame, [track], [vx], [vy], [vz], 1);
    },
    addFrame(frame, track, vx, vy, vz, count) {
      const phase = ((frame % stride) + stride) % stride;
      const origin0 = frame - phase;
      const slot0 = (((origin0 / stride) % P) + P) % P;
      if (rowRing.length < count) {
        rowRing = new Int32Array(2 * count);
        ux = new Float64Array(2 * count);
        uy = new Float64Array(2 * count);
        uz = new Float64Array(2 * count);
      }
      let m = 0;
      for (let i = 0; i < count; i++) {
        const a = vx[i], b = vy[i], c = vz[i];
        if (!Number.isFinite(a) || !Number.isFinite(b) || !Number.isFinite(c)) continue;
        const r = ringOf(track[i], frame);
        last[r] = frame;
        if (phase === 0) {
          const q = slot0 * cap + r;
          V[3 * q] = a;
          V[3 * q + 1] = b;
          V[3 * q + 2] = c;
          F[q] = frame;
        }
        rowRing[m] = r;
        ux[m] = a;
        uy[m] = b;
        uz[m] = c;
        m++;
      }
      // Origins in reach of this frame, the same for every row: one pass over the rows per origin (hot loop,
      // maxLag/stride products per sample; closure arrays copied to locals so the loop keeps them in registers).
      const Fl = F, Vl = V, rr = rowRing, xs = ux, ys = uy, zs = uz, width = cap;
      for (let origin = origin0, lag = phase, o = slot0; lag <= maxLag; origin -= stride, lag += stride) {
        let sum = 0, n = 0;
        const base = o * width;
        for (let k = 0; k < m; k++) {
          const q = base + rr[k];
          if (Fl[q] !== origin) continue;
          const q3 = 3 * q;
          sum += xs[k] * Vl[q3] + ys[k] * Vl[q3 + 1] + zs[k] * Vl[q3 + 2];
          n++;
        }
        sums[lag] += sum;
        pairs[lag] += n;
        if (--o < 0) o = P - 1;
      }
    },
    evictBefore(frame) {
      for (let r = 0; r < cap; r++) {
        if (!(last[r] < frame)) continue;
        const key = owner[r];
        if (key >= 0 && key < dense.length && dense[key] === r) dense[key] = -1;
        else sparse.delete(key);
        last[r] = NaN;
        free.push(r);
        active--;
      }
    },
    result() {
      const rho = new Float64Array(M).fill(NaN);
      const c0 = pairs[0] > 0 ? sums[0] / pairs[0] : NaN;
      for (let l = 0; l < M; l++) if (pairs[l] > 0 && c0 > 0) rho[l] = sums[l] / pairs[l] / c0;
      return { rho, pairs: pairs.slice() };
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
