// npm run bench [-- --rows 6000000] — not part of npm test. See README section in the result report.
import { execFileSync } from 'node:child_process';
import { mkdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { createSeededRandom } from '../../shared/engine/seeded-random';
import { nearestNeighbourDistances, pairsWithinDistance, type FrameView } from '../../shared/stats/index';
import { DEFAULT_SETTINGS } from '../../shared/engine/settings';
import { generateBenchFile, gzipFile } from './generate';
import { catalogueSearchBench, printCatalogueSearch } from './catalogue-search';
import { loadBench, printLoad } from './load';

const { values } = parseArgs({ options: { rows: { type: 'string', default: '6000000' }, dir: { type: 'string', default: '.data/bench' }, only: { type: 'string' } } });
const rows = Number(values.rows);
const dir = values.dir!;
mkdirSync(dir, { recursive: true });
const csv = join(dir, `bench-${rows}.csv`);
const gz = `${csv}.gz`;

interface Line { name: string; kind: string; rows: number; bytes: number; seconds: number; maxRssMB: number; cpuSeconds?: number; threadCpu?: { main: number; otherBusiest: number }; status?: string; check?: unknown }

function measure(name: string, kind: string, file: string, limit?: number): Line {
  const args = ['--import', 'tsx', join(import.meta.dirname, 'measure.ts'), kind, file, ...(limit ? [String(limit)] : [])];
  const out = execFileSync(process.execPath, args, { encoding: 'utf8', maxBuffer: 1 << 20 });
  const r = JSON.parse(out.trim().split('\n').pop()!) as Line;
  r.name = name;
  process.stderr.write(`  ${name}: ${r.seconds.toFixed(2)} s\n`);
  return r;
}

function neighbourBench(n: number, frames: number) {
  const rnd = createSeededRandom(n);
  const make = (): FrameView => {
    const x = new Float64Array(n), y = new Float64Array(n), z = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = rnd.normal() * 0.1;
      y[i] = rnd.normal() * 0.1;
      z[i] = rnd.normal() * 0.1;
    }
    return { count: n, dims: 3, x, y, z };
  };
  const fs = Array.from({ length: frames }, make);
  const out = new Float64Array(n);
  const time = (method: 'brute' | 'grid' | 'auto') => {
    const t0 = performance.now();
    for (const f of fs) {
      const d = nearestNeighbourDistances(f, { method, out });
      let s = 0;
      for (let i = 0; i < n; i++) s += d[i];
      pairsWithinDistance(f, (0.5 * s) / n, { method });
    }
    return (performance.now() - t0) / frames;
  };
  time('grid');
  time('brute');
  // Best of three interleaved runs: the machine is shared, the minimum is the least disturbed figure.
  const runs = Array.from({ length: 3 }, () => [time('brute'), time('grid'), time('auto')]);
  const [brute, grid, auto] = [0, 1, 2].map((k) => Math.min(...runs.map((r) => r[k])));
  return { n, brute, grid, auto, picks: n >= DEFAULT_SETTINGS.bruteForceBelow ? 'grid' : 'brute', faster: brute <= grid ? 'brute' : 'grid' };
}

async function main() {
  // `--only search`: the catalogue search benchmark alone (10,000 seeded releases, 200 queries over HTTP).
  if (values.only === 'search') return printCatalogueSearch(await catalogueSearchBench({ releases: 10_000, queries: 200 }));
  // `--only load`: autocannon on landing pages, search and file URLs at 200 req/s for 30 s (10,000 releases), on the
  // embedded default and, with COHESIA_BENCH_DATABASE_URL (an admin URL), on a PostgreSQL server too.
  if (values.only === 'load') return loadLines();
  process.stderr.write(`Preparing ${csv} (${rows.toLocaleString('en-US')} rows, cached)…\n`);
  await generateBenchFile(csv, rows);
  await gzipFile(csv, gz);
  const mb = (f: string) => statSync(f).size / 1e6;
  process.stderr.write(`  plain ${mb(csv).toFixed(0)} MB, gzip ${mb(gz).toFixed(0)} MB\nMeasuring (one process per line)…\n`);
  const lines: Line[] = [
    measure('read-bytes (1 MiB)', 'read-bytes', csv),
    measure('gunzip-only', 'gunzip-only', gz),
    measure('parse-floor (2 threads)', 'parse-floor', csv),
    measure('duckdb-basic', 'duckdb-basic', csv),
    measure('duckdb-basic-gz', 'duckdb-basic', gz),
    measure('ours-basic', 'ours-basic', csv),
    measure('ours-basic-gz', 'ours-basic', gz),
    measure('ours-full', 'ours-full', csv),
    measure('ours-full-gz', 'ours-full', gz),
    measure('ours-full (first half)', 'ours-full', csv, 0.5),
  ];
  const by = Object.fromEntries(lines.map((l) => [l.name, l]));
  const header = ['line', 'seconds', 'CPU s', 'main CPU s', 'other thread CPU s', 'rows/s', 'MB/s (text)', 'peak RSS MB', 'status'];
  // CPU s: all threads of the line's process (user + system, DuckDB's threads included), steadier than wall time.
  // main / other thread CPU s: the main thread and the busiest other thread (the worker; Linux): wall time on free
  // cores is at least the larger of the two.
  // MB/s of CSV text: the plain file's size (or the part read) over the time, also for gzip input.
  const textBytes = (l: Line) => (l.name.includes('half') ? l.bytes : statSync(csv).size);
  const table = lines.map((l) => [l.name, l.seconds.toFixed(2), l.cpuSeconds !== undefined ? l.cpuSeconds.toFixed(2) : '—', l.threadCpu ? l.threadCpu.main.toFixed(2) : '—', l.threadCpu ? l.threadCpu.otherBusiest.toFixed(2) : '—', l.rows > 0 ? Math.round(l.rows / l.seconds).toLocaleString('en-US') : '—', (textBytes(l) / 1e6 / l.seconds).toFixed(0), l.maxRssMB.toFixed(0), l.status ?? '']);
  const w = header.map((h, i) => Math.max(h.length, ...table.map((r) => r[i].length)));
  const fmt = (r: string[]) => r.map((c, i) => (i === 0 ? c.padEnd(w[i]) : c.padStart(w[i]))).join('  ');
  console.log(`\nBenchmark: ${rows.toLocaleString('en-US')} rows, ${mb(csv).toFixed(0)} MB CSV, ${mb(gz).toFixed(0)} MB gzip`);
  console.log(fmt(header));
  for (const r of table) console.log(fmt(r));
  const ratio = (a: string, b: string) => by[a].seconds / by[b].seconds;
  const rssHalf = by['ours-full (first half)'].maxRssMB, rssFull = by['ours-full'].maxRssMB;
  const targets: [string, number, string, boolean][] = [
    ['duckdb-basic / ours-basic', ratio('duckdb-basic', 'ours-basic'), '≥ 1.5', ratio('duckdb-basic', 'ours-basic') >= 1.5],
    ['duckdb-basic / ours-full (plain)', ratio('duckdb-basic', 'ours-full'), '≥ 0.7', ratio('duckdb-basic', 'ours-full') >= 0.7],
    ['gunzip-only / ours-full-gz', ratio('gunzip-only', 'ours-full-gz'), '≥ 0.5', ratio('gunzip-only', 'ours-full-gz') >= 0.5],
    ['peak RSS ours-full (MB)', rssFull, '< 300', Math.max(...lines.filter((l) => l.name.startsWith('ours')).map((l) => l.maxRssMB)) < 300],
    ['RSS full / RSS half file', rssFull / rssHalf, '≤ 1.10', rssFull / rssHalf <= 1.1],
  ];
  console.log('\nTargets');
  for (const [k, v, t, ok] of targets) console.log(`  ${k.padEnd(34)} ${v.toFixed(2).padStart(8)}  target ${t.padEnd(7)} ${ok ? 'MET' : 'NOT MET'}`);
  // ours-basic parses the same bytes with the same parser and does more, so it cannot beat the parse floor.
  console.log(`  (duckdb-basic / parse-floor = ${ratio('duckdb-basic', 'parse-floor (2 threads)').toFixed(2)}: the most duckdb-basic / ours-basic can reach with this parser here)`);
  console.log('\nNearest neighbour + close pairs per frame (ms/frame)');
  const nb = [neighbourBench(100, 400), neighbourBench(2000, 40)];
  for (const r of nb)
    console.log(`  N = ${String(r.n).padEnd(5)} brute ${r.brute.toFixed(3)}  spatial index ${r.grid.toFixed(3)}  speed-up ${(r.brute / r.grid).toFixed(1)}×  auto picks ${r.picks} (${r.auto.toFixed(3)}; faster here: ${r.faster})`);
  console.log('\nCross-check (polarization, mean speed):');
  for (const l of lines) if (l.check) console.log(`  ${l.name.padEnd(24)} ${JSON.stringify(l.check)}`);
  printCatalogueSearch(await catalogueSearchBench({ releases: 10_000, queries: 200 }));
  await loadLines();
}

async function loadLines() {
  printLoad(await loadBench({ releases: 10_000, seconds: 30, rate: 200 }));
  const adminUrl = process.env.COHESIA_BENCH_DATABASE_URL;
  if (adminUrl) printLoad(await loadBench({ releases: 10_000, seconds: 30, rate: 200, adminUrl }));
  else console.log('  (set COHESIA_BENCH_DATABASE_URL to an admin URL of a PostgreSQL server to measure it too)');
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
