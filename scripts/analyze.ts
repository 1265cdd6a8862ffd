// CLI: npm run analyze -- FILE [--map k=v…] [--units mm] [--fps 100] [--dims 3] [--json out.json]
// Exit codes: 0 ok, 1 invalid file, 2 usage error.
import { writeFileSync } from 'node:fs';
import { stat } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { analyzeFile } from '../server/ingest/analyze-file';
import { STANDARD_COLUMNS, type ColumnMapping, type StandardColumn } from '../shared/engine/columns';
import type { ResultDocument } from '../shared/engine/result-document';
import type { EngineSettings, LengthUnit } from '../shared/engine/settings';

const USAGE = `Usage: npm run analyze -- FILE [options]
  --map k=v        map a standard column to a header name or 0-based index (repeatable), e.g. --map x=Xpos --map track_id=0
  --units U        m | cm | mm | px (default m, or from a header like "x (mm)")
  --pixel-scale S  metres per pixel (with --units px)
  --fps F          frames per second
  --dims D         2 or 3
  --mode M         full (default) | basic
  --no-header      the first line is data
  --set k=v        any engine setting (repeatable), e.g. --set pairDistance=0.01
  --json FILE      write the result document
  --quiet          no progress bar`;

function usage(msg: string): never {
  process.stderr.write(`${msg}\n\n${USAGE}\n`);
  process.exit(2);
}

async function main(): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      allowPositionals: true,
      options: {
        map: { type: 'string', multiple: true },
        set: { type: 'string', multiple: true },
        units: { type: 'string' },
        'pixel-scale': { type: 'string' },
        fps: { type: 'string' },
        dims: { type: 'string' },
        mode: { type: 'string' },
        'no-header': { type: 'boolean' },
        json: { type: 'string' },
        quiet: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    });
  } catch (e) {
    usage((e as Error).message);
  }
  const { values: o, positionals } = parsed;
  if (o.help) {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  if (positionals.length !== 1) usage(positionals.length === 0 ? 'Give one file to analyse.' : 'Give only one file.');
  const file = positionals[0];
  try {
    if (!(await stat(file)).isFile()) usage(`${file} is not a file.`);
  } catch {
    usage(`Cannot open ${file}.`);
  }
  const mapping: ColumnMapping = {};
  for (const m of o.map ?? []) {
    const [k, v] = m.split('=');
    if (!v || !STANDARD_COLUMNS.includes(k as StandardColumn)) usage(`--map ${m}: expected k=v with k one of ${STANDARD_COLUMNS.join(', ')}`);
    mapping[k as StandardColumn] = /^\d+$/.test(v) ? Number(v) : v;
  }
  const settings: Partial<EngineSettings> = {};
  const num = (name: string, v: string | undefined) => {
    if (v === undefined) return undefined;
    const n = Number(v);
    if (!Number.isFinite(n)) usage(`--${name} ${v}: not a number`);
    return n;
  };
  if (o.units !== undefined) {
    if (!['m', 'cm', 'mm', 'px'].includes(o.units)) usage(`--units ${o.units}: expected m, cm, mm or px`);
    settings.units = o.units as LengthUnit;
  }
  settings.pixelScale = num('pixel-scale', o['pixel-scale']) ?? null;
  if (o.fps !== undefined) settings.fps = num('fps', o.fps);
  if (o.dims !== undefined) {
    if (o.dims !== '2' && o.dims !== '3') usage(`--dims ${o.dims}: expected 2 or 3`);
    settings.dims = Number(o.dims) as 2 | 3;
  }
  if (o.mode !== undefined) {
    if (o.mode !== 'full' && o.mode !== 'basic') usage(`--mode ${o.mode}: expected full or basic`);
    settings.mode = o.mode;
  }
  for (const kv of o.set ?? []) {
    const [k, v] = kv.split('=');
    if (v === undefined) usage(`--set ${kv}: expected k=v`);
    (settings as Record<string, unknown>)[k] = v === 'null' ? null : Number.isFinite(Number(v)) ? Number(v) : v;
  }
  const { size } = await stat(file);
  const showProgress = !o.quiet && size > 20e6;
  let lastDraw = 0;
  const doc = await analyzeFile(file, { settings, mapping, hasHeader: o['no-header'] ? false : null }, (p) => {
    if (!showProgress) return;
    const now = Date.now();
    if (now - lastDraw < 200) return;
    lastDraw = now;
    const frac = Math.min(1, p.bytesIn / p.totalBytes);
    const width = 30;
    const bar = '#'.repeat(Math.round(frac * width)).padEnd(width, '.');
    process.stderr.write(`\r[${bar}] ${(frac * 100).toFixed(0).padStart(3)} %  ${p.rows.toLocaleString('en-US')} rows`);
  });
  if (showProgress) process.stderr.write('\n');
  if (o.json) writeFileSync(o.json, JSON.stringify(doc));
  process.stdout.write(renderSummary(doc));
  return doc.status === 'ok' ? 0 : 1;
}

const f = (v: number | null | undefined, digits = 4) => (v === null || v === undefined ? '—' : Math.abs(v) >= 1e5 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(digits - 1) : Number(v.toPrecision(digits)).toString());

/** Human-readable summary table with warnings and errors. */
export function renderSummary(doc: ResultDocument): string {
  const out: string[] = [];
  const p = doc.parameters;
  out.push(`Cohesia trajectory engine ${doc.engineVersion} — ${doc.input.name ?? 'input'} (${doc.input.compression === 'gzip' ? 'gzip, ' : ''}${doc.input.bytes.toLocaleString('en-US')} bytes)`);
  out.push(`status: ${doc.status.toUpperCase()}   dims ${p.dims}, ${f(p.fps)} fps, units ${p.units}, mode ${p.mode}`);
  const s = doc.summary;
  if (s) {
    const rows: [string, string, string][] = [
      ['rows / tracks / frames', `${s.rows.toLocaleString('en-US')} / ${s.tracks} / ${s.frames}`, ''],
      ['duration', f(s.durationS), 's'],
      ['individuals per frame (min/mean/max)', `${f(s.individualsPerFrame.min)} / ${f(s.individualsPerFrame.mean)} / ${f(s.individualsPerFrame.max)}`, ''],
      ['track duration (mean/median/max)', `${f(s.trackDurationS.mean)} / ${f(s.trackDurationS.median)} / ${f(s.trackDurationS.max)}`, 's'],
      ['group size R (RMS radius)', f(s.radius.mean), 'm'],
      ...s.velocity.components.map((c): [string, string, string] => [`${c.name} mean / sd / skew / kurtosis`, `${f(c.mean)} / ${f(c.standardDeviation)} / ${f(c.skewness, 3)} / ${f(c.kurtosis, 3)}`, 'm/s']),
      ['speed mean / sd', `${f(s.velocity.speed.mean)} / ${f(s.velocity.speed.standardDeviation)}`, 'm/s'],
      ['polarization (random-heading baseline)', `${f(s.polarization.mean, 3)} (${f(s.polarization.randomHeadingsBaseline, 3)})`, ''],
    ];
    if (s.milling) rows.push(['milling', f(s.milling.mean, 3), '']);
    if (s.nearestNeighbour) rows.push(['nearest neighbour mean / median', `${f(s.nearestNeighbour.mean)} / ${f(s.nearestNeighbour.median)}`, 'm']);
    if (s.springConstant) rows.push(['spring constant K ± SE (R²)', `${f(s.springConstant.throughOrigin.springConstant)} ± ${f(s.springConstant.throughOrigin.standardError, 2)} (${f(s.springConstant.throughOrigin.rSquared, 3)})`, '1/s²']);
    if (s.autocorrelation) rows.push(['velocity autocorrelation 1/e time / zero crossing', `${f(s.autocorrelation.eFoldingTimeS)} / ${f(s.autocorrelation.firstZeroCrossingS)}`, 's']);
    if (s.pairs) rows.push(['transient pairs (d*) / paired fraction', `${s.pairs.events} (${f(s.pairs.distanceThreshold)} m) / ${f(s.pairs.pairedFraction, 3)}`, '']);
    const w = Math.max(...rows.map((r) => r[0].length));
    for (const [k, v, u] of rows) out.push(`  ${k.padEnd(w)}  ${v}${u ? ` ${u}` : ''}`);
  }
  for (const e of doc.validation.errors) out.push(`ERROR ${e.kind}: ${e.message}${e.count > 1 ? ` (${e.count.toLocaleString('en-US')} rows in all)` : ''}`);
  for (const e of doc.validation.warnings) out.push(`warning ${e.kind}: ${e.message}${e.count > 1 ? ` (${e.count.toLocaleString('en-US')} in all)` : ''}`);
  return out.join('\n') + '\n';
}

main().then(
  (code) => process.exit(code),
  (e) => {
    process.stderr.write(`Unexpected failure: ${(e as Error).stack ?? e}\n`);
    process.exit(1);
  },
);
