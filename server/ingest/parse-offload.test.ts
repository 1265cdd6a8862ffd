import { Readable } from 'node:stream';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { generateLangevinSwarm, rowsToCsv, type SyntheticRow } from '../../shared/engine/synthetic-trajectories';
import { analyzeStream } from './analyze-stream';
import { OFFLOAD_AFTER_BYTES } from './parse-offload';

const fromText = (buf: Buffer, chunk = 1 << 20) =>
  Readable.from((function* () {
    for (let i = 0; i < buf.length; i += chunk) yield buf.subarray(i, i + chunk);
  })());

describe('analyzeStream(readable, { parseWorker })', () => {
  it('gives the same result with the worker (parsing, autocorrelation) as in one thread, also with an exponent late in the file', async () => {
    // Source: derived (the worker only moves the parsing; declined blocks go to the full parser).
    const rows: SyntheticRow[] = [];
    generateLangevinSwarm({ seed: 5, individuals: 40, fps: 100, seconds: 40, springConstant: 4, relaxationTime: 0.3, speedSd: 0.1 }, (r) => rows.push(r));
    const csv = rowsToCsv(rows, { digits: 6, velocities: true });
    expect(csv.length).toBeGreaterThan(1.5 * OFFLOAD_AFTER_BYTES);
    const lines = csv.split('\n');
    lines[lines.length - 100] = lines[lines.length - 100].replace(/,([^,]*)$/, ',1e-2');
    const text = Buffer.from(lines.join('\n'));
    const a = await analyzeStream(fromText(text), { settings: { fps: 100 }, parseWorker: false });
    const b = await analyzeStream(fromText(text), { settings: { fps: 100 }, parseWorker: 'always' });
    expect(b.status).toBe('ok');
    expect(b.summary).toEqual(a.summary);
    expect(b.series).toEqual(a.series);
    expect(b.validation).toEqual(a.validation);
    // gzip: parsed in the main thread, the autocorrelation in the worker.
    const c = await analyzeStream(fromText(gzipSync(text)), { settings: { fps: 100 } });
    expect(c.summary).toEqual(a.summary);
    expect(c.series).toEqual(a.series);
  }, 30_000);

  it('gives the same speed and velocity statistics with the worker for 2D data and for frames larger than one batch of samples', async () => {
    // Source: derived. 2D: no third component; 20,000 individuals per frame: more than one 16k batch of samples.
    const rows: SyntheticRow[] = [];
    generateLangevinSwarm({ seed: 7, individuals: 20_000, fps: 100, seconds: 0.12, springConstant: 4, relaxationTime: 0.3, speedSd: 0.1 }, (r) => rows.push(r));
    const text = Buffer.from(rowsToCsv(rows, { dims: 2, digits: 6, velocities: true }));
    const settings = { fps: 100, dims: 2 as const, minTrackFrames: 1 };
    const a = await analyzeStream(fromText(text), { settings, parseWorker: false });
    const b = await analyzeStream(fromText(text), { settings, parseWorker: 'always' });
    expect(a.summary?.velocity.speed.count).toBeGreaterThan(0);
    expect(b.summary).toEqual(a.summary);
    expect(b.series).toEqual(a.series);
  }, 30_000);
});
