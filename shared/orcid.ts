/**
 * ORCID iD check digit: ISO 7064 MOD 11-2 over the first 15 digits; a check
 * value of 10 is written "X". Written here (a few lines) because the only
 * packages for it are unmaintained; tested on the standard's published examples.
 */
export function orcidCheckDigit(base15: string): string {
  let total = 0;
  for (const ch of base15) total = (total + Number(ch)) * 2;
  const result = (12 - (total % 11)) % 11;
  return result === 10 ? 'X' : String(result);
}

const ORCID_FORM = /^(\d{4})-(\d{4})-(\d{4})-(\d{3}[\dX])$/;

/** Accepts `0000-0002-1825-0097` or the same behind `https://orcid.org/`. Returns the bare iD or null. */
export function normaliseOrcid(input: string): string | null {
  const bare = input.trim().replace(/^https?:\/\/orcid\.org\//i, '').toUpperCase();
  const m = ORCID_FORM.exec(bare);
  if (!m) return null;
  const digits = m.slice(1).join('');
  return orcidCheckDigit(digits.slice(0, 15)) === digits[15] ? bare : null;
}

export function isValidOrcid(input: string): boolean {
  return normaliseOrcid(input) !== null;
}
