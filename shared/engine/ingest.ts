import { quantileSorted } from '../stats/index';
import type { ColumnMapping } from './columns';
import { FramePipeline } from './frame-pipeline';
import { FrameStatistics } from './frame-statistics';
import { IssueCollector, rowLabel } from './issues';
import { buildResultDocument, type InputDescription, type ResultDocument } from './result-document';
import { DelimitedTextParser, type FileLayout, type RowBatch } from './text-parser';
import { metresPerUnit, resolveSettings, type EngineSettings } from './settings';

export interface IngestOptions {
  settings?: Partial<EngineSettings>;
  /** Explicit column mapping (standard name → header name or 0-based index). */
  mapping?: ColumnMapping;
  /** Force header detection (default: a first line without numbers is a header). */
  hasHeader?: boolean | null;
  /** Description of the source, copied into the result. */
  source?: { name?: string; compression?: 'none' | 'gzip'; bytes?: number };
}

/** An ingest in progress: feed bytes with push(), then call end(). */
export interface Ingest {
  push(chunk: Uint8Array): void;
  /** Finishes the computation and returns the result document. */
  end(): ResultDocument;
  /** Records a problem of the byte source (e.g. a broken gzip stream) and stops. */
  fail(kind: 'corrupt-gzip' | 'read-failed', message: string): void;
  /** True once an error stopped the reading (the caller may stop reading too). */
  readonly stopped: boolean;
  readonly rowsRead: number;
  readonly bytesRead: number;
}

const NUM = ['frame', 't', 'x', 'y', 'z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'] as const;
type Num = (typeof NUM)[number];

/** Growable columnar row store used to reorder files that are not sorted by frame. */
class RowStore {
  count = 0;
  cols: Float64Array[] = Array.from({ length: 13 }, () => new Float64Array(4096));
  push(vals: number[]): void {
    if (this.count === this.cols[0].length) {
      this.cols = this.cols.map((c) => {
        const g = new Float64Array(c.length * 2);
        g.set(c);
        return g;
      });
    }
    for (let i = 0; i < 13; i++) this.cols[i][this.count] = vals[i];
    this.count++;
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
  const lastKey: number[] = [];
  let store: RowStore | null = new RowStore();
  let storeSorted = true;
  let storeLastKey = -Infinity;
  let pipeline: FramePipeline | null = null;
  let stats: FrameStatistics | null = null;
  let fps = NaN;
  let failed = false;
  let rows = 0;
  const vals = new Array<number>(13).fill(NaN);

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

  function onRows(b: RowBatch): void {
    if (failed) return;
    const v = b.values;
    const col = NUM.map((k) => v[k]);
    const n = b.count;
    for (let i = 0; i < n; i++) {
      const track = b.track[i];
      const line = b.line[i];
      for (let c = 0; c < 11; c++) {
        const a = col[c];
        vals[c + 1] = a ? (c >= 2 ? a[i] * scale : a[i]) : NaN;
      }
      if (dims === 2) vals[5] = 0;
      if (!Number.isFinite(vals[3]) || !Number.isFinite(vals[4]) || (dims === 3 && !Number.isFinite(vals[5]))) continue;
      const key = has.frame ? vals[1] : vals[2];
      const prev = lastKey[track];
      if (prev !== undefined && key <= prev) {
        if (key === prev)
          issues.add('duplicate-frame', () => `${rowLabel(line)}: track ${parser.trackNames[track]} appears twice at ${has.frame ? 'frame' : 'time'} ${key}; the first row is kept.`, line);
        else
          issues.add('time-not-increasing', () => `${rowLabel(line)}: in track ${parser.trackNames[track]}, ${has.frame ? 'frame' : 'time'} ${key} comes after ${prev}; time must increase along a track (rows are reordered when possible).`, line);
      }
      if (prev === undefined || key > prev) lastKey[track] = key;
      vals[0] = track;
      vals[12] = line;
      rows++;
      if (store) {
        if (key < storeLastKey) storeSorted = false;
        storeLastKey = key;
        store.push(vals);
        if (store.count >= s.maxReorderRows) {
          if (!storeSorted) {
            issues.add(
              'unsorted',
              `${rowLabel(line)}: the file is not sorted by ${has.frame ? 'frame' : 'time'} and is too large to reorder in memory (more than ${s.maxReorderRows.toLocaleString('en-US')} rows). Sort it by ${has.frame ? 'frame' : 'time'} (then track) and upload it again.`,
              line,
            );
            failed = true;
            return;
          }
          drainStore();
          if (failed) return;
        }
      } else if (!feed(vals)) {
        failed = true;
        return;
      }
    }
  }

  function startPipeline(st: RowStore): void {
    if (s.fps !== null) fps = s.fps;
    else {
      // Estimate the frame rate from time steps within tracks (median, robust to gaps).
      const steps: number[] = [];
      const lastT = new Map<number, [number, number]>();
      for (let i = 0; i < st.count && steps.length < 20000; i++) {
        const tr = st.cols[0][i], f = st.cols[1][i], t = st.cols[2][i];
        const p = lastT.get(tr);
        if (p) {
          const df = has.frame ? f - p[1] : 1;
          if (t > p[0] && df > 0) steps.push((t - p[0]) / df);
        }
        lastT.set(tr, [t, f]);
      }
      const med = quantileSorted(Float64Array.from(steps).sort(), 0.5);
      if (!(med > 0)) {
        issues.add('missing-frame-rate', 'The frame rate could not be worked out from the time column (no track has two successive times): give the frame rate.', 1);
        failed = true;
        return;
      }
      fps = Number((1 / med).toPrecision(6));
    }
    s.fps = fps;
    stats = new FrameStatistics(s, dims, fps, issues, parser.trackNames);
    pipeline = new FramePipeline(s, dims, fps, has.vx && has.vy && (dims === 2 || has.vz), has.ax && has.ay && (dims === 2 || has.az), issues, parser.trackNames, (f) => stats!.add(f));
  }

  let nonIntegerWarned = false;
  function feed(r: number[]): boolean {
    let frame: number;
    if (has.frame) {
      frame = r[1];
      if (!Number.isInteger(frame)) {
        if (!nonIntegerWarned) nonIntegerWarned = true;
        issues.add('non-integer-frame', () => `${rowLabel(r[12])}: the frame number ${r[1]} is not a whole number; it is rounded.`, r[12]);
        frame = Math.round(frame);
      }
    } else frame = Math.round(r[2] * fps);
    const ok = pipeline!.push(r[0], frame, r[3], r[4], dims === 3 ? r[5] : 0, r[6], r[7], dims === 3 ? r[8] : 0, r[9], r[10], dims === 3 ? r[11] : 0, r[12]);
    if (!ok)
      issues.add(
        'unsorted',
        `${rowLabel(r[12])}: frame ${frame} comes after a later frame: the file is not sorted by ${has.frame ? 'frame' : 'time'}, and files of more than ${s.maxReorderRows.toLocaleString('en-US')} rows must be. Sort it by ${has.frame ? 'frame' : 'time'} (then track) and upload it again.`,
        r[12],
      );
    return ok;
  }

  function drainStore(): void {
    const st = store!;
    store = null;
    startPipeline(st);
    if (failed) return;
    const order = new Uint32Array(st.count);
    for (let i = 0; i < st.count; i++) order[i] = i;
    if (!storeSorted) {
      const key = has.frame ? st.cols[1] : st.cols[2];
      const tr = st.cols[0];
      // Stable sort by (frame, track, file order).
      order.sort((a, b) => key[a] - key[b] || tr[a] - tr[b] || a - b);
    }
    const r = new Array<number>(13);
    for (let k = 0; k < st.count; k++) {
      const i = order[k];
      for (let c = 0; c < 13; c++) r[c] = st.cols[c][i];
      if (!feed(r)) {
        failed = true;
        return;
      }
    }
  }

  return {
    push(chunk) {
      bytes += chunk.length;
      if (failed || parser.stopped) return;
      parser.push(chunk);
      if (issues.hasErrors) failed = true;
    },
    fail(kind, message) {
      issues.add(kind, message, undefined);
      failed = true;
    },
    end() {
      if (!failed && !parser.stopped) parser.end();
      if (issues.hasErrors) failed = true;
      if (!failed && store) drainStore();
      if (!failed && pipeline) {
        pipeline.finish();
        stats!.finish();
      }
      if (issues.hasErrors) failed = true;
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
