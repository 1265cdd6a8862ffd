import { describe, expect, it } from 'vitest';
import { formatBytes, formatMoney, subscriptionStatusWords, toMinorUnits } from './billing-format';

describe('formatBytes(bytes)', () => {
  it('uses decimal units with a few significant digits', () => {
    expect(formatBytes(0)).toBe('0 bytes');
    expect(formatBytes(1)).toBe('1 byte');
    expect(formatBytes(999)).toBe('999 bytes');
    expect(formatBytes(1_500_000)).toBe('1.5 MB');
    expect(formatBytes(5_000_000_000)).toBe('5 GB');
    expect(formatBytes(123_456_789_012)).toBe('123 GB');
    expect(formatBytes(1e12)).toBe('1 TB');
  });
  it('shows a dash for non-finite input', () => {
    expect(formatBytes(Number.NaN)).toBe('—');
  });
});

describe('formatMoney(minor, currency)', () => {
  it('formats in the currency with Intl.NumberFormat', () => {
    expect(formatMoney(1250, 'eur')).toBe('€12.50');
    expect(formatMoney(900, 'GBP')).toBe('£9.00');
    expect(formatMoney(1250, 'EUR', 'de-DE')).toBe('12,50\u00a0€'); // Intl puts a no-break space before the sign
    expect(formatMoney(500, 'JPY')).toBe('JP¥500');
  });
});

describe('toMinorUnits(amount, currency)', () => {
  it('converts plain decimal amounts and refuses others', () => {
    expect(toMinorUnits('12.5', 'EUR')).toBe(1250);
    expect(toMinorUnits('12.05', 'EUR')).toBe(1205);
    expect(toMinorUnits('0', 'GBP')).toBe(0);
    expect(toMinorUnits('12.505', 'EUR')).toBeNaN();
    expect(toMinorUnits('1,5', 'EUR')).toBeNaN();
    expect(toMinorUnits('500', 'JPY')).toBe(500);
  });
});

describe('subscriptionStatusWords(status)', () => {
  it('words the provider statuses as the storage page does, and keeps an unknown one as it is', () => {
    expect(subscriptionStatusWords('past_due')).toBe('Payment due');
    expect(subscriptionStatusWords('active')).toBe('Active');
    expect(subscriptionStatusWords('none')).toBe('No subscription');
    expect(subscriptionStatusWords(null)).toBe('No subscription');
    expect(subscriptionStatusWords('something_new')).toBe('something_new');
  });
});
