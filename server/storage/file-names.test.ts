import { describe, expect, it } from 'vitest';
import { sanitiseFileName } from './file-names';

describe('sanitiseFileName(name)', () => {
  it('drops folders and path traversal', () => {
    expect(sanitiseFileName('../../etc/passwd')).toBe('passwd');
    expect(sanitiseFileName('C:\\data\\swarm 01.csv.gz')).toBe('swarm 01.csv.gz');
  });
  it('replaces control and reserved characters and leading dots', () => {
    expect(sanitiseFileName('..hidden')).toBe('hidden');
    expect(sanitiseFileName('a\u0000b<c>"d".csv')).toBe('a_b_c__d_.csv');
    expect(sanitiseFileName('   ')).toBe('file');
  });
  it('keeps the extension when shortening long names', () => {
    const long = `${'x'.repeat(300)}.csv.gz`;
    const out = sanitiseFileName(long);
    expect(out.length).toBeLessThanOrEqual(180);
    expect(out.endsWith('.gz')).toBe(true);
  });
});
