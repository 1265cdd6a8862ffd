/**
 * Display of sizes and prices, used by the client and by server messages.
 * Sizes use decimal units (1 GB = 10^9 bytes), as plan names and disks do;
 * prices go through Intl.NumberFormat in the plan's currency.
 */
const UNITS = ['bytes', 'kB', 'MB', 'GB', 'TB', 'PB'] as const;

export function formatBytes(bytes: number, locale = 'en-GB'): string {
  if (!Number.isFinite(bytes)) return '—';
  const sign = bytes < 0 ? '-' : '';
  let v = Math.abs(bytes);
  let u = 0;
  while (v >= 1000 && u < UNITS.length - 1) {
    v /= 1000;
    u += 1;
  }
  if (u === 0) return `${sign}${new Intl.NumberFormat(locale).format(v)} ${v === 1 ? 'byte' : 'bytes'}`;
  const digits = v >= 100 ? 0 : v >= 10 ? 1 : 2;
  return `${sign}${new Intl.NumberFormat(locale, { maximumFractionDigits: digits }).format(v)} ${UNITS[u]}`;
}

/** Digits after the decimal point of a currency's minor unit (2 for EUR, 0 for JPY). */
export function currencyDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).resolvedOptions().maximumFractionDigits ?? 2;
}

export function formatMoney(minor: number, currency: string, locale = 'en-GB'): string {
  const digits = currencyDigits(currency);
  return new Intl.NumberFormat(locale, { style: 'currency', currency: currency.toUpperCase() }).format(minor / 10 ** digits);
}

/** "12.50" in EUR → 1250. Returns NaN for text that is not a plain decimal amount. */
export function toMinorUnits(amount: string, currency: string): number {
  const digits = currencyDigits(currency);
  const m = /^(\d+)(?:\.(\d+))?$/.exec(amount.trim());
  if (!m || (m[2]?.length ?? 0) > digits) return NaN;
  return Number(m[1]) * 10 ** digits + Number((m[2] ?? '').padEnd(digits, '0') || 0);
}

/** The payment provider's subscription statuses in the words the storage page uses ("Payment due"). */
const SUBSCRIPTION_STATUS_WORDS: Record<string, string> = {
  none: 'No subscription',
  active: 'Active',
  trialing: 'Trial',
  past_due: 'Payment due',
  unpaid: 'Unpaid',
  canceled: 'Cancelled',
  incomplete: 'Awaiting first payment',
  incomplete_expired: 'First payment not made',
  paused: 'Paused',
};

export function subscriptionStatusWords(status: string | null | undefined): string {
  return status ? (SUBSCRIPTION_STATUS_WORDS[status] ?? status) : 'No subscription';
}
