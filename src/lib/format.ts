/** Bytes in decimal units (kB, MB, GB), as storage is sold. */
export function formatBytes(n: number | null | undefined): string {
  if (n === null || n === undefined || !Number.isFinite(n)) return '–';
  const units = ['B', 'kB', 'MB', 'GB', 'TB'];
  let i = 0;
  let v = n;
  while (v >= 1000 && i < units.length - 1) {
    v /= 1000;
    i++;
  }
  return `${v.toLocaleString('en-GB', { maximumFractionDigits: i === 0 ? 0 : v < 10 ? 2 : 1 })} ${units[i]}`;
}

/** A number with a sensible number of significant digits for tables. */
export function formatNumber(n: number | null | undefined, digits = 3): string {
  if (n === null || n === undefined || !Number.isFinite(n)) return '–';
  if (n !== 0 && (Math.abs(n) >= 1e6 || Math.abs(n) < 1e-3)) return n.toExponential(digits - 1);
  return n.toLocaleString('en-GB', { maximumSignificantDigits: digits });
}
