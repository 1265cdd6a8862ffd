import { quantileSorted } from '../stats/index';
import type { StandardColumn } from './columns';
import type { TrackSummary } from './frame-pipeline';
import type { FrameStatistics } from './frame-statistics';
import { IssueCollector, type Issue } from './issues';
import type { QuickLook } from './quick-look';
import { ENGINE_VERSION, type EngineSettings } from './settings';
import type { FileLayout } from './text-parser';

export const RESULT_SCHEMA_ID = 'https://cohesia.example/schemas/ingest-result.schema.json';
export const RESULT_SCHEMA_VERSION = 1;

export interface InputDescription {
  name: string | null;
  compression: 'none' | 'gzip';
  bytes: number;
  layout: FileLayout | null;
  mapping: Partial<Record<StandardColumn, string>>;
}

type Summary = ReturnType<FrameStatistics['summary']>;

/**
 * The result of one ingest (JSON; schema in schemas/ingest-result.schema.json).
 * Numbers that are undefined (NaN) are written as null.
 */
export interface ResultDocument {
  $schema: string;
  schemaVersion: number;
  engineVersion: string;
  status: 'ok' | 'invalid';
  input: {
    name: string | null;
    compression: 'none' | 'gzip';
    bytes: number;
    delimiter: string | null;
    decimalSeparator: string | null;
    hasHeader: boolean | null;
    header: string[] | null;
    bom: boolean | null;
    lineEnding: 'LF' | 'CRLF' | null;
    mapping: Partial<Record<StandardColumn, string>>;
  };
  parameters: EngineSettings & { dims: 2 | 3; fps: number | null; kernelHalfLength: number | null; identitySwapDistance: number | null; metresPerUnit: number };
  validation: { ok: boolean; errors: Issue[]; warnings: Issue[] };
  summary: (Summary['scalars'] & {
    tracks: number;
    trackDurationS: { mean: number | null; median: number | null; max: number | null };
    kinematics: { derivedVelocity: boolean; derivedAcceleration: boolean; velocityMismatch: number | null };
  }) | null;
  series: Summary['series'] | null;
  pairs: {
    events: { a: string; b: string; startS: number; endS: number; durationS: number; meanSeparation: number; oscillationFrequencyHz: number | null }[];
  } | null;
  quickLook: QuickLook | null;
}

/** Replaces NaN and ±Infinity by null, deeply, and rounds to 7 significant digits (compact, enough for plots). */
export function toJsonSafe<T>(value: T): T {
  const walk = (v: unknown): unknown => {
    if (typeof v === 'number') return Number.isFinite(v) ? (Number.isInteger(v) ? v : Number(v.toPrecision(7))) : null;
    if (Array.isArray(v) || ArrayBuffer.isView(v)) return Array.from(v as ArrayLike<unknown>, walk);
    if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).filter(([, x]) => x !== undefined).map(([k, x]) => [k, walk(x)]));
    return v;
  };
  return walk(value) as T;
}

export function buildResultDocument(p: {
  settings: EngineSettings;
  dims: 2 | 3;
  fps: number;
  input: InputDescription;
  issues: IssueCollector;
  stats: FrameStatistics | null;
  tracks: (TrackSummary | undefined)[];
  trackNames: string[];
  failed: boolean;
  kinematicsMismatch: number;
}): ResultDocument {
  const { settings: s, stats, input } = p;
  const { errors, warnings } = p.issues.list();
  const ok = !p.failed && errors.length === 0 && stats !== null;
  const l = input.layout;
  let summary: ResultDocument['summary'] = null;
  let series: ResultDocument['series'] = null;
  let pairs: ResultDocument['pairs'] = null;
  const tracks = p.tracks.filter((t): t is TrackSummary => t !== undefined);
  const haveCols = (k: string[]) => k.every((c) => l?.columns[c as StandardColumn] !== undefined);
  const givenV = haveCols(p.dims === 3 ? ['vx', 'vy', 'vz'] : ['vx', 'vy']);
  const givenA = haveCols(p.dims === 3 ? ['ax', 'ay', 'az'] : ['ax', 'ay']);
  if (ok && stats) {
    const sum = stats.summary(tracks.length);
    const durations = Float64Array.from(tracks, (t) => (t.lastFrame - t.firstFrame + 1) / p.fps).sort();
    let total = 0;
    for (const d of durations) total += d;
    summary = {
      tracks: tracks.length,
      ...sum.scalars,
      trackDurationS: {
        mean: durations.length ? total / durations.length : NaN,
        median: quantileSorted(durations, 0.5),
        max: durations.length ? durations[durations.length - 1] : NaN,
      },
      kinematics: { derivedVelocity: s.mode === 'full' && !givenV, derivedAcceleration: s.mode === 'full' && !givenA, velocityMismatch: p.kinematicsMismatch },
    };
    series = sum.series;
    if (s.mode === 'full')
      pairs = {
        events: stats.pairEvents.map((e) => ({
          a: p.trackNames[e.a],
          b: p.trackNames[e.b],
          startS: e.startFrame / p.fps,
          endS: (e.endFrame + 1) / p.fps,
          durationS: (e.endFrame - e.startFrame + 1) / p.fps,
          meanSeparation: e.meanSeparation,
          oscillationFrequencyHz: e.oscillationFrequency,
        })),
      };
  }
  const doc: ResultDocument = {
    $schema: RESULT_SCHEMA_ID,
    schemaVersion: RESULT_SCHEMA_VERSION,
    engineVersion: ENGINE_VERSION,
    status: ok ? 'ok' : 'invalid',
    input: {
      name: input.name,
      compression: input.compression,
      bytes: input.bytes,
      delimiter: l?.delimiter ?? null,
      decimalSeparator: l?.decimalSeparator ?? null,
      hasHeader: l?.hasHeader ?? null,
      header: l?.header ?? null,
      bom: l?.bom ?? null,
      lineEnding: l?.lineEnding ?? null,
      mapping: input.mapping,
    },
    parameters: {
      ...s,
      dims: p.dims,
      fps: Number.isFinite(p.fps) ? p.fps : s.fps,
      kernelHalfLength: s.kernelHalfLength ?? Math.ceil(3 * s.kernelWidth),
      identitySwapDistance: stats?.resolvedSwapDistance ?? s.identitySwapDistance,
      metresPerUnit: s.units === 'px' ? (s.pixelScale ?? NaN) : { m: 1, cm: 0.01, mm: 0.001 }[s.units],
    },
    validation: { ok: errors.length === 0, errors, warnings },
    summary,
    series,
    pairs,
    quickLook: ok && stats?.quickLook ? stats.quickLook.result() : null,
  };
  return toJsonSafe(doc);
}
