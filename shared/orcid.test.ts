import { describe, expect, it } from 'vitest';
import { isValidOrcid, normaliseOrcid, orcidCheckDigit } from './orcid';

// Worked examples: ORCID's own description of the identifier structure
// ("Structure of the ORCID Identifier", ORCID support documentation), which
// applies ISO/IEC 7064:2003 MOD 11-2. The three iDs below are the ones it
// publishes; quoted from memory and re-derived by hand with the algorithm.
describe('orcidCheckDigit(base15)', () => {
  it('is 7 for 0000-0002-1825-009 (the documented example 0000-0002-1825-0097)', () => {
    expect(orcidCheckDigit('000000021825009')).toBe('7');
  });
  it('is 0 for 0000-0001-5109-370 (documented example 0000-0001-5109-3700)', () => {
    expect(orcidCheckDigit('000000015109370')).toBe('0');
  });
  it('is X for 0000-0002-1694-233 (documented example 0000-0002-1694-233X, check value 10)', () => {
    expect(orcidCheckDigit('000000021694233')).toBe('X');
  });
});

describe('isValidOrcid(id)', () => {
  it('accepts the documented examples, bare and as a URL', () => {
    expect(isValidOrcid('0000-0002-1825-0097')).toBe(true);
    expect(isValidOrcid('https://orcid.org/0000-0001-5109-3700')).toBe(true);
    expect(isValidOrcid('0000-0002-1694-233x')).toBe(true);
  });
  it('rejects a wrong check digit, a transposition and a bad form', () => {
    expect(isValidOrcid('0000-0002-1825-0098')).toBe(false);
    expect(isValidOrcid('0000-0002-1852-0097')).toBe(false); // adjacent digits swapped
    expect(isValidOrcid('0000000218250097')).toBe(false);
    expect(isValidOrcid('')).toBe(false);
  });
  it('normaliseOrcid(id) returns the bare upper-case form', () => {
    expect(normaliseOrcid(' https://orcid.org/0000-0002-1694-233x ')).toBe('0000-0002-1694-233X');
  });
});
