// One measurement in its own process, so peak RSS belongs to it alone. Prints one JSON line.
import { createReadStream, openSync, readSync, closeSync, statSync, readdirSync, readFileSync } from 'node:fs';
import { createGunzip, type ZlibOptions } from 'node:zlib';
import { Worker } from 'node:worker_threads';
import { analyzeStream } from '../../server/ingest/analyze-stream';
import { IssueCollector } from '../../shared/engine/issues';
import { DelimitedTextParser, parseDataBlock } from '../../shared/engine/text-parser';

const [kind, file, limitArg] = process.argv.slice(2);

function endAtLine(path: string, approx: number): number {
  const fd = openSync(path, 'r');
  const b = Buffer.alloc(1 << 16);
  const n = readSync(fd, b, 0, b.length, approx);
  closeSync(fd);
  const i = b.subarray(0, n).indexOf(10);
  return approx + i;
}

/** CPU seconds of all threads of this process since `c0` (user + system): steadier than wall time on a shared machine. */
function cpuSince(c0: NodeJS.CpuUsage): number {
  const c = process.cpuUsage(c0);
  return Math.round((c.user + c.system) / 1e4) / 100;
}

/** CPU seconds per thread id from /proc (Linux; empty elsewhere). */
function threadTimes(): Map<string, number> {
  const out = new Map<string, number>();
  try {
    for (const tid of readdirSync('/proc/self/task')) {
      const f = readFileSync(`/proc/self/task/${tid}/stat`, 'utf8');
      const rest = f.slice(f.lastIndexOf(')') + 2).split(' ');
      out.set(tid, (Number(rest[11]) + Number(rest[12])) / 100); // utime + stime in USER_HZ (100) ticks
    }
  } catch {
    // Not Linux: no per-thread figures.
  }
  return out;
}

// Sampled while the line runs, because the ingest's worker thread has ended (and left /proc) by the end.
const lastSeen = new Map<string, number>();
const sampleThreads = () => threadTimes().forEach((v, k) => lastSeen.set(k, Math.max(v, lastSeen.get(k) ?? 0)));
const sampler = setInterval(sampleThreads, 50);

/**
 * CPU seconds of the main thread and of the busiest other thread (the ingest's worker, zlib or DuckDB's busiest
 * thread): on a shared machine wall time follows the load, while these bound the wall time on free cores.
 */
function threadCpu(): { main: number; otherBusiest: number } | undefined {
  clearInterval(sampler);
  sampleThreads();
  if (lastSeen.size === 0) return undefined;
  let other = 0;
  for (const [tid, v] of lastSeen) if (Number(tid) !== process.pid && v > other) other = v;
  return { main: lastSeen.get(String(process.pid)) ?? NaN, otherBusiest: other };
}

async function run(): Promise<Record<string, unknown>> {
  const size = statSync(file).size;
  const end = limitArg ? endAtLine(file, Math.floor(size * Number(limitArg))) : undefined;
  const stream = () => createReadStream(file, { highWaterMark: 1 << 20, end });
  const t0 = performance.now();
  const cpu0 = process.cpuUsage();
  let rows = 0;
  let bytes = 0;
  if (kind === 'read-bytes') {
    for await (const c of stream()) {
      bytes += (c as Buffer).length;
      // Count lines so the loop touches every byte.
      let i = -1;
      while ((i = (c as Buffer).indexOf(10, i + 1)) >= 0) rows++;
    }
    rows -= 1;
  } else if (kind === 'gunzip-only') {
    const gz = createGunzip({ chunkSize: 1 << 20, highWaterMark: 8 << 20 } as ZlibOptions);
    stream().pipe(gz);
    for await (const c of gz) bytes += (c as Buffer).length;
  } else if (kind === 'duckdb-basic') {
    const { DuckDBInstance } = await import('@duckdb/node-api');
    const inst = await DuckDBInstance.create(':memory:');
    const con = await inst.connect();
    const q = `
      WITH r AS (SELECT frame, x, y, z, vx, vy, vz, sqrt(vx*vx + vy*vy + vz*vz) AS s FROM read_csv('${file}', header = true)),
      f AS (SELECT frame, count(*) AS n, avg(x) AS cx, avg(y) AS cy, avg(z) AS cz, avg(s) AS ms,
              sqrt(sum(vx/s)^2 + sum(vy/s)^2 + sum(vz/s)^2) / count(*) AS pol,
              sum(s) AS s1, sum(s*s) AS s2, sum(s*s*s) AS s3, sum(s*s*s*s) AS s4
            FROM r GROUP BY frame)
      SELECT count(*) AS frames, sum(n) AS rows, min(n) AS nmin, avg(n) AS nmean, max(n) AS nmax,
             avg(cx), avg(cy), avg(cz), avg(ms) AS mean_speed, avg(pol) AS polarization,
             sum(s1)/sum(n) AS m1, sum(s2)/sum(n) AS m2, sum(s3)/sum(n) AS m3, sum(s4)/sum(n) AS m4 FROM f`;
    const res = await con.runAndReadAll(q);
    const row = res.getRowObjects()[0] as Record<string, unknown>;
    rows = Number(row.rows);
    bytes = size;
    const out = { polarization: Number(row.polarization), meanSpeed: Number(row.mean_speed), frames: Number(row.frames) };
    return { kind, rows, bytes, seconds: (performance.now() - t0) / 1000, maxRssMB: process.resourceUsage().maxRSS / 1024, cpuSeconds: cpuSince(cpu0), check: out };
  } else if (kind === 'parse-floor') {
    // The engine's block parser alone on two threads, each on its half of the file (1 MiB blocks, no statistics, no
    // hand-over): a floor under ours-basic on this machine, since ours-basic parses the same bytes and more.
    const head = Buffer.alloc(1 << 16);
    const fd = openSync(file, 'r');
    readSync(fd, head, 0, head.length, 0);
    closeSync(fd);
    const parser = new DelimitedTextParser({ maxLineBytes: 1 << 20, maxErrorRows: 1, issues: new IssueCollector(1), onLayout: () => true, onRows: () => {} });
    parser.push(head.subarray(0, head.indexOf(10) + 1));
    const layout = parser.blockLayout();
    const mid = endAtLine(file, Math.floor(size / 2)) + 1;
    const src = `const { parentPort, workerData: w } = require("node:worker_threads"); const fs = require("node:fs"); const __name = (f) => f;
      const parseDataBlock = ${parseDataBlock.toString()};
      const fd = fs.openSync(w.file, "r"); const buf = Buffer.alloc((1 << 20) + (1 << 16)); let pos = w.from, carry = 0, rows = 0; const pool = [];
      while (pos < w.to) {
        const n = fs.readSync(fd, buf, carry, Math.min(1 << 20, w.to - pos), pos); pos += n;
        const end = buf.lastIndexOf(10, carry + n - 1) + 1;
        const b = parseDataBlock(buf, 0, end, w.layout, pool); if (!b) throw new Error("block declined");
        rows += b.count; pool.push(b.trackIds.buffer, ...Object.values(b.values).map((v) => v.buffer));
        carry = carry + n - end; buf.copyWithin(0, end, end + carry);
      }
      parentPort.postMessage(rows);`;
    const half = (from: number, to: number) =>
      new Promise<number>((resolve, reject) => new Worker(src, { eval: true, workerData: { file, from, to, layout } }).once('message', resolve).once('error', reject));
    const counts = await Promise.all([half(head.indexOf(10) + 1, mid), half(mid, size)]);
    rows = counts[0] + counts[1];
    bytes = size;
  } else if (kind === 'ours-basic' || kind === 'ours-full') {
    const doc = await analyzeStream(stream(), { settings: { fps: 100, mode: kind === 'ours-basic' ? 'basic' : 'full' } });
    rows = doc.summary?.rows ?? 0;
    bytes = end ?? size;
    return {
      kind,
      rows,
      bytes,
      seconds: (performance.now() - t0) / 1000,
      maxRssMB: process.resourceUsage().maxRSS / 1024, cpuSeconds: cpuSince(cpu0),
      status: doc.status,
      check: { polarization: doc.summary?.polarization.mean, meanSpeed: doc.summary?.velocity.speed.mean, frames: doc.summary?.frames },
    };
  }
  return { kind, rows, bytes: bytes || size, seconds: (performance.now() - t0) / 1000, maxRssMB: process.resourceUsage().maxRSS / 1024, cpuSeconds: cpuSince(cpu0) };
}

run().then((r) => process.stdout.write(JSON.stringify({ ...r, threadCpu: threadCpu() }) + '\n'));
