// Load on the read paths with many releases: landing pages, catalogue search and file-URL issuance,
// through autocannon at a fixed request rate against the app in its own process (loopback only).
// Alone: `npm run bench -- --only load`; against a PostgreSQL server: set COHESIA_BENCH_DATABASE_URL
// (an admin URL; a fresh database is made on it), e.g. `bash scripts/with-postgres.sh` sets one up.
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import pg from 'pg';
import { sql } from 'drizzle-orm';
import { openPglite, openPostgres, type Database } from '../../server/db/client';
import { seedCatalogue } from './seed-catalogue';

export type LoadResult = {
  engine: 'pglite' | 'postgres';
  label: string;
  releases: number;
  seconds: number;
  targetRate: number;
  requestsPerSecond: number;
  p50: number;
  p99: number;
  max: number;
  errors: number;
  timeouts: number;
  statusCounts: Record<string, number>;
};

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });

async function adminQuery(url: string, text: string) {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    await c.query(text);
  } finally {
    await c.end();
  }
}

/** Seeds `releases` into a fresh database, starts the app on it, and runs the load mixes. */
export async function loadBench(opts: { releases: number; seconds: number; rate: number; adminUrl?: string }): Promise<LoadResult[]> {
  const dir = mkdtempSync(join(tmpdir(), 'cohesia-bench-load-'));
  let databaseUrl: string | undefined;
  let database: Database;
  if (opts.adminUrl) {
    const name = `cohesia_load_${Date.now().toString(36)}`;
    await adminQuery(opts.adminUrl, `create database ${name}`);
    const u = new URL(opts.adminUrl);
    u.pathname = `/${name}`;
    databaseUrl = u.toString();
    database = await openPostgres(databaseUrl);
  } else {
    database = await openPglite({ dir: join(dir, 'pglite') });
  }
  const engine = database.kind;
  const t0 = performance.now();
  await database.migrate();
  const seeded = await seedCatalogue(database.db, opts.releases);
  const open = (await database.db.execute(sql`select r.suffix, f.file_name from release r join release_file f on f.release_id = r.id where r.access_level = 'open' limit 400`)) as unknown as {
    rows: Array<{ suffix: string; file_name: string }>;
  };
  await database.close();
  process.stderr.write(`  load (${engine}): seeded ${seeded.releases.toLocaleString('en-US')} releases in ${((performance.now() - t0) / 1000).toFixed(1)} s\n`);

  const [port, s3, smtp, capture, registry, payments] = await Promise.all(Array.from({ length: 6 }, freePort));
  const base = `http://127.0.0.1:${port}`;
  // COHESIA_BENCH_PROFILE=DIR writes a CPU profile of the app process there (for finding what to make faster).
  const profile = process.env.COHESIA_BENCH_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.COHESIA_BENCH_PROFILE}`] : [];
  const child = spawn(process.execPath, [...profile, '--openssl-legacy-provider', '--import', 'tsx', join(import.meta.dirname, 'serve.ts')], {
    env: {
      ...process.env,
      NODE_ENV: 'production',
      PORT: String(port),
      PUBLIC_BASE_URL: base,
      BETTER_AUTH_SECRET: 'bench-secret-that-is-long-enough-0123456789',
      DATA_DIR: dir,
      ...(databaseUrl ? { DATABASE_URL: databaseUrl } : {}),
      FAKES: 'on',
      DEMO_SEED: 'false',
      JOB_WORKER: 'off',
      LOG_LEVEL: 'warn',
      S3_ENDPOINT: `http://127.0.0.1:${s3}`,
      SMTP_URL: `smtp://127.0.0.1:${smtp}`,
      MAIL_CAPTURE_URL: `http://127.0.0.1:${capture}`,
      DOI_REGISTRY_URL: `http://127.0.0.1:${registry}`,
      STRIPE_API_URL: `http://127.0.0.1:${payments}`,
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  try {
    await new Promise<void>((resolve, reject) => {
      let out = '';
      child.stdout!.on('data', (d) => {
        out += d;
        if (out.includes('LISTENING')) resolve();
      });
      child.once('exit', (code) => reject(new Error(`the app stopped (exit ${code}) before listening`)));
    });

    const pick = (i: number) => open.rows[i % open.rows.length];
    const landing = Array.from({ length: 100 }, (_, i) => ({ method: 'GET' as const, path: `/api/releases/${pick(i * 7).suffix}` }));
    // 64 different searches (words, facets, sorts), as many visitors would type them.
    const words = ['swarm', 'zebrafish', 'starling roost', 'dusk marker', 'predator', 'milling tank', 'honey bee', 'herring', '', ''];
    const facets = ['', 'groupType=school', 'groupType=flock&setting=field', 'setting=laboratory', `lab=${seeded.labs[0]}`, 'individuals=10-49', 'frameRate=60-119', 'year=2025'];
    const searches = Array.from({ length: 64 }, (_, i) => {
      const q = words[i % words.length];
      const p = [q ? `q=${encodeURIComponent(q)}` : '', facets[Math.floor(i / words.length) % facets.length], `sort=${q && i % 3 ? 'relevance' : ['newest', 'group-size', 'downloads'][i % 3]}`].filter(Boolean).join('&');
      return { method: 'GET' as const, path: `/api/search?${p}` };
    });
    const files = Array.from({ length: 100 }, (_, i) => ({ method: 'GET' as const, path: `/api/releases/${pick(i * 11 + 3).suffix}/files/${pick(i * 11 + 3).file_name}/download` }));
    const mixed = Array.from({ length: 120 }, (_, i) => [landing[i % landing.length], searches[i % searches.length], files[i % files.length]][i % 3]);

    if (process.env.COHESIA_BENCH_SEQUENTIAL) {
      // One request at a time: the latency of each kind on an idle server.
      for (const [label, list] of [['landing', landing], ['search', searches], ['file', files]] as const) {
        const times: number[] = [];
        for (let i = 0; i < 60; i++) {
          const t = performance.now();
          await (await fetch(base + list[i % list.length].path, { redirect: 'manual' })).arrayBuffer();
          times.push(performance.now() - t);
        }
        times.sort((x, y) => x - y);
        process.stderr.write(`  sequential ${label}: median ${times[30].toFixed(1)} ms, p90 ${times[54].toFixed(1)} ms\n`);
      }
    }
    const run = async (label: string, requests: Array<{ method: 'GET'; path: string }>, seconds: number): Promise<LoadResult> => {
      // Warm-up: plans, caches, connection pools.
      await autocannon({ url: base, connections: 10, amount: 300, requests });
      const r = await autocannon({ url: base, connections: 32, overallRate: opts.rate, duration: seconds, requests, timeout: 10 });
      const statusCounts: Record<string, number> = {};
      for (const [code, v] of Object.entries((r as unknown as { statusCodeStats?: Record<string, { count: number }> }).statusCodeStats ?? {})) statusCounts[code] = v.count;
      const line: LoadResult = {
        engine, label, releases: seeded.releases, seconds, targetRate: opts.rate, requestsPerSecond: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, max: r.latency.max,
        errors: r.errors + Object.entries(statusCounts).filter(([c]) => Number(c) >= 400).reduce((s, [, n]) => s + n, 0), timeouts: r.timeouts, statusCounts,
      };
      process.stderr.write(`  load ${label} (${engine}): ${line.requestsPerSecond.toFixed(0)} req/s, p99 ${line.p99} ms\n`);
      return line;
    };
    // COHESIA_BENCH_ONLY=landing|search|file runs one kind alone for the whole time (for profiling it).
    const only = process.env.COHESIA_BENCH_ONLY;
    if (only) return [await run(only, { landing, search: searches, file: files }[only] ?? mixed, opts.seconds)];
    const results = [await run('mixed', mixed, opts.seconds)];
    const part = Math.max(5, Math.round(opts.seconds / 3));
    results.push(await run('landing pages', landing, part), await run('search', searches, part), await run('file URLs', files, part));
    return results;
  } finally {
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
    if (opts.adminUrl && databaseUrl) await adminQuery(opts.adminUrl, `drop database if exists ${new URL(databaseUrl).pathname.slice(1)} with (force)`).catch(() => {});
    rmSync(dir, { recursive: true, force: true });
  }
}

export function printLoad(results: LoadResult[]) {
  if (!results.length) return;
  const r0 = results[0];
  console.log(`\nLoad on loopback (${r0.engine}, ${r0.releases.toLocaleString('en-US')} releases, fixed rate ${r0.targetRate} req/s; target: p99 < 150 ms with zero errors)`);
  console.log(`  ${'mix'.padEnd(15)} ${'seconds'.padStart(7)} ${'req/s'.padStart(7)} ${'p50 ms'.padStart(7)} ${'p99 ms'.padStart(7)} ${'max ms'.padStart(7)} ${'errors'.padStart(6)}  statuses`);
  for (const r of results) {
    const statuses = Object.entries(r.statusCounts).map(([c, n]) => `${c}×${n}`).join(' ');
    console.log(`  ${r.label.padEnd(15)} ${String(r.seconds).padStart(7)} ${r.requestsPerSecond.toFixed(0).padStart(7)} ${String(r.p50).padStart(7)} ${String(r.p99).padStart(7)} ${String(r.max).padStart(7)} ${String(r.errors + r.timeouts).padStart(6)}  ${statuses}`);
  }
  const ok = r0.p99 < 150 && r0.errors + r0.timeouts === 0 && r0.requestsPerSecond >= r0.targetRate * 0.95;
  console.log(`  target (mixed): ${ok ? 'MET' : 'NOT MET'}`);
}

// Alone: tsx scripts/bench/load.ts [--releases 10000] [--seconds 30] [--rate 200]
if (import.meta.url === `file://${process.argv[1]}`) {
  const { parseArgs } = await import('node:util');
  const { values } = parseArgs({ options: { releases: { type: 'string', default: '10000' }, seconds: { type: 'string', default: '30' }, rate: { type: 'string', default: '200' } } });
  const results = await loadBench({ releases: Number(values.releases), seconds: Number(values.seconds), rate: Number(values.rate), adminUrl: process.env.COHESIA_BENCH_DATABASE_URL });
  printLoad(results);
}
