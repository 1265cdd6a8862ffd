/**
 * Cohesia's DOI-style identifiers (ISO 26324 syntax `10.<prefix>/<suffix>`).
 *
 * Suffix scheme: `cx.` + 8 symbols of Crockford's base-32 alphabet (no I, L,
 * O or U, so nothing reads as 1 or 0) in two groups, then one check symbol by
 * the Luhn mod N algorithm over the same alphabet (catches every single
 * wrong symbol and most swaps of neighbours). A dataset's all-versions
 * identifier is the bare suffix; release n appends `.v<n>`:
 * `10.99999/cx.4X7K-P9MQ5` and `10.99999/cx.4X7K-P9MQ5.v2`.
 * Written here because the scheme is ours; crypto.getRandomValues is in
 * browsers and Node alike.
 */
export const CROCKFORD = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
const N = CROCKFORD.length;

/** Luhn mod N check symbol over Crockford base-32 symbols. */
export function luhn32Check(body: string): string {
  let factor = 2;
  let sum = 0;
  for (let i = body.length - 1; i >= 0; i--) {
    const code = CROCKFORD.indexOf(body[i]);
    if (code < 0) throw new RangeError(`'${body[i]}' is not a Crockford base-32 symbol`);
    let addend = factor * code;
    factor = factor === 2 ? 1 : 2;
    addend = Math.floor(addend / N) + (addend % N);
    sum += addend;
  }
  return CROCKFORD[(N - (sum % N)) % N];
}

const SUFFIX = /^cx\.([0-9A-HJKMNP-TV-Z]{4})-([0-9A-HJKMNP-TV-Z]{4})([0-9A-HJKMNP-TV-Z])(?:\.v([1-9]\d{0,4}))?$/;

/** A fresh all-versions suffix, e.g. `cx.4X7K-P9MQ5`. */
export function newDatasetSuffix(random: (n: number) => Uint8Array = (n) => crypto.getRandomValues(new Uint8Array(n))): string {
  const bytes = random(8);
  const body = Array.from(bytes, (b) => CROCKFORD[b % N]).join('');
  return `cx.${body.slice(0, 4)}-${body.slice(4)}${luhn32Check(body)}`;
}

export const releaseSuffix = (datasetSuffix: string, version: number) => `${datasetSuffix}.v${version}`;

export const formatDoi = (prefix: string, suffix: string) => `${prefix}/${suffix}`;

export type ParsedIdentifier = { prefix: string; suffix: string; datasetSuffix: string; version: number | null };

/**
 * Reads an identifier as people paste it (`doi:…`, `https://doi.org/…`, any
 * case). DOIs compare case-insensitively (ISO 26324), so the result is in the
 * canonical upper-case form of our suffixes. Returns null if it is not one of ours
 * or its check symbol is wrong.
 */
export function parseIdentifier(input: string): ParsedIdentifier | null {
  let s = input.trim();
  s = s.replace(/^(?:doi:|https?:\/\/(?:dx\.)?doi\.org\/)/i, '');
  try {
    s = decodeURIComponent(s);
  } catch {
    return null;
  }
  const slash = s.indexOf('/');
  if (slash < 0) return null;
  const prefix = s.slice(0, slash);
  if (!/^10\.\d{4,9}$/.test(prefix)) return null;
  // Canonical form: symbols upper-case, the `cx.` and `.v` markers lower-case.
  const parts = /^cx\.(\w{4})-(\w{5})(?:\.v(\d+))?$/i.exec(s.slice(slash + 1));
  if (!parts) return null;
  const base = `cx.${parts[1].toUpperCase()}-${parts[2].toUpperCase()}`;
  const canonical = parts[3] ? `${base}.v${parts[3]}` : base;
  const m = SUFFIX.exec(canonical);
  if (!m || luhn32Check(m[1] + m[2]) !== m[3]) return null;
  const datasetSuffix = base;
  return { prefix, suffix: canonical, datasetSuffix, version: m[4] ? Number(m[4]) : null };
}

/** True when two DOIs name the same thing (case-insensitive, ISO 26324). */
export const sameDoi = (a: string, b: string) => a.trim().toUpperCase() === b.trim().toUpperCase();
