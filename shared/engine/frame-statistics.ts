import {
  centroid,
  correlationTimes,
  createAutocorrelationAccumulator,
  createMomentAccumulator,
  createPairTracker,
  idealGasNearestNeighbourDistance,
  milling,
  momentsFromAccumulator,
  nearestNeighbourDistances,
  nearestNeighboursAndPairs,
  pairsWithinDistance,
  polarization,
  PairList,
  SweepOrder,
  quantileSorted,
  randomHeadingPolarization,
  shellVolume,
  springConstantFit,
  type AutocorrelationAccumulator,
  type ClosePairs,
  type FrameView,
  type MomentAccumulator,
  type PairEvent,
  type PairTracker,
} from '../stats/index';
import { GrowableHistogram, SeriesDownsampler } from './growable-histogram';
import { IssueCollector, rowLabel } from './issues';
import { QuickLookSampler } from './quick-look';
import type { EngineSettings } from './settings';

/** Bins of the speed histogram (the component histograms use the setting histogramBins). */
export const SPEED_HISTOGRAM_BINS = 1024;

/** What an autocorrelation factory is told when it may also take the speed and component statistics. */
export interface VelocitySampleSpec {
  componentBins: number;
  speedBins: number;
  dims: 2 | 3;
}

/** Moments of one variable as a {@link MomentAccumulator} reports them. */
export interface MomentState {
  count: number;
  mean: number;
  m2: number;
  m3: number;
  m4: number;
}

/** Speed and component histograms (GrowableHistogram.state) and moments, computed per frame from the samples. */
export interface VelocitySampleStatistics {
  speedHist: { max: number; counts: Float64Array };
  compHist: { max: number; counts: Float64Array }[];
  speed: MomentState;
  comp: MomentState[];
}

/**
 * An autocorrelation accumulator that may also compute the speed and velocity-component histograms and moments
 * of its samples — frame by frame in the same order as {@link FrameStatistics}, so the numbers are identical (a
 * worker thread does it: the main thread is the busier one). Ready with the autocorrelation's result.
 */
export type VelocitySampleAccumulator = AutocorrelationAccumulator & { velocityStatistics?: () => VelocitySampleStatistics };

/** Factory of the velocity autocorrelation (IngestOptions.createAutocorrelation). */
export type AutocorrelationFactory = (maxLag: number, originStride: number, velocity?: VelocitySampleSpec) => VelocitySampleAccumulator;

/** A frame as handed to the statistics: the view plus track indices and file lines. */
export interface EmittedFrame {
  frame: number;
  time: number;
  view: FrameView;
  track: Int32Array;
  line: Int32Array;
}

/** A frame of the calibration period, kept to replay it once d* is known. */
interface CalibrationFrame {
  frame: number;
  time: number;
  track: Int32Array;
  line: Int32Array;
  x: Float64Array;
  y: Float64Array;
  z: Float64Array;
  nn: Float64Array;
  nb: Int32Array;
  /** Whether the frame is one of the nearest-neighbour sample. */
  sampled: boolean;
}

// Channels of the radial histogram.
const R_ALL = 0, R_V = 1, R_SPEED = 2, R_A = 3, R_AR = 4;

/** Accumulates every per-frame statistic of SCIENCE.md in bounded memory. */
export class FrameStatistics {
  frames = 0;
  rows = 0;
  private firstTime = NaN;
  private lastTime = NaN;
  private nMin = Infinity;
  private nMax = 0;
  private readonly nAcc = createMomentAccumulator();
  private readonly radiusAcc = createMomentAccumulator();
  private readonly polAcc = createMomentAccumulator();
  private readonly millAcc = createMomentAccumulator();
  private readonly nnAcc = createMomentAccumulator();
  private readonly baselineAcc = createMomentAccumulator();
  private readonly comp: MomentAccumulator[] = [createMomentAccumulator(), createMomentAccumulator(), createMomentAccumulator()];
  private readonly speedAcc = createMomentAccumulator();
  private readonly compHist: GrowableHistogram[];
  private readonly speedHist: GrowableHistogram;
  private readonly nnHist: GrowableHistogram;
  private readonly radial: GrowableHistogram;
  private readonly series: Record<string, SeriesDownsampler> = {};
  private readonly acf: VelocitySampleAccumulator | null;
  /** Speed and component histograms and moments come from the autocorrelation accumulator (a worker). */
  private readonly remoteVelocity: boolean;
  private remoteLoaded = false;
  private readonly acfMaxLag: number;
  private pairTracker: PairTracker | null = null;
  private pairDistance: number | null;
  private readonly calibration: { nn: number[]; frames: CalibrationFrame[] } = { nn: [], frames: [] };
  /** Nearest neighbours are taken on every nnStride-th frame (setting neighbourSampleInterval). */
  private readonly nnStride: number;
  private swapDistance = 0;
  /** Identity-swap distance in use (metres): the setting, or identitySwapFactor × median NN distance once calibrated. */
  resolvedSwapDistance: number | null;
  private readonly sweep = new SweepOrder();
  private readonly pairList = new PairList();
  /** Per-frame scratch: speeds and velocity components of the rows with a finite speed. */
  private speedBuf: Float64Array[] = [new Float64Array(0)];
  private trackBuf = new Int32Array(0);
  /** Per-frame scratch: the finite nearest-neighbour distances. */
  private nnFinite = new Float64Array(0);
  readonly pairEvents: PairEvent[] = [];
  pairEventCount = 0;
  private pairedTracks = new Set<number>();
  private nnScratch = new Float64Array(0);
  private nbScratch = new Int32Array(0);
  private densityFrames = 0;
  readonly quickLook: QuickLookSampler | null;
  private swapSeen = new Set<number>();
  private fewFrames = 0;

  constructor(
    private readonly s: EngineSettings,
    private readonly dims: 2 | 3,
    private readonly fps: number,
    private readonly issues: IssueCollector,
    private readonly trackNames: string[],
    createAutocorrelation: AutocorrelationFactory = createAutocorrelationAccumulator,
  ) {
    const full = s.mode === 'full';
    this.compHist = [0, 1, 2].map(() => new GrowableHistogram(s.histogramBins, 1, true));
    this.speedHist = new GrowableHistogram(SPEED_HISTOGRAM_BINS, 1, false);
    this.nnHist = new GrowableHistogram(1024, 1, false);
    this.radial = new GrowableHistogram(s.radialBins, 5, false);
    for (const k of ['individuals', 'cx', 'cy', 'cz', 'radius', 'meanSpeed', 'polarization', 'milling', 'meanNearestNeighbour'])
      this.series[k] = new SeriesDownsampler(s.seriesPoints);
    this.acfMaxLag = Math.max(1, Math.round(s.autocorrelationMaxLag * fps));
    this.acf = full ? createAutocorrelation(this.acfMaxLag, s.autocorrelationOriginStride, { componentBins: s.histogramBins, speedBins: SPEED_HISTOGRAM_BINS, dims }) : null;
    this.remoteVelocity = typeof this.acf?.velocityStatistics === 'function';
    this.pairDistance = s.pairDistance;
    this.nnStride = Math.max(1, Math.round(s.neighbourSampleInterval * fps));
    this.resolvedSwapDistance = s.identitySwapDistance;
    if (full && this.pairDistance !== null) this.startPairs(this.pairDistance);
    this.quickLook = full ? new QuickLookSampler(s.quickLookSeconds, s.quickLookFps, fps, dims) : null;
  }

  private startPairs(d: number): void {
    this.pairDistance = d;
    this.pairTracker = createPairTracker({ maxDistance: d, minDurationFrames: Math.max(1, Math.round(this.s.pairMinDuration * this.fps)), fps: this.fps });
  }

  add(f: EmittedFrame): void {
    const { view, track } = f;
    const n = view.count;
    const full = this.s.mode === 'full';
    const dims = this.dims;
    this.frames++;
    this.rows += n;
    if (!(this.firstTime === this.firstTime)) this.firstTime = f.time;
    this.lastTime = f.time;
    if (n < this.nMin) this.nMin = n;
    if (n > this.nMax) this.nMax = n;
    this.nAcc.add(n);
    if (full && n < this.s.minIndividuals) {
      this.fewFrames++;
      this.issues.add('few-individuals', () => `${rowLabel(f.line[0])}: frame ${f.frame} holds only ${n} individual${n === 1 ? '' : 's'}; group statistics need about ${this.s.minIndividuals} or more (J. R. Soc. Interface 11, 2014).`, f.line[0]);
    }
    const c = centroid(view);
    const t = f.time;
    this.series.individuals.add(t, n);
    this.series.cx.add(t, c.x);
    this.series.cy.add(t, c.y);
    this.series.cz.add(t, c.z);
    const { x, y, z } = view;
    const vx = view.vx!, vy = view.vy!, vz = view.vz!;
    let sumSpeed = 0, nSpeed = 0, r2 = 0, nr = 0;
    const hasV = vx !== undefined;
    const hasA = view.ax !== undefined;
    if (this.speedBuf[0].length < n) {
      this.speedBuf = Array.from({ length: 4 }, () => new Float64Array(2 * n));
      this.trackBuf = new Int32Array(2 * n);
    }
    const [spB, uxB, uyB, uzB] = this.speedBuf;
    const trB = this.trackBuf;
    const three = dims === 3;
    const cx = c.x, cy = c.y, cz = c.z;
    // Loop invariants in locals (the histogram grows its channels in place, so these stay valid).
    const radial = this.radial;
    const [cAll, cV, cSpeed, cA, cAr] = radial.channels;
    const ax = view.ax, ay = view.ay, az = view.az;
    // Hot loop: one pass per row; moments are added per frame from the compacted speed and component columns.
    for (let i = 0; i < n; i++) {
      const dx = x[i] - cx, dy = y[i] - cy, dz = three ? z[i] - cz : 0;
      const rr = dx * dx + dy * dy + dz * dz;
      const r = Math.sqrt(rr);
      if (r === r) {
        r2 += rr;
        nr++;
      }
      let k = -1;
      if (full) {
        k = radial.index(r);
        if (k >= 0) cAll[k]++;
      }
      if (hasV) {
        const ux = vx[i], uy = vy[i], uz = three ? vz[i] : 0;
        const sp = Math.sqrt(ux * ux + uy * uy + uz * uz);
        if (sp === sp) {
          sumSpeed += sp;
          spB[nSpeed] = sp;
          uxB[nSpeed] = ux;
          uyB[nSpeed] = uy;
          uzB[nSpeed] = uz;
          trB[nSpeed] = track[i];
          nSpeed++;
          if (full && k >= 0) {
            cV[k]++;
            cSpeed[k] += sp;
          }
        }
      }
      if (full && hasA && k >= 0 && r > 0) {
        const ar = (ax![i] * dx + ay![i] * dy + (three ? az![i] * dz : 0)) / r;
        if (ar === ar) {
          cA[k]++;
          cAr[k] += ar;
        }
      }
    }
    const remote = this.remoteVelocity;
    if (nSpeed > 0 && full) {
      if (!remote) {
        this.speedHist.addCounts(spB, nSpeed);
        this.compHist[0].addCounts(uxB, nSpeed);
        this.compHist[1].addCounts(uyB, nSpeed);
        if (three) this.compHist[2].addCounts(uzB, nSpeed);
      }
      this.acf!.addFrame(f.frame, trB, uxB, uyB, uzB, nSpeed);
    }
    if (nSpeed > 0 && !remote) {
      this.speedAcc.addBatch(spB, nSpeed);
      this.comp[0].addBatch(uxB, nSpeed);
      this.comp[1].addBatch(uyB, nSpeed);
      if (three) this.comp[2].addBatch(uzB, nSpeed);
    }
    const radius = nr > 0 ? Math.sqrt(r2 / nr) : NaN;
    this.radiusAcc.add(radius);
    this.series.radius.add(t, radius);
    this.series.meanSpeed.add(t, nSpeed > 0 ? sumSpeed / nSpeed : NaN);
    const phi = polarization(view);
    this.polAcc.add(phi);
    this.series.polarization.add(t, phi);
    if (phi === phi) this.baselineAcc.add(randomHeadingPolarization(n, dims));
    if (!full) return;
    this.densityFrames++;
    const om = milling(view, c);
    this.millAcc.add(om);
    this.series.milling.add(t, om);
    this.neighbours(f);
    this.quickLook!.add(f, this.trackNames);
    if (this.frames % 512 === 0) this.acf!.evictBefore(f.frame - 1);
  }

  /**
   * Nearest neighbours (on every `nnStride`-th frame, and on every calibration frame) and close pairs (every
   * frame: a pair must stay below d* on consecutive frames). For small groups one brute-force pass gives both.
   */
  private neighbours(f: EmittedFrame): void {
    const { view, track } = f;
    const n = view.count;
    if (this.nnScratch.length < n) {
      this.nnScratch = new Float64Array(2 * n);
      this.nbScratch = new Int32Array(2 * n);
    }
    const calibrating = !this.pairTracker;
    const sampled = calibrating || this.frames % this.nnStride === 1 % this.nnStride;
    const d = this.pairDistance ?? 0;
    const method = this.s.neighbourMethod;
    const brute = method === 'brute' || (method === 'auto' && n < this.s.bruteForceBelow);
    let nn: Float64Array | null = null;
    let pairs: ClosePairs | null = null;
    if (sampled && !calibrating && brute && d > 0) {
      pairs = nearestNeighboursAndPairs(view, d, this.nnScratch, this.nbScratch, this.pairList);
      nn = this.nnScratch;
    }
    if (sampled && !nn) nn = nearestNeighbourDistances(view, { method, bruteForceBelow: this.s.bruteForceBelow, out: this.nnScratch, neighbour: this.nbScratch });
    if (nn && !calibrating) this.addNearest(f, n, nn, this.nbScratch, this.swapDistance);
    if (calibrating) {
      // Calibrate d* (and the identity-swap distance) on the first frames, keeping what is needed to replay them.
      for (let i = 0; i < n; i++) if (nn![i] === nn![i]) this.calibration.nn.push(nn![i]);
      this.calibration.frames.push({
        frame: f.frame,
        time: f.time,
        track: track.slice(0, n),
        line: f.line.slice(0, n),
        x: Float64Array.from(view.x as ArrayLike<number>).subarray(0, n),
        y: Float64Array.from(view.y as ArrayLike<number>).subarray(0, n),
        z: Float64Array.from(view.z as ArrayLike<number>).subarray(0, n),
        nn: nn!.slice(0, n),
        nb: this.nbScratch.slice(0, n),
        sampled: this.frames % this.nnStride === 1 % this.nnStride,
      });
      if (this.calibration.frames.length >= this.s.pairCalibrationFrames) this.calibrate();
      return;
    }
    this.pairFrame(f.frame, view, track, pairs);
  }

  /** Adds one frame's nearest-neighbour distances to the statistics and checks for identity swaps. */
  private addNearest(f: { frame: number; time: number; track: Int32Array; line: Int32Array }, n: number, d: Float64Array, nb: Int32Array, swap: number): void {
    const { track, line } = f;
    let s = 0, k = 0;
    if (this.nnFinite.length < n) this.nnFinite = new Float64Array(2 * n);
    const finite = this.nnFinite;
    for (let i = 0; i < n; i++) {
      const di = d[i];
      if (!(di === di)) continue;
      s += di;
      finite[k++] = di;
      if (di < swap) {
        const j = nb[i];
        const a = Math.min(track[i], track[j]), b = Math.max(track[i], track[j]);
        const key = a * 4294967296 + b;
        if (i < j || nb[j] !== i) {
          if (!this.swapSeen.has(key) && this.swapSeen.size < 100000) this.swapSeen.add(key);
          this.issues.add(
            'identity-swap',
            () => `${rowLabel(line[i])}: tracks ${this.trackNames[track[i]]} and ${this.trackNames[track[j]]} are only ${(di * 1000).toPrecision(2)} mm apart at frame ${f.frame} — possibly one animal tracked twice, or swapped identities.`,
            line[i],
          );
        }
      }
    }
    // Per frame, as the speeds: moments by two-pass + merge, histogram counts in order.
    this.nnAcc.addBatch(finite, k);
    this.nnHist.addCounts(finite, k);
    this.series.meanNearestNeighbour.add(f.time, k > 0 ? s / k : NaN);
  }

  private calibrate(): void {
    const sorted = Float64Array.from(this.calibration.nn).sort();
    const med = quantileSorted(sorted, 0.5);
    this.startPairs(med > 0 ? this.s.pairDistanceFactor * med : 0);
    this.swapDistance = this.s.identitySwapDistance ?? (med > 0 ? this.s.identitySwapFactor * med : 0);
    this.resolvedSwapDistance = this.swapDistance;
    for (const cf of this.calibration.frames) {
      if (cf.sampled) this.addNearest(cf, cf.track.length, cf.nn, cf.nb, this.swapDistance);
      this.pairFrame(cf.frame, { count: cf.track.length, dims: this.dims, x: cf.x, y: cf.y, z: cf.z }, cf.track, null);
    }
    this.calibration.frames = [];
    this.calibration.nn = [];
  }

  private pairFrame(frame: number, view: FrameView, track: Int32Array, given: ClosePairs | null): void {
    const d = this.pairDistance!;
    if (!(d > 0)) return;
    const p = given ?? pairsWithinDistance(view, d, { method: this.s.neighbourMethod, bruteForceBelow: this.s.bruteForceBelow, sweep: this.sweep, list: this.pairList });
    const a = new Int32Array(p.count), b = new Int32Array(p.count);
    for (let k = 0; k < p.count; k++) {
      a[k] = track[p.a[k]];
      b[k] = track[p.b[k]];
    }
    this.record(this.pairTracker!.update(frame, a, b, p.distance, p.count));
  }

  private record(events: PairEvent[]): void {
    for (const e of events) {
      this.pairEventCount++;
      this.pairedTracks.add(e.a);
      this.pairedTracks.add(e.b);
      if (this.pairEvents.length < this.s.maxPairEvents) this.pairEvents.push(e);
    }
  }

  /** Closes streaming state (pairs still open, calibration of short files). */
  finish(): void {
    if (this.s.mode !== 'full') return;
    if (!this.pairTracker && this.calibration.frames.length > 0) this.calibrate();
    if (this.pairTracker) this.record(this.pairTracker.finish());
  }

  /** Summary and plot series; `tracks` is the number of tracks in the file. */
  summary(tracks: number) {
    const full = this.s.mode === 'full';
    this.loadRemoteVelocity();
    const m = (a: MomentAccumulator) => momentsFromAccumulator(a);
    const comps = (this.dims === 3 ? ['vx', 'vy', 'vz'] : ['vx', 'vy']).map((name, i) => {
      const mo = m(this.comp[i]);
      return { name, mean: mo.mean, standardDeviation: mo.standardDeviation, skewness: mo.skewness, kurtosis: mo.kurtosis, count: mo.count };
    });
    const sp = m(this.speedAcc);
    const quant = (h: GrowableHistogram) => ({ p05: h.quantile(0.05), p25: h.quantile(0.25), p50: h.quantile(0.5), p75: h.quantile(0.75), p95: h.quantile(0.95) });
    const nn = m(this.nnAcc);
    // Ideal-gas reference at the mean density N/(4π/3 R³·…) is not meaningful for a bounded group; report it at the
    // density of the core: N over the volume of the sphere of radius R (the RMS radius).
    const R = m(this.radiusAcc).mean;
    const N = m(this.nAcc).mean;
    const coreDensity = this.dims === 3 ? N / ((4 / 3) * Math.PI * R ** 3) : N / (Math.PI * R * R);
    const rad = this.radialSummary();
    const acfRes = this.acf ? this.acf.result() : null;
    const lagStep = 1 / this.fps;
    const acfTimes = acfRes ? correlationTimes(acfRes.rho, lagStep) : { firstZeroCrossing: NaN, eFoldingTime: NaN };
    const pol = m(this.polAcc);
    const mil = m(this.millAcc);
    return {
      scalars: {
        frames: this.frames,
        rows: this.rows,
        durationS: this.frames > 0 ? this.lastTime - this.firstTime + 1 / this.fps : 0,
        individualsPerFrame: { min: this.frames > 0 ? this.nMin : NaN, mean: m(this.nAcc).mean, max: this.frames > 0 ? this.nMax : NaN },
        radius: { mean: R, standardDeviation: m(this.radiusAcc).standardDeviation },
        velocity: {
          components: comps,
          speed: { mean: sp.mean, standardDeviation: sp.standardDeviation, skewness: sp.skewness, kurtosis: sp.kurtosis, count: sp.count, quantiles: full ? quant(this.speedHist) : null },
        },
        polarization: { mean: pol.mean, standardDeviation: pol.standardDeviation, randomHeadingsBaseline: m(this.baselineAcc).mean },
        milling: full ? { mean: mil.mean, standardDeviation: mil.standardDeviation } : null,
        nearestNeighbour: full
          ? { mean: nn.mean, standardDeviation: nn.standardDeviation, median: this.nnHist.quantile(0.5), idealGasMeanAtCoreDensity: idealGasNearestNeighbourDistance(coreDensity, this.dims) }
          : null,
        springConstant: full ? rad.fit : null,
        autocorrelation: full ? { firstZeroCrossingS: acfTimes.firstZeroCrossing, eFoldingTimeS: acfTimes.eFoldingTime, maxLagS: this.acfMaxLag / this.fps } : null,
        pairs: full
          ? {
              distanceThreshold: this.pairDistance,
              minDurationS: this.s.pairMinDuration,
              events: this.pairEventCount,
              eventsListed: this.pairEvents.length,
              pairedFraction: tracks > 0 ? this.pairedTracks.size / tracks : NaN,
            }
          : null,
      },
      series: {
        time: Object.fromEntries(Object.entries(this.series).filter(([k]) => full || !['milling', 'meanNearestNeighbour'].includes(k)).map(([k, v]) => [k, v.result()])),
        histograms: full
          ? {
              ...Object.fromEntries(comps.map((c, i) => [c.name, this.histogramSeries(this.compHist[i])])),
              speed: this.histogramSeries(this.speedHist, this.s.histogramBins),
              nearestNeighbour: this.histogramSeries(this.nnHist, this.s.histogramBins),
            }
          : null,
        profiles: full ? rad.profiles : null,
        autocorrelation: acfRes ? { lagS: Array.from(acfRes.rho, (_, i) => i * lagStep), rho: Array.from(acfRes.rho) } : null,
      },
    };
  }

  /** Takes over the speed and component statistics computed with the autocorrelation (fresh accumulators here). */
  private loadRemoteVelocity(): void {
    if (!this.remoteVelocity || this.remoteLoaded) return;
    this.remoteLoaded = true;
    const v = this.acf!.velocityStatistics!();
    this.speedHist.load(v.speedHist);
    v.compHist.forEach((h, i) => this.compHist[i].load(h));
    this.speedAcc.merge(v.speed as MomentAccumulator);
    v.comp.forEach((m, i) => this.comp[i].merge(m as MomentAccumulator));
  }

  /** Normalised histogram (density) over the used range, re-binned to about `bins` bins. */
  private histogramSeries(h: GrowableHistogram, bins?: number) {
    const [a, b] = h.usedRange(0);
    if (a < 0) return { edges: [], density: [] };
    const e = h.edges();
    const c = h.channels[0];
    const group = bins ? Math.max(1, Math.ceil((b - a + 1) / bins)) : 1;
    const edges: number[] = [e[a]];
    const counts: number[] = [];
    for (let i = a; i <= b; i += group) {
      let s = 0;
      for (let j = i; j < Math.min(i + group, b + 1); j++) s += c[j];
      counts.push(s);
      edges.push(e[Math.min(i + group, b + 1)]);
    }
    const total = counts.reduce((x, y) => x + y, 0);
    const density = counts.map((v, i) => v / (total * (edges[i + 1] - edges[i])));
    return { edges, density };
  }

  private radialSummary() {
    const h = this.radial;
    const [, last] = h.usedRange(R_ALL);
    const e = h.edges();
    const nb = last + 1;
    const r: number[] = [], density: number[] = [], speed: number[] = [], speedCount: number[] = [], ar: number[] = [], arCount: number[] = [];
    for (let i = 0; i < nb; i++) {
      r.push((e[i] + e[i + 1]) / 2);
      density.push(h.channels[R_ALL][i] / (Math.max(1, this.densityFrames) * shellVolume(e[i], e[i + 1], this.dims)));
      speedCount.push(h.channels[R_V][i]);
      speed.push(h.channels[R_V][i] > 0 ? h.channels[R_SPEED][i] / h.channels[R_V][i] : NaN);
      arCount.push(h.channels[R_A][i]);
      ar.push(h.channels[R_A][i] > 0 ? h.channels[R_AR][i] / h.channels[R_A][i] : NaN);
    }
    const fit = springConstantFit(r, ar, arCount, this.s.springFitMinCount);
    return {
      fit: {
        throughOrigin: { springConstant: fit.throughOrigin.springConstant, standardError: fit.throughOrigin.standardError, rSquared: fit.throughOrigin.rSquared },
        withIntercept: fit.withIntercept,
        binsUsed: fit.binsUsed,
      },
      profiles: {
        radialDensity: { r, density },
        speedVsDistance: { r, meanSpeed: speed, count: speedCount },
        radialAcceleration: { r, meanRadialAcceleration: ar, count: arCount },
      },
    };
  }
}
