import { describe, expect, it } from 'vitest';
import { csvCell, toCsv } from './csv';

describe('csvCell(value)', () => {
  it.each(['=1+1', '+1+1', '-1+1', '@SUM(A1)', '\t=1', '\r=1', '＝1+1', '=HYPERLINK("http://evil.example","x")'])('neutralises the formula %j with a leading apostrophe', (v) => {
    const cell = csvCell(v);
    const unquoted = cell.startsWith('"') ? cell.slice(1, -1).replace(/""/g, '"') : cell;
    expect(unquoted).toBe(`'${v}`);
  });

  it('keeps numbers as numbers, negative ones included', () => {
    expect(csvCell(-1.5)).toBe('-1.5');
    expect(csvCell(0)).toBe('0');
    expect(csvCell(1e21)).toBe('1e+21');
  });

  it('leaves empty cells for null, undefined, NaN and infinities', () => {
    for (const v of [null, undefined, NaN, Infinity, -Infinity]) expect(csvCell(v)).toBe('');
  });

  it('quotes commas, quotes and line breaks (RFC 4180)', () => {
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell('two\nlines')).toBe('"two\nlines"');
  });

  it('writes dates as ISO 8601 and booleans as words', () => {
    expect(csvCell(new Date('2026-01-02T03:04:05Z'))).toBe('2026-01-02T03:04:05.000Z');
    expect(csvCell(true)).toBe('true');
  });

  it('leaves ordinary text alone', () => {
    expect(csvCell('Fenmoor dusk swarm')).toBe('Fenmoor dusk swarm');
    expect(csvCell('')).toBe('');
  });
});

describe('toCsv(header, rows)', () => {
  it('joins cells with commas and lines with CRLF, neutralising every cell', () => {
    expect(toCsv(['a', 'b'], [[1, '=cmd|calc'], [null, 'x']])).toBe("a,b\r\n1,'=cmd|calc\r\n,x\r\n");
  });
});
