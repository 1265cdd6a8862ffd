/** Version of the computation; stored in every result so old results can be recomputed. */
export const ENGINE_VERSION = '1.2.0';

export type LengthUnit = 'm' | 'cm' | 'mm' | 'px';
export type Axis = 'x' | 'y' | 'z';

/**
 * Every parameter of the ingest, with its default. The resolved settings
 * are stored in the result document (`parameters`).
 */
export interface EngineSettings {
  /** Unit of positions in the file (velocities in units/s, accelerations in units/s²). */
  units: LengthUnit;
  /** Metres per pixel when units = 'px'. */
  pixelScale: number | null;
  /** Frames per second; null = estimated from a time column. */
  fps: number | null;
  /** 2 or 3; null = 3 if a z column is mapped, else 2. */
  dims: 2 | 3 | null;
  /** Axis along gravity (for labels; the statistics are rotation-invariant). */
  gravityAxis: Axis | null;
  /** 'full' = every statistic; 'basic' = counts, centroid, speed, polarization only. */
  mode: 'full' | 'basic';

  /** Gaussian kernel width w in frames (SCIENCE.md: 1.5 [memory]). */
  kernelWidth: number;
  /** Kernel half-length L in frames; null = ceil(3w). */
  kernelHalfLength: number | null;
  /** Relative RMS difference between given and derived velocities above which a warning is raised. */
  kinematicsMismatchLimit: number;
  /**
   * Given velocities are compared with the kernel-derived ones on frames this many seconds apart (every
   * round(interval × fps)-th frame; 0 = every frame): the mismatch is an RMS over many samples, which a strided
   * sample estimates as well [common practice] at a fraction of the cost. Accelerations use every frame.
   */
  kinematicsCheckInterval: number;

  /** Speed between consecutive frames (m/s) above which a jump is reported (not clipped). */
  jumpSpeedLimit: number;
  /** Tracks shorter than this many frames are reported. */
  minTrackFrames: number;
  /**
   * Two tracks closer than this (m) are reported as a possible identity swap; null = identitySwapFactor × the
   * median nearest-neighbour distance of the calibration frames (the value used is stored in the result).
   */
  identitySwapDistance: number | null;
  /**
   * Fraction of the median nearest-neighbour distance used when identitySwapDistance is null. For a group without
   * interactions (ideal gas) P(d < f·median) ≈ 0.69 f³ per individual and frame (derived), so 0.01 gives about one
   * chance warning per 1.4 million individual-frames sampled, while a doubled track sits at the tracking noise.
   */
  identitySwapFactor: number;
  /** Frames with fewer individuals than this are reported (swarm statistics from ~10 individuals, J. R. Soc. Interface 11, 2014). */
  minIndividuals: number;

  /** Radial bins (profiles, speed vs distance, spring constant): bin count before auto-range growth. */
  radialBins: number;
  /** Minimum samples for a radial bin to enter the spring-constant fit. */
  springFitMinCount: number;
  /** Bins of the plotted histograms. */
  histogramBins: number;

  /** Largest autocorrelation lag, seconds. */
  autocorrelationMaxLag: number;
  /**
   * Time origins every this many frames (cost control): ρ(τ) up to the maximum lag is averaged over origins
   * t = 0, s, 2s, … of every track — the standard strided-origin estimator ("Computer simulation of liquids",
   * Allen & Tildesley 1987); the estimate is unbiased, and origins 0.05 s apart at 100 fps lose little because
   * successive origins are strongly correlated. Cost: maxLag/stride products per sample.
   */
  autocorrelationOriginStride: number;

  /** d* in metres; null = pairDistanceFactor × median nearest-neighbour distance of the first calibration frames. */
  pairDistance: number | null;
  pairDistanceFactor: number;
  pairCalibrationFrames: number;
  /** τ*, seconds (SCIENCE.md: 1 s [memory]). */
  pairMinDuration: number;
  /** Pair events kept in the result (the count is always exact). */
  maxPairEvents: number;

  /**
   * Nearest-neighbour statistics (distribution, mean series, identity-swap check) are taken on frames this many
   * seconds apart (every round(interval × fps)-th frame; 0 = every frame): successive frames at 100 fps are
   * strongly correlated, so a strided sample estimates the same per-frame distribution [common practice] at a
   * fraction of the cost. Close pairs (transient pairs) and the calibration of d* use every frame.
   */
  neighbourSampleInterval: number;
  /** Method for nearest neighbours and close pairs; 'auto' picks brute force below bruteForceBelow. */
  neighbourMethod: 'auto' | 'brute' | 'grid';
  bruteForceBelow: number;

  /** Points per plotted time series (downsampled by bucket means). */
  seriesPoints: number;
  /** Quick-look sample: seconds and frames per second. */
  quickLookSeconds: number;
  quickLookFps: number;

  /** Rows held to reorder a file not sorted by frame; larger unsorted files are refused ("unsorted"). */
  maxReorderRows: number;
  /** Longest accepted line, bytes. */
  maxLineBytes: number;
  /** Rows listed per issue (the count is always exact). */
  maxIssueRows: number;
  /** After an error, stop reading after this many error rows. */
  maxErrorRows: number;
}

export const DEFAULT_SETTINGS: Readonly<EngineSettings> = Object.freeze({
  units: 'm',
  pixelScale: null,
  fps: null,
  dims: null,
  gravityAxis: null,
  mode: 'full',
  kernelWidth: 1.5,
  kernelHalfLength: null,
  kinematicsMismatchLimit: 0.5,
  kinematicsCheckInterval: 0.04,
  jumpSpeedLimit: 30,
  minTrackFrames: 11,
  identitySwapDistance: null,
  identitySwapFactor: 0.01,
  minIndividuals: 10,
  radialBins: 24,
  springFitMinCount: 20,
  histogramBins: 60,
  autocorrelationMaxLag: 2,
  autocorrelationOriginStride: 5,
  pairDistance: null,
  pairDistanceFactor: 0.5,
  pairCalibrationFrames: 100,
  pairMinDuration: 1,
  maxPairEvents: 2000,
  neighbourSampleInterval: 0.04,
  neighbourMethod: 'auto',
  bruteForceBelow: 260,
  seriesPoints: 500,
  quickLookSeconds: 5,
  quickLookFps: 20,
  maxReorderRows: 500_000,
  maxLineBytes: 1 << 20,
  maxIssueRows: 20,
  maxErrorRows: 1000,
} satisfies EngineSettings);

/** Defaults overlaid with the caller's choices (undefined entries keep the default). */
export function resolveSettings(partial: Partial<EngineSettings> = {}): EngineSettings {
  const out: EngineSettings = { ...DEFAULT_SETTINGS };
  for (const [k, v] of Object.entries(partial)) if (v !== undefined) (out as unknown as Record<string, unknown>)[k] = v;
  return out;
}

/** Metres per file unit. */
export function metresPerUnit(units: LengthUnit, pixelScale: number | null): number {
  switch (units) {
    case 'm':
      return 1;
    case 'cm':
      return 0.01;
    case 'mm':
      return 0.001;
    case 'px':
      return pixelScale ?? NaN;
  }
}
