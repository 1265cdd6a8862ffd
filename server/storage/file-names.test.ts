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

describe('sanitiseFileName(name) against hostile names', () => {
  const hostile = [
    '../../../../etc/shadow',
    '/etc/passwd',
    'C:\\Windows\\System32\\drivers\\etc\\hosts',
    '\\\\server\\share\\x.csv',
    '..',
    '.',
    '....//....//x',
    'a/../../b.csv',
    'swarm\u0000.csv',
    '..\u2215..\u2215secret',
    '..\uFF0F..\uFF0Fsecret',
    'report\u202Evsc.exe',
    'zero\u200Bwidth.csv',
    '\uD800broken.csv',
    'trailing.csv. . ',
  ];

  it.each(hostile)('gives %j a plain name with no folder part', (name) => {
    const out = sanitiseFileName(name);
    expect(out).not.toMatch(/[\\/\u2215\uFF0F]/);
    expect(out).not.toMatch(/^\.\.?$/);
    expect(out.startsWith('.')).toBe(false);
    // eslint-disable-next-line no-control-regex
    expect(out).not.toMatch(/[\u0000-\u001f\u007f-\u009f\u200B-\u200F\u202A-\u202E\uD800-\uDFFF]/);
    expect(out.length).toBeGreaterThan(0);
    expect(out.length).toBeLessThanOrEqual(180);
  });

  it('keeps only the last part of any path, whatever slash it uses', () => {
    expect(sanitiseFileName('..\u2215..\u2215secret')).toBe('secret');
    expect(sanitiseFileName('..\uFF0F..\uFF0Fsecret')).toBe('secret');
    expect(sanitiseFileName('/etc/passwd')).toBe('passwd');
    expect(sanitiseFileName('..')).toBe('file');
  });

  it('removes bidirectional overrides so the shown extension is the real one', () => {
    expect(sanitiseFileName('report\u202Evsc.exe')).toBe('reportvsc.exe');
    expect(sanitiseFileName('trailing.csv. . ')).toBe('trailing.csv');
  });

  it('replaces NUL and lone surrogates', () => {
    expect(sanitiseFileName('swarm\u0000.csv')).toBe('swarm_.csv');
    expect(sanitiseFileName('\uD800broken.csv')).toBe('_broken.csv');
  });
});
