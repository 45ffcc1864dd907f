import { describe, expect, it } from 'vitest';
import { formatMoney, formatRefund, minorDigits, toMinor } from './money';
import { cardErrorMessage, AUTHENTICATION_FAILED, DECLINED, INSUFFICIENT_FUNDS } from './card-errors';
import { refundableMinor } from './payment-words';

/*
 * Minor units per currency are ISO 4217's "minor unit" column (GBP 2, JPY 0, KWD 3), as the
 * browser's Intl knows it (`resolvedOptions().maximumFractionDigits`). Each expectation is built
 * with Intl itself, so the test holds in any locale the runner has.
 */
const intl = (major: number, currency: string, digits: number, locale?: string) =>
  new Intl.NumberFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: digits,
    maximumFractionDigits: digits,
  }).format(major);

describe('payment amounts from minor units (ISO 4217 minor units, via Intl)', () => {
  it('knows 2, 0 and 3 decimals', () => {
    expect(minorDigits('GBP')).toBe(2);
    expect(minorDigits('JPY')).toBe(0);
    expect(minorDigits('KWD')).toBe(3);
  });

  it('a yen amount is not divided by 100; a dinar amount is divided by 1000', () => {
    expect(formatMoney(3000, 'JPY', 'en-GB')).toBe(intl(3000, 'JPY', 0, 'en-GB'));
    expect(formatMoney(3000, 'JPY', 'ja-JP')).toBe(intl(3000, 'JPY', 0, 'ja-JP'));
    expect(formatMoney(12345, 'KWD', 'en-GB')).toBe(intl(12.345, 'KWD', 3, 'en-GB'));
    expect(formatMoney(12345, 'KWD', 'ar-KW')).toBe(intl(12.345, 'KWD', 3, 'ar-KW'));
    expect(formatMoney(2000, 'GBP', 'en-GB')).toBe('£20.00');
    // spelled out too, so a change in the conversion can't hide behind Intl
    expect(formatMoney(3000, 'JPY', 'en-US')).toBe('¥3,000');
    expect(formatMoney(12345, 'KWD', 'en-GB')).toBe('KWD\u00a012.345');
    // and in the browser's own language (no locale given)
    expect(formatMoney(2000, 'GBP')).toBe(intl(20, 'GBP', 2));
    expect(formatMoney(1, 'KWD')).toBe(intl(0.001, 'KWD', 3));
  });

  it('zero is an amount, never "Free"; a refund has a minus', () => {
    expect(formatMoney(0, 'GBP', 'en-GB')).toBe('£0.00');
    expect(formatRefund(2000, 'GBP', 'en-GB')).toBe('-£20.00');
    expect(formatRefund(2000, 'GBP', 'en-GB')).toBe(intl(-20, 'GBP', 2, 'en-GB'));
  });

  it('typed amounts back to minor units, refusing more decimals than the currency has', () => {
    expect(toMinor('15', 'GBP')).toBe(1500);
    expect(toMinor('1500', 'JPY')).toBe(1500);
    expect(toMinor('15.5', 'JPY')).toBeNull();
    expect(toMinor('1.234', 'KWD')).toBe(1234);
    expect(toMinor('1.2345', 'KWD')).toBeNull();
  });
});

describe('card errors in plain words', () => {
  it('by code and decline code, else the service’s own message', () => {
    expect(cardErrorMessage({ code: 'card_declined', decline_code: 'generic_decline', message: 'x' })).toBe(
      DECLINED,
    );
    expect(
      cardErrorMessage({ code: 'card_declined', decline_code: 'insufficient_funds', message: 'x' }),
    ).toBe(INSUFFICIENT_FUNDS);
    expect(cardErrorMessage({ code: 'payment_intent_authentication_failure', message: 'x' })).toBe(
      AUTHENTICATION_FAILED,
    );
    expect(
      cardErrorMessage({ code: 'incorrect_cvc', message: 'Your card’s security code is incorrect.' }),
    ).toBe('Your card’s security code is incorrect.');
  });
});

describe('what is left to refund', () => {
  const refund = (amountMinor: number, status: 'pending' | 'succeeded' | 'failed') => ({
    id: String(amountMinor),
    amountMinor,
    kind: 'manual' as const,
    reason: 'r',
    by: 'staff' as const,
    byName: 'Olu Owner',
    status,
    createdAt: '2027-06-01T10:00:00Z',
  });
  it('paid minus every refund that has not failed', () => {
    expect(refundableMinor({ paidMinor: 2000, refundedMinor: 0, refunds: [] })).toBe(2000);
    expect(
      refundableMinor({ paidMinor: 2000, refundedMinor: 500, refunds: [refund(500, 'succeeded')] }),
    ).toBe(1500);
    // a pending refund is already on its way: not offered again
    expect(
      refundableMinor({
        paidMinor: 2000,
        refundedMinor: 500,
        refunds: [refund(500, 'succeeded'), refund(700, 'pending')],
      }),
    ).toBe(800);
    expect(refundableMinor({ paidMinor: 2000, refundedMinor: 0, refunds: [refund(700, 'failed')] })).toBe(
      2000,
    );
  });
});
