import { describe, expect, it } from 'vitest';
import { CROCKFORD, luhn32Check, newDatasetSuffix, parseIdentifier, releaseSuffix, sameDoi } from './identifiers';

describe('luhn32Check(body)', () => {
  // Luhn mod N with N = 10 is the ordinary Luhn check (ISO/IEC 7812-1 annex B);
  // with our alphabet the first ten symbols are the digits, but N = 32 changes the
  // arithmetic, so the checks below are properties rather than borrowed examples.
  it('catches every single-symbol substitution', () => {
    const body = '4X7KP9MQ';
    const check = luhn32Check(body);
    for (let i = 0; i < body.length; i++) {
      for (const c of CROCKFORD) {
        if (c === body[i]) continue;
        const wrong = body.slice(0, i) + c + body.slice(i + 1);
        expect(luhn32Check(wrong)).not.toBe(check);
      }
    }
  });
  it('catches swaps of unequal neighbours in most cases', () => {
    let caught = 0;
    let total = 0;
    for (let t = 0; t < 300; t++) {
      const body = newDatasetSuffix().slice(3).replace('-', '').slice(0, 8);
      const check = luhn32Check(body);
      for (let i = 0; i < 7; i++) {
        if (body[i] === body[i + 1]) continue;
        total++;
        const swapped = body.slice(0, i) + body[i + 1] + body[i] + body.slice(i + 2);
        if (luhn32Check(swapped) !== check) caught++;
      }
    }
    expect(caught / total).toBeGreaterThan(0.95);
  });
  it('refuses symbols outside the alphabet', () => {
    expect(() => luhn32Check('ABCI')).toThrow(/not a Crockford/);
  });
});

describe('parseIdentifier(input)', () => {
  const suffix = newDatasetSuffix();
  it('round-trips a fresh suffix and its release form', () => {
    expect(parseIdentifier(`10.99999/${suffix}`)).toEqual({ prefix: '10.99999', suffix, datasetSuffix: suffix, version: null });
    expect(parseIdentifier(`10.99999/${releaseSuffix(suffix, 3)}`)?.version).toBe(3);
  });
  it('accepts doi: and resolver forms in any case (ISO 26324: case-insensitive)', () => {
    const lower = `https://doi.org/10.99999/${suffix.toLowerCase()}.V2`;
    expect(parseIdentifier(lower)).toMatchObject({ suffix: `${suffix}.v2`, version: 2 });
    expect(parseIdentifier(`doi:10.99999/${suffix}`)?.suffix).toBe(suffix);
    expect(sameDoi(`10.99999/${suffix}`, `10.99999/${suffix.toLowerCase()}`)).toBe(true);
  });
  it('refuses a wrong check symbol, a bad prefix and foreign suffixes', () => {
    const last = suffix.at(-1)!;
    const other = CROCKFORD[(CROCKFORD.indexOf(last) + 1) % 32];
    expect(parseIdentifier(`10.99999/${suffix.slice(0, -1)}${other}`)).toBeNull();
    expect(parseIdentifier(`11.99999/${suffix}`)).toBeNull();
    expect(parseIdentifier('10.99999/something-else')).toBeNull();
    expect(parseIdentifier(`10.99999/${suffix}.v0`)).toBeNull();
    expect(parseIdentifier('%E0%A4%A')).toBeNull();
  });
});
