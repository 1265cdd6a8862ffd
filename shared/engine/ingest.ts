import { quantileSorted } from '../stats/index';
import type { ColumnMapping } from './columns';
import { FramePipeline } from './frame-pipeline';
import { FrameStatistics, type AutocorrelationFactory } from './frame-statistics';
import { IssueCollector, rowLabel } from './issues';
import { buildResultDocument, type InputDescription, type ResultDocument } from './result-document';
import { DelimitedTextParser, type BlockLayout, type FileLayout, type ParsedBlock, type RowBatch } from './text-parser';
import { metresPerUnit, resolveSettings, type EngineSettings } from './settings';

export interface IngestOptions {
  settings?: Partial<EngineSettings>;
  /** Explicit column mapping (standard name → header name or 0-based index). */
  mapping?: ColumnMapping;
  /** Force header detection (default: a first line without numbers is a header). */
  hasHeader?: boolean | null;
  /** Description of the source, copied into the result. */
  source?: { name?: string; compression?: 'none' | 'gzip'; bytes?: number };
  /**
   * Makes the velocity-autocorrelation accumulator (default: in this thread). A server may compute it in a
   * worker (optionally with the speed and component statistics); its result() must be ready when end() is called.
   */
  createAutocorrelation?: AutocorrelationFactory;
}

/** An ingest in progress: feed bytes with push(), then call end(). */
export interface Ingest {
  push(chunk: Uint8Array): void;
  /** Ends the input: the last rows and frames go through every statistic (end() does it if not done). */
  completeInput(): void;
  /** Finishes the computation and returns the result document. */
  end(): ResultDocument;
  /** Records a problem of the byte source (e.g. a broken gzip stream) and stops. */
  fail(kind: 'corrupt-gzip' | 'read-failed', message: string): void;
  /**
   * For parsing in another thread: the layout once the header is known (null before, after a stop, or for
   * space-separated files), then {@link takeLeftover} once, then whole-line blocks in file order, each either
   * parsed by `parseDataBlock` ({@link pushParsed}) or as bytes ({@link push}).
   */
  blockLayout(): BlockLayout | null;
  /** Bytes after the last line break seen so far; the caller feeds them again at the front of the next block. */
  takeLeftover(): Uint8Array;
  /** Rows of `bytes` bytes of text holding `lines` lines, parsed by `parseDataBlock`. */
  pushParsed(block: ParsedBlock, lines: number, bytes: number): void;
  /** True once an error stopped the reading (the caller may stop reading too). */
  readonly stopped: boolean;
  readonly rowsRead: number;
  readonly bytesRead: number;
}

const NUM = ['frame', 't', 'x', 'y', 'z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'] as const;
type Num = (typeof NUM)[number];

/** Warnings raised downstream of the reorder store: dropped when streamed frames are discarded for a reorder. */
const PIPELINE_ISSUES = ['track-gap', 'speed-jump', 'few-individuals', 'identity-swap', 'non-integer-frame'] as const;

let nanCol = new Float64Array(0);
/** A NaN column of at least n entries (absent columns). */
function nanColumn(n: number): Float64Array {
  if (nanCol.length < n) nanCol = new Float64Array(2 * n).fill(NaN);
  return nanCol;
}

/** Columns of clean rows (scaled to metres, finite positions), as handed to the frame pipeline. */
export interface RowColumns {
  count: number;
  track: Int32Array;
  line: Int32Array;
  /** Frame number or time, as in the file (the sort key). */
  key: Float64Array;
  /** Time column when present (frame-rate estimate), else NaN. */
  t: Float64Array;
  x: Float64Array;
  y: Float64Array;
  z: Float64Array;
  vx: Float64Array;
  vy: Float64Array;
  vz: Float64Array;
  ax: Float64Array;
  ay: Float64Array;
  az: Float64Array;
}

const FLOAT_COLS = ['key', 't', 'x', 'y', 'z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'] as const;

/** Growable {@link RowColumns}: the per-batch clean rows (a batch's columns become a chunk of the reorder store). */
class RowStore implements RowColumns {
  count = 0;
  track = new Int32Array(0);
  line = new Int32Array(0);
  key = new Float64Array(0);
  t = new Float64Array(0);
  x = new Float64Array(0);
  y = new Float64Array(0);
  z = new Float64Array(0);
  vx = new Float64Array(0);
  vy = new Float64Array(0);
  vz = new Float64Array(0);
  ax = new Float64Array(0);
  ay = new Float64Array(0);
  az = new Float64Array(0);

  constructor(capacity = 4096) {
    this.reserve(capacity);
  }

  /** Makes room for `n` rows in all (keeps the content). */
  reserve(n: number): void {
    if (n <= this.track.length) return;
    // ×2: batches vary a little in size; growing rarely keeps the columns in place.
    const cap = Math.max(n, 2 * this.track.length);
    const grow = <T extends Int32Array | Float64Array>(old: T, make: (k: number) => T): T => {
      const g = make(cap);
      g.set(old.subarray(0, this.count));
      return g;
    };
    this.track = grow(this.track, (k) => new Int32Array(k));
    this.line = grow(this.line, (k) => new Int32Array(k));
    for (const c of FLOAT_COLS) this[c] = grow(this[c], (k) => new Float64Array(k));
  }

  /** Appends the first `n` rows of `src`; columns not in `present` are filled (0 for a 2D third axis, else NaN). */
  appendFirst(src: RowColumns, n: number, present: ReadonlySet<string>, dims: 2 | 3): void {
    this.reserve(this.count + n);
    this.track.set(src.track.subarray(0, n), this.count);
    this.line.set(src.line.subarray(0, n), this.count);
    for (const c of FLOAT_COLS)
      if (present.has(c)) this[c].set(src[c].subarray(0, n), this.count);
      else this[c].fill(dims === 2 && c.endsWith('z') ? 0 : NaN, this.count, this.count + n);
    this.count += n;
  }
}

/**
 * Creates a streaming ingest of one trajectory file: parsing, validation,
 * kinematics and every statistic of SCIENCE.md, in memory bounded by the
 * settings (not by the file size). Pure TypeScript, runs in Node and in the
 * browser.
 *
 * Order: files sorted by frame stream through in one pass. Files in any
 * other order (e.g. sorted by track) are reordered in memory when they have
 * at most `maxReorderRows` rows; larger files in another order end with the
 * error "unsorted" (sort them by frame first).
 */
export function createIngest(options: IngestOptions = {}): Ingest {
  const s = resolveSettings(options.settings);
  const issues = new IssueCollector(s.maxIssueRows);
  let bytes = 0;
  let layout: FileLayout | null = null;
  let dims: 2 | 3 = 3;
  let scale = 1;
  let has: Record<Num, boolean> = Object.fromEntries(NUM.map((k) => [k, false])) as Record<Num, boolean>;
  // Last frame/time per track (NaN: not seen), for the duplicate and order checks on arrival.
  let lastKey = new Float64Array(1024).fill(NaN);
  // Rows kept in file order while fewer than maxReorderRows, so that a file found out of order can be reordered:
  // the clean batches themselves (first `count` rows of each), not a growing copy (that copy and its growth
  // cost more than the rest of mode 'basic' on the first 500k rows).
  let store: { rows: RowStore; count: number }[] | null = [];
  let storeCount = 0;
  let storeSorted = true;
  let storeLastKey = -Infinity;
  let clean = new RowStore();
  let frames = new Float64Array(0);
  let pipeline: FramePipeline | null = null;
  let stats: FrameStatistics | null = null;
  let fps = NaN;
  let failed = false;
  let inputComplete = false;
  let rows = 0;
  const settingsProblem = (): string | null => {
    if (s.units === 'px' && !(s.pixelScale !== null && s.pixelScale > 0)) return 'positions are in pixels but no pixel scale (metres per pixel) was given';
    if (!['m', 'cm', 'mm', 'px'].includes(s.units)) return `the unit "${s.units}" is not one of m, cm, mm, px`;
    if (s.fps !== null && !(s.fps > 0)) return `the frame rate must be a positive number of frames per second, not ${s.fps}`;
    if (s.dims !== null && s.dims !== 2 && s.dims !== 3) return `the dimension must be 2 or 3, not ${s.dims}`;
    return null;
  };
  const bad = settingsProblem();
  if (bad) {
    issues.add('invalid-settings', `The settings are not usable: ${bad}.`);
    failed = true;
  }

  const parser = new DelimitedTextParser({
    mapping: options.mapping,
    hasHeader: options.hasHeader,
    maxLineBytes: s.maxLineBytes,
    maxErrorRows: s.maxErrorRows,
    issues,
    onLayout(l) {
      layout = l;
      has = Object.fromEntries(NUM.map((k) => [k, l.columns[k] !== undefined])) as Record<Num, boolean>;
      dims = s.dims ?? (has.z ? 3 : 2);
      if (dims === 3 && !has.z) {
        issues.add('missing-columns', 'The data were declared 3D but no z column was found. Map the z column or declare the data 2D.', 1);
        return false;
      }
      const unit = options.settings?.units ?? l.headerUnit ?? s.units;
      s.units = unit;
      scale = metresPerUnit(unit, s.pixelScale);
      if (!has.t && s.fps === null) {
        issues.add('missing-frame-rate', 'The file has frame numbers but no time column, and no frame rate was given: give the frame rate (frames per second).', 1);
        return false;
      }
      return true;
    },
    onRows: onRows,
  });

  /** Clean columns that can hold something other than NaN (or 0 for the third axis in 2D). */
  let present: Set<string> | null = null;
  function presentColumns(): Set<string> {
    if (present) return present;
    const p = new Set<string>(['key', 'x', 'y']);
    if (has.t) p.add('t');
    for (const k of ['z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'] as const) if (has[k] && (dims === 3 || !k.endsWith('z'))) p.add(k);
    present = p;
    return p;
  }

  /** Validates, converts to metres and compacts one parsed batch into `clean`. */
  function cleanRows(b: RowBatch): void {
    const v = b.values;
    const n = b.count;
    clean.count = 0;
    clean.reserve(n);
    const nan = nanColumn(n);
    const F = has.frame ? v.frame! : v.t!, T = v.t ?? nan;
    const X = v.x!, Y = v.y!, Z = dims === 3 ? v.z! : nan;
    const VX = v.vx ?? nan, VY = v.vy ?? nan, VZ = v.vz ?? nan, AX = v.ax ?? nan, AY = v.ay ?? nan, AZ = v.az ?? nan;
    const c = clean;
    const three = dims === 3;
    // Mode 'basic' uses no accelerations: their clean columns are left unwritten (never read).
    const accelerations = s.mode === 'full';
    let m = 0;
    // Hot loop: one pass per row from the parser's columns into the clean columns.
    for (let i = 0; i < n; i++) {
      const x = X[i] * scale, y = Y[i] * scale, z = three ? Z[i] * scale : 0;
      if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) continue;
      const track = b.track[i];
      const key = F[i];
      if (track >= lastKey.length) {
        const g = new Float64Array(Math.max(track + 1, 2 * lastKey.length)).fill(NaN);
        g.set(lastKey);
        lastKey = g;
      }
      const prev = lastKey[track];
      if (key <= prev) {
        const line = b.line[i];
        if (key === prev)
          issues.add('duplicate-frame', () => `${rowLabel(line)}: track ${parser.trackNames[track]} appears twice at ${has.frame ? 'frame' : 'time'} ${key}; the first row is kept.`, line);
        else
          issues.add('time-not-increasing', () => `${rowLabel(line)}: in track ${parser.trackNames[track]}, ${has.frame ? 'frame' : 'time'} ${key} comes after ${prev}; time must increase along a track (rows are reordered when possible).`, line);
      } else lastKey[track] = key;
      c.track[m] = track;
      c.line[m] = b.line[i];
      c.key[m] = key;
      c.t[m] = T[i];
      c.x[m] = x;
      c.y[m] = y;
      c.z[m] = z;
      c.vx[m] = VX[i] * scale;
      c.vy[m] = VY[i] * scale;
      c.vz[m] = three ? VZ[i] * scale : 0;
      if (accelerations) {
        c.ax[m] = AX[i] * scale;
        c.ay[m] = AY[i] * scale;
        c.az[m] = three ? AZ[i] * scale : 0;
      }
      m++;
    }
    c.count = m;
  }

  function onRows(b: RowBatch): void {
    if (failed) return;
    cleanRows(b);
    const batch = clean;
    const n = batch.count;
    rows += n;
    if (!store) {
      if (!feed(batch, null, 0, n)) failed = true;
      return;
    }
    if (n === 0) return;
    // The first maxReorderRows rows go to the store too (this batch's columns, kept); the order is checked on them.
    const take = Math.min(n, s.maxReorderRows - storeCount);
    if (storeSorted) {
      const key = batch.key;
      for (let i = 0; i < take; i++) {
        if (key[i] < storeLastKey) {
          storeSorted = false;
          break;
        }
        storeLastKey = key[i];
      }
    }
    store.push({ rows: batch, count: take });
    storeCount += take;
    clean = new RowStore(n);
    const full = storeCount >= s.maxReorderRows;
    if (!storeSorted) {
      // Out of order: streamed frames are discarded; the stored rows are reordered at the end (or refused).
      if (pipeline) discardPipeline();
      if (full) {
        const line = batch.line[take - 1];
        issues.add(
          'unsorted',
          `${rowLabel(line)}: the file is not sorted by ${has.frame ? 'frame' : 'time'} and is too large to reorder in memory (more than ${s.maxReorderRows.toLocaleString('en-US')} rows). Sort it by ${has.frame ? 'frame' : 'time'} (then track) and upload it again.`,
          line,
        );
        failed = true;
      }
      return;
    }
    // Sorted so far: stream straight into the pipeline (started once the frame rate is known).
    if (!pipeline) {
      if (!startPipeline(store, full) || failed) return;
      if (!feedStore(store)) return void (failed = true);
    } else if (!feed(batch, null, 0, take)) return void (failed = true);
    if (full) {
      store = null;
      if (take < n && !feed(batch, null, take, n)) failed = true;
    }
  }

  function discardPipeline(): void {
    pipeline = null;
    stats = null;
    issues.clear(PIPELINE_ISSUES);
  }

  /** Median time step within tracks over the first 20,000 steps; `steps` = how many were found. */
  function estimateFrameRate(chunks: { rows: RowColumns; count: number }[]): { fps: number; steps: number } {
    const steps: number[] = [];
    const lastT = new Map<number, [number, number]>();
    for (const { rows: st, count } of chunks)
      for (let i = 0; i < count && steps.length < 20000; i++) {
        const tr = st.track[i], f = st.key[i], t = st.t[i];
        const p = lastT.get(tr);
        if (p) {
          const df = has.frame ? f - p[1] : 1;
          if (t > p[0] && df > 0) steps.push((t - p[0]) / df);
        }
        lastT.set(tr, [t, f]);
      }
    const med = quantileSorted(Float64Array.from(steps).sort(), 0.5);
    return { fps: med > 0 ? Number((1 / med).toPrecision(6)) : NaN, steps: steps.length };
  }

  /** Starts the pipeline once the frame rate is known; with `final`, estimates it from whatever is stored. */
  function startPipeline(st: { rows: RowColumns; count: number }[], final: boolean): boolean {
    if (s.fps !== null) fps = s.fps;
    else {
      const est = estimateFrameRate(st);
      if (est.steps < 20000 && !final) return false;
      if (!(est.fps > 0)) {
        issues.add('missing-frame-rate', 'The frame rate could not be worked out from the time column (no track has two successive times): give the frame rate.', 1);
        failed = true;
        return true;
      }
      fps = est.fps;
    }
    s.fps = fps;
    stats = new FrameStatistics(s, dims, fps, issues, parser.trackNames, options.createAutocorrelation);
    const st2 = stats;
    pipeline = new FramePipeline(s, dims, fps, has.vx && has.vy && (dims === 2 || has.vz), has.ax && has.ay && (dims === 2 || has.az), issues, parser.trackNames, (f) => st2.add(f));
    return true;
  }

  /** Feeds the stored rows in file order; false if one is out of frame order. */
  function feedStore(chunks: { rows: RowColumns; count: number }[]): boolean {
    for (const c of chunks) if (!feed(c.rows, null, 0, c.count)) return false;
    return true;
  }

  /** Feeds rows [from, to) of `c` (through `order` if given) to the pipeline; false if one is out of frame order. */
  function feed(c: RowColumns, order: Uint32Array | null, from: number, to: number): boolean {
    if (frames.length < to - from) frames = new Float64Array(Math.max(to - from, 2 * frames.length));
    for (let k = from; k < to; k++) {
      const i = order ? order[k] : k;
      let frame = c.key[i];
      if (has.frame) {
        if (!Number.isInteger(frame)) {
          const line = c.line[i], raw = frame;
          issues.add('non-integer-frame', () => `${rowLabel(line)}: the frame number ${raw} is not a whole number; it is rounded.`, line);
          frame = Math.round(frame);
        }
      } else frame = Math.round(frame * fps);
      frames[k - from] = frame;
    }
    const bad = pipeline!.pushRows(c, frames, order, from, to);
    if (bad < 0) return true;
    const line = c.line[order ? order[bad] : bad];
    issues.add(
      'unsorted',
      `${rowLabel(line)}: frame ${frames[bad - from]} comes after a later frame: the file is not sorted by ${has.frame ? 'frame' : 'time'}, and files of more than ${s.maxReorderRows.toLocaleString('en-US')} rows must be. Sort it by ${has.frame ? 'frame' : 'time'} (then track) and upload it again.`,
      line,
    );
    return false;
  }

  /** End of input with rows still stored: start (sorted) or reorder and replay them. */
  function drainStore(): void {
    const chunks = store!;
    store = null;
    if (pipeline) return;
    startPipeline(chunks, true);
    if (failed) return;
    if (storeSorted) {
      if (!feedStore(chunks)) failed = true;
      return;
    }
    // Reordered in one piece: the chunks are joined (a file of at most maxReorderRows rows in another order).
    const st = new RowStore(storeCount);
    for (const c of chunks) st.appendFirst(c.rows, c.count, presentColumns(), dims);
    const order = new Uint32Array(st.count);
    for (let i = 0; i < st.count; i++) order[i] = i;
    const key = st.key;
    const tr = st.track;
    // Stable sort by (frame, track, file order).
    order.sort((a, b) => key[a] - key[b] || tr[a] - tr[b] || a - b);
    if (!feed(st, order, 0, st.count)) failed = true;
  }

  return {
    push(chunk) {
      bytes += chunk.length;
      if (failed || parser.stopped) return;
      parser.push(chunk);
      if (issues.hasErrors) failed = true;
    },
    blockLayout() {
      return failed ? null : parser.blockLayout();
    },
    takeLeftover() {
      return parser.takeLeftover();
    },
    pushParsed(block, lines, n) {
      bytes += n;
      if (failed || parser.stopped) return;
      parser.pushParsed(block, lines);
      if (issues.hasErrors) failed = true;
    },
    fail(kind, message) {
      issues.add(kind, message, undefined);
      failed = true;
    },
    completeInput() {
      if (inputComplete) return;
      inputComplete = true;
      if (!failed && !parser.stopped) parser.end();
      if (issues.hasErrors) failed = true;
      if (!failed && store) drainStore();
      if (!failed && pipeline) {
        pipeline.finish();
        stats!.finish();
      }
      if (issues.hasErrors) failed = true;
    },
    end() {
      this.completeInput();
      const input: InputDescription = {
        name: options.source?.name ?? null,
        compression: options.source?.compression ?? 'none',
        bytes: options.source?.bytes ?? bytes,
        layout,
        mapping: layout ? (layout as FileLayout).columnSources : {},
      };
      const tracks = pipeline ? pipeline.tracks : [];
      if (!failed && pipeline) {
        const minF = s.minTrackFrames;
        tracks.forEach((t, i) => {
          if (t && t.lastFrame - t.firstFrame + 1 < minF)
            issues.add('short-track', () => `${rowLabel(t.firstLine)}: track ${parser.trackNames[i]} lasts only ${t.lastFrame - t.firstFrame + 1} frame${t.lastFrame === t.firstFrame ? '' : 's'} (minimum ${minF}); it gets no derivatives and little weight.`, t.firstLine);
        });
        const km = pipeline.kinematicsMismatch;
        if (km > s.kinematicsMismatchLimit)
          issues.add('kinematics-mismatch', `The velocity columns differ from the velocities computed from the positions by ${(km * 100).toFixed(0)} % (RMS). Check the units of the velocity columns and the frame rate.`);
      }
      return buildResultDocument({ settings: s, dims, fps, input, issues, stats: failed ? null : stats, tracks, trackNames: parser.trackNames, failed, kinematicsMismatch: pipeline?.kinematicsMismatch ?? NaN });
    },
    get stopped() {
      return failed || parser.stopped;
    },
    get rowsRead() {
      return rows;
    },
    get bytesRead() {
      return bytes;
    },
  };
}

/** Convenience: ingest a whole in-memory file (tests, browser previews). */
export function analyzeBytes(data: Uint8Array, options: IngestOptions = {}, chunkSize = 1 << 20): ResultDocument {
  const ing = createIngest(options);
  for (let i = 0; i < data.length && !ing.stopped; i += chunkSize) ing.push(data.subarray(i, i + chunkSize));
  return ing.end();
}
