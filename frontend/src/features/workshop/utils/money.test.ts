import { describe, expect, it } from 'vitest';
import { formatMoney, minorDigits, toMajorInput, toMinor } from './money';

describe('money in the shop currency', () => {
  it('knows minor digits from Intl (ISO 4217)', () => {
    expect(minorDigits('EUR')).toBe(2);
    expect(minorDigits('JPY')).toBe(0);
    expect(minorDigits('BHD')).toBe(3);
  });
  it('turns major units into minor units and back', () => {
    expect(toMinor('89', 'USD')).toBe(8900);
    expect(toMinor('12.5', 'EUR')).toBe(1250);
    expect(toMinor('12,05', 'EUR')).toBe(1205);
    expect(toMinor('0', 'EUR')).toBe(0);
    expect(toMinor('1500', 'JPY')).toBe(1500);
    expect(toMinor('1.5', 'JPY')).toBeNull();
    expect(toMinor('12.345', 'EUR')).toBeNull();
    expect(toMinor('-3', 'EUR')).toBeNull();
    expect(toMinor('', 'EUR')).toBeNull();
    expect(toMajorInput(8900, 'USD')).toBe('89.00');
    expect(toMajorInput(1500, 'JPY')).toBe('1500');
  });
  it('says Free for nothing', () => {
    expect(formatMoney(0, 'EUR')).toBe('Free');
    expect(formatMoney(8900, 'USD')).toBe('US$89.00');
  });
});
