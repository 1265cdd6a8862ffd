/** Streaming estimator of the velocity autocorrelation over many tracks. */
export interface AutocorrelationAccumulator {
  /**
   * Adds the velocity of `track` at integer `frame`. Frames of one track must
   * arrive in increasing order; a gap simply leaves the skipped lags out.
   * Non-finite velocities are skipped.
   */
  add(track: number, frame: number, vx: number, vy: number, vz: number): void;
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
 * buffer of maxLag + 1 velocities per active track.
 * Units: dimensionless; lag in frames.
 */
export function createAutocorrelationAccumulator(maxLag: number, originStride = 1): AutocorrelationAccumulator {
  const M = maxLag + 1;
  const stride = Math.max(1, Math.floor(originStride));
  const sums = new Float64Array(M);
  const pairs = new Float64Array(M);
  interface Ring {
    v: Float64Array;
    f: Float64Array;
    last: number;
  }
  const rings = new Map<number, Ring>();
  return {
    add(track, frame, vx, vy, vz) {
      if (!Number.isFinite(vx) || !Number.isFinite(vy) || !Number.isFinite(vz)) return;
      let r = rings.get(track);
      if (!r) {
        r = { v: new Float64Array(3 * M), f: new Float64Array(M).fill(NaN), last: frame };
        rings.set(track, r);
      }
      r.last = frame;
      const s = ((frame % M) + M) % M;
      r.v[3 * s] = vx;
      r.v[3 * s + 1] = vy;
      r.v[3 * s + 2] = vz;
      r.f[s] = frame;
      let origin = frame - (((frame % stride) + stride) % stride);
      for (; origin >= frame - maxLag; origin -= stride) {
        const o = ((origin % M) + M) % M;
        if (r.f[o] !== origin) continue;
        const lag = frame - origin;
        sums[lag] += vx * r.v[3 * o] + vy * r.v[3 * o + 1] + vz * r.v[3 * o + 2];
        pairs[lag]++;
      }
    },
    evictBefore(frame) {
      for (const [k, r] of rings) if (r.last < frame) rings.delete(k);
    },
    result() {
      const rho = new Float64Array(M).fill(NaN);
      const c0 = pairs[0] > 0 ? sums[0] / pairs[0] : NaN;
      for (let l = 0; l < M; l++) if (pairs[l] > 0 && c0 > 0) rho[l] = sums[l] / pairs[l] / c0;
      return { rho, pairs: pairs.slice() };
    },
    get activeTracks() {
      return rings.size;
    },
  };
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
