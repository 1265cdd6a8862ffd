import { formatBytes as formatBytesShared } from '../../shared/billing-format';

/** Bytes in decimal units (kB, MB, GB), as storage is sold; a dash when unknown. */
export const formatBytes = (n: number | null | undefined) => (n === null || n === undefined ? '–' : formatBytesShared(n));

/** A number with a sensible number of significant digits for tables. */
export function formatNumber(n: number | null | undefined, digits = 3): string {
  if (n === null || n === undefined || !Number.isFinite(n)) return '–';
  if (n !== 0 && (Math.abs(n) >= 1e6 || Math.abs(n) < 1e-3)) return n.toExponential(digits - 1);
  return n.toLocaleString('en-GB', { maximumSignificantDigits: digits });
}
