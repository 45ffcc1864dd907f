import { money, paymentMail, type PaymentMailFacts } from './payment-mails';

/*
 * Amounts in mails: minor units turned into the currency's own digits. Minor units per ISO 4217
 * (EUR and GBP 2, JPY 0, KWD 3), as Node's Intl (ICU's CLDR data) knows them.
 */
describe('money', () => {
  it('uses the currency’s minor units (ISO 4217)', () => {
    expect(money(2000, 'EUR')).toBe('€20.00');
    expect(money(6900, 'GBP')).toBe('£69.00');
    expect(money(2000, 'JPY')).toBe('JP¥2,000');
    expect(money(2000, 'KWD').replace(/\u00a0/g, ' ')).toBe('KWD 2.000'); // ICU puts a no-break space there
    expect(money(5, 'EUR')).toBe('€0.05');
  });
});

describe('paymentMail', () => {
  const f: PaymentMailFacts = {
    riderName: 'Ada Rider',
    shopName: 'Test Shop',
    shopTown: 'Testtown',
    serviceName: 'Fork setup',
    timeZone: 'Europe/Berlin',
    start: new Date('2027-03-29T07:00:00Z'),
    currency: 'EUR',
    priceMinor: 6900,
    paidMinor: 2000,
    paidAt: new Date('2027-03-20T10:00:00Z'),
    card: { brand: 'visa', last4: '4242' },
    refundedMinor: 0,
    refund: null,
    link: 'http://127.0.0.1/appointments/abc',
    appointmentId: '0d5c6a4e-1111-4222-8333-944445555666',
  };

  it('the receipt says what was paid, with which card, and what is left to pay at the shop', () => {
    const m = paymentMail('receipt', 'a@example.test', f);
    expect(m.subject).toBe('Payment received: €20.00 for Fork setup');
    expect(m.text).toContain('The rest, €49.00, is paid at the shop.');
    expect(m.text).toContain('Visa ending 4242');
    expect(m.text).toContain('reference 0D5C6A4E');
  });

  it('a refund says how much comes back and why, and what is kept', () => {
    const m = paymentMail('refund', 'a@example.test', {
      ...f,
      refundedMinor: 2000,
      refund: { amountMinor: 2000, reason: 'The shop declined the booking.' },
    });
    expect(m.subject).toBe('Refund: €20.00 for Fork setup');
    expect(m.text).toContain('€20.00 is on its way back to your card: The shop declined the booking.');
    expect(m.text).toContain('Refunded: €20.00. Kept: €0.00.');
  });

  it('a payment that went through after the rider cancelled says so (not "the hold ended")', () => {
    const m = paymentMail('paid-after-cancel', 'a@example.test', f);
    expect(m.subject).toBe('Refunded: your payment for Fork setup came after it was cancelled');
    expect(m.text).not.toMatch(/hold/);
  });
});
