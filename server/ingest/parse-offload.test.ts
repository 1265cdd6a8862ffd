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
    expect(b.validation).toEqual(a.validation);
    // gzip: parsed in the main thread, the autocorrelation in the worker.
    const c = await analyzeStream(fromText(gzipSync(text)), { settings: { fps: 100 } });
    expect(c.summary).toEqual(a.summary);
    expect(c.series).toEqual(a.series);
  }, 30_000);
});
