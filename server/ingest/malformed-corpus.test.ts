import { createReadStream, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { analyzeStream } from './analyze-stream';

const dir = join(import.meta.dirname, '../../tests/fixtures/malformed');
const variants = join(import.meta.dirname, '../../tests/fixtures/trajectories/variants');
const fromFile = (name: string, d = dir) => createReadStream(join(d, name), { highWaterMark: 1 << 16 });
const fromText = (text: string | Buffer, chunk = 1 << 16) => {
  const buf = Buffer.isBuffer(text) ? text : Buffer.from(text);
  return Readable.from((function* () {
    for (let i = 0; i < buf.length; i += chunk) yield buf.subarray(i, i + chunk);
  })());
};
const firstError = async (r: Readable, opts = {}) => {
  const doc = await analyzeStream(r, { settings: { fps: 100 }, ...opts });
  expect(doc.status).toBe('invalid');
  return doc.validation.errors[0];
};

// Source of each expectation: derived from the fixture's content (row = 1-based line of the file).
describe('analyzeStream(readable, options) on the malformed corpus', () => {
  it('empty.csv → empty-file, no row', async () => {
    expect(await firstError(fromFile('empty.csv'))).toMatchObject({ kind: 'empty-file', rows: [] });
  });
  it('blank-and-comments.csv → empty-file', async () => {
    expect(await firstError(fromFile('blank-and-comments.csv'))).toMatchObject({ kind: 'empty-file', rows: [] });
  });
  it('header-only.csv → no-data-rows', async () => {
    expect(await firstError(fromFile('header-only.csv'))).toMatchObject({ kind: 'no-data-rows' });
  });
  it("not-a-number.csv → not-a-number at row 3 with a plain message", async () => {
    const e = await firstError(fromFile('not-a-number.csv'));
    expect(e).toMatchObject({ kind: 'not-a-number', rows: [3], count: 1, column: 'y' });
    expect(e.message).toBe("row 3: the value 'abc' in column y is not a number.");
  });
  it('missing-columns.csv → missing-columns at row 1 naming what is missing', async () => {
    const e = await firstError(fromFile('missing-columns.csv'));
    expect(e).toMatchObject({ kind: 'missing-columns', rows: [1] });
    expect(e.message).toContain('position y');
  });
  it('missing-field.csv → missing-value at row 3', async () => {
    expect(await firstError(fromFile('missing-field.csv'))).toMatchObject({ kind: 'missing-value', rows: [3] });
  });
  it('empty-track-id.csv → missing-value at row 2', async () => {
    expect(await firstError(fromFile('empty-track-id.csv'))).toMatchObject({ kind: 'missing-value', rows: [2] });
  });
  it('empty-frame.csv → missing-value at row 3', async () => {
    expect(await firstError(fromFile('empty-frame.csv'))).toMatchObject({ kind: 'missing-value', rows: [3] });
  });
  it('truncated.csv.gz → corrupt-gzip', async () => {
    const e = await firstError(fromFile('truncated.csv.gz'));
    expect(e.kind).toBe('corrupt-gzip');
    expect(e.message).toMatch(/truncated or damaged/);
  });
  it('corrupted.csv.gz → corrupt-gzip', async () => {
    expect((await firstError(fromFile('corrupted.csv.gz'))).kind).toBe('corrupt-gzip');
  });
  it('binary-junk.dat → binary-content at row 1', async () => {
    expect(await firstError(fromFile('binary-junk.dat'))).toMatchObject({ kind: 'binary-content', rows: [1] });
  });
  it('archive.zip → binary-content at row 1, telling to unzip', async () => {
    const e = await firstError(fromFile('archive.zip'));
    expect(e).toMatchObject({ kind: 'binary-content', rows: [1] });
    expect(e.message).toMatch(/unzip/i);
  });
  it('a 4 MB line → line-too-long at row 2, without reading it all', async () => {
    const big = 'track_id,frame,x,y\n' + '1,'.repeat(2 << 20) + '\n1,0,0,0\n';
    expect(await firstError(fromText(big))).toMatchObject({ kind: 'line-too-long', rows: [2] });
  });
  it('4 MB without any line break → line-too-long at row 1', async () => {
    expect(await firstError(fromText('x'.repeat(4 << 20), 1 << 20))).toMatchObject({ kind: 'line-too-long', rows: [1] });
  });
  it('a gzip of a 4 MB line → line-too-long at row 2', async () => {
    const big = gzipSync(Buffer.from('track_id,frame,x,y\n' + '9'.repeat(4 << 20) + '\n'));
    expect(await firstError(fromText(big))).toMatchObject({ kind: 'line-too-long', rows: [2] });
  });
  it('endless binary junk stops at once (no hang)', async () => {
    let produced = 0;
    const endless = new Readable({
      read() {
        produced += 1 << 16;
        this.push(Buffer.alloc(1 << 16, 0));
      },
    });
    expect(await firstError(endless)).toMatchObject({ kind: 'binary-content', rows: [1] });
    expect(produced).toBeLessThan(1 << 22);
  });
  it('a file sorted by track and larger than maxReorderRows → unsorted at the row where the limit is reached', async () => {
    let csv = 'track_id,frame,x,y\n';
    for (let t = 0; t < 4; t++) for (let f = 0; f < 30; f++) csv += `${t},${f},${f * 0.01},${t}\n`;
    const e = await firstError(fromText(csv), { settings: { fps: 100, maxReorderRows: 50 } });
    expect(e).toMatchObject({ kind: 'unsorted', rows: [51] });
  });
  it('a frame-sorted file that goes back in time after maxReorderRows → unsorted at that row', async () => {
    let csv = 'track_id,frame,x,y\n';
    for (let f = 0; f < 30; f++) for (let t = 0; t < 3; t++) csv += `${t},${f},${f * 0.01},${t}\n`;
    csv += '0,5,0,0\n';
    const e = await firstError(fromText(csv), { settings: { fps: 100, maxReorderRows: 20 } });
    expect(e).toMatchObject({ kind: 'unsorted', rows: [92] });
  });
  it('an unusable mapping → invalid-mapping at row 1', async () => {
    const e = await firstError(fromFile('plain.csv', variants), { mapping: { x: 'nope' } });
    expect(e).toMatchObject({ kind: 'invalid-mapping', rows: [1] });
  });
  it('a frame column without frame rate → missing-frame-rate', async () => {
    const doc = await analyzeStream(fromFile('plain.csv', variants), {});
    expect(doc.validation.errors[0].kind).toBe('missing-frame-rate');
  });
});

describe('analyzeStream(readable, options) warnings', () => {
  it('reports non-finite, duplicate, time-not-increasing, gap, speed-jump and short-track with their rows', async () => {
    const lines = ['track_id,frame,x,y'];
    for (let f = 0; f < 40; f++) lines.push(`1,${f},${f * 0.001},0`); // rows 2..41
    lines.push('1,39,0.039,0'); // row 42: duplicate frame
    lines.push('1,45,0.045,0'); // row 43: gap of 5 frames
    lines.push('1,46,5,0'); // row 44: jump of ~5 m in 10 ms
    lines.push('2,0,nan,0'); // row 45: non-finite
    lines.push('2,1,1,1'); // row 46: short track (2 frames)
    lines.push('2,2,1,1'); // row 47
    lines.push('3,5,2,2'); // row 48
    lines.push('3,4,2,2'); // row 49: time goes back within track 3
    const doc = await analyzeStream(fromText(lines.join('\n')), { settings: { fps: 100 } });
    expect(doc.status).toBe('ok');
    const w = Object.fromEntries(doc.validation.warnings.map((i) => [i.kind, i]));
    expect(w['non-finite'].rows).toEqual([45]);
    expect(w['duplicate-frame'].rows).toEqual([42]);
    expect(w['time-not-increasing'].rows).toEqual([49]);
    expect(w['track-gap'].rows).toEqual([43]);
    expect(w['speed-jump'].rows).toEqual([44]);
    // A short track is shown at its first row in time order (track 3 starts at frame 4, row 49).
    expect(w['short-track'].rows).toEqual([46, 49]);
  });
});

describe('analyzeStream(readable, options) on file variants', () => {
  const plain = readFileSync(join(variants, 'plain.csv'));
  it.each(['gzip-without-gz-name.csv', 'bom-crlf.csv', 'semicolon-decimal-comma.csv', 'tabs.tsv'])('%s gives the same statistics as plain.csv', async (name) => {
    // Source: derived (same numbers, different encoding).
    const a = await analyzeStream(fromText(plain), { settings: { fps: 100 } });
    const b = await analyzeStream(fromFile(name, variants), { settings: { fps: 100 } });
    expect(b.status).toBe('ok');
    expect(b.summary).toEqual(a.summary);
  });
  it('no-header.csv is read with a mapping by column index', async () => {
    const a = await analyzeStream(fromText(plain), { settings: { fps: 100 } });
    const b = await analyzeStream(fromFile('no-header.csv', variants), { settings: { fps: 100 }, mapping: { track_id: 0, frame: 1, x: 2, y: 3, z: 4 } });
    expect(b.input.hasHeader).toBe(false);
    expect(b.summary).toEqual(a.summary);
  });
  it('aliases-mm.csv maps ID/Time/X (mm) and converts millimetres to metres', async () => {
    const doc = await analyzeStream(fromFile('aliases-mm.csv', variants));
    expect(doc.status).toBe('ok');
    expect(doc.input.mapping).toMatchObject({ track_id: 'ID', t: 'Time', x: 'X (mm)' });
    expect(doc.parameters.units).toBe('mm');
    expect(doc.parameters.fps).toBe(100);
    // Uniform in a 1 m cube: RMS radius sqrt(3/12) ≈ 0.5 m (derived).
    expect(doc.summary!.radius.mean!).toBeGreaterThan(0.3);
    expect(doc.summary!.radius.mean!).toBeLessThan(0.7);
  });
});
