import { describe, expect, it } from 'vitest';
import { formatMoney, minorDigits } from './money';

describe('formatMoney (minor units → the currency, ISO 4217 digits)', () => {
  it('knows how many minor units a currency has', () => {
    expect(minorDigits('EUR')).toBe(2);
    expect(minorDigits('JPY')).toBe(0);
    expect(minorDigits('BHD')).toBe(3);
  });

  it('divides by the currency’s minor units and writes it the locale’s way', () => {
    expect(formatMoney(8900, 'EUR', 'en-GB')).toBe('€89.00');
    expect(formatMoney(8900, 'EUR', 'de-DE')).toBe('89,00\u00a0€');
    expect(formatMoney(2050, 'USD', 'en-US')).toBe('$20.50');
    expect(formatMoney(4500, 'JPY', 'en-US')).toBe('¥4,500');
    expect(formatMoney(12345, 'BHD', 'en-GB')).toBe('BHD\u00a012.345');
    expect(formatMoney(0, 'CHF', 'en-GB')).toBe('CHF\u00a00.00');
  });

  it('keeps one-cent amounts exact', () => {
    expect(formatMoney(1, 'EUR', 'en-GB')).toBe('€0.01');
    expect(formatMoney(10_000_000, 'EUR', 'en-GB')).toBe('€100,000.00');
  });
});
