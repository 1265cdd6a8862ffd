import { describe, expect, it } from 'vitest';
import { IssueCollector } from './issues';
import { DelimitedTextParser, parseDataBlock, type ParsedBlock, type RowBatch } from './text-parser';

const enc = (s: string) => new TextEncoder().encode(s);

function parseAll(text: string): { rows: RowBatch[]; parser: DelimitedTextParser } {
  const rows: RowBatch[] = [];
  const parser = new DelimitedTextParser({
    maxLineBytes: 1 << 20,
    maxErrorRows: 100,
    issues: new IssueCollector(20),
    onLayout: () => true,
    onRows: (b) => rows.push({ ...b, track: b.track.slice(0, b.count), line: b.line.slice(0, b.count), values: Object.fromEntries(Object.entries(b.values).map(([k, v]) => [k, v!.slice(0, b.count)])) }),
  });
  parser.push(enc(text));
  parser.end();
  return { rows, parser };
}

describe('parseDataBlock(bytes, start, end, layout)', () => {
  it('gives the values of the full parser on plain data lines (LF and CRLF, decimal comma)', () => {
    // Source: derived (same Clinger fast path as parseNumberBytes, itself tested against Number()).
    for (const [head, body] of [
      ['track_id,frame,x,y,z\n', '3,0,-0.000001,12.5,7\n10,1,123456.789012,-0,0.1\r\n'],
      ['track_id;frame;x;y\n', '1;0;1,25;-3,5\n2;0;0,1;999999999999999\n'],
      // Digit counts around the switch from 32-bit to double accumulation (9 digits), odd and even, and the 15-digit limit.
      ['track_id,frame,x,y\n', '1,2,12345678.9,123456789.5\n1,3,1234567890.1,0.12345678901234\n1,4,.5,7.\n1,5,-98765432.10,-0.000000001\n'],
    ]) {
      const { rows, parser } = parseAll(head);
      const bytes = enc(body);
      const block = parseDataBlock(bytes, 0, bytes.length, parser.blockLayout()!) as ParsedBlock;
      const ref = parseAll(head + body).rows[0];
      expect(block.count).toBe(ref.count);
      for (const [k, v] of Object.entries(ref.values)) expect(Array.from(block.values[k as 'x']!)).toEqual(Array.from(v!));
      expect(rows.length).toBe(0);
    }
  });
  it('returns null for lines only the full parser handles (quotes, exponents, names, blanks, missing fields)', () => {
    const { parser } = parseAll('track_id,frame,x,y\n');
    const layout = parser.blockLayout()!;
    for (const line of ['"1",0,1,2\n', '1,0,1e-3,2\n', 'bee,0,1,2\n', '\n', '1,0,1\n', '1,0,1,2,3\n', '1,0,nan,2\n', '1,0,1,2', '1,0,1.2.3,2\n', '1,0,-,2\n', '1,0,1234567890123456,2\n']) {
      const b = enc(line);
      expect(parseDataBlock(b, 0, b.length, layout)).toBeNull();
    }
  });
});
