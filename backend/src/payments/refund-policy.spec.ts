import fc from 'fast-check';
import { insideWindow, refundFor, type RefundFacts } from './refund-policy';

/*
 * Who gets what back. The rules are the product's (docs/payments.md): common practice for
 * workshop bookings (no source): a shop that declines or cancels returns everything; a rider who
 * cancels in good time gets everything back; a late cancellation keeps the deposit.
 */
const HOUR = 3_600_000;
const start = Date.UTC(2027, 2, 29, 7, 0);
const facts = (over: Partial<RefundFacts> = {}): RefundFacts => ({
  event: 'cancel',
  side: 'rider',
  paidMinor: 2000,
  refundedMinor: 0,
  chargedMinor: 2000,
  nowMs: start - 72 * HOUR,
  startMs: start,
  cancellationWindowHours: 48,
  ...over,
});

describe('refundFor', () => {
  it('a rider cancelling before the window gets everything back', () => {
    expect(refundFor(facts())).toMatchObject({ kind: 'rider-cancel', amountMinor: 2000 });
    // exactly at the window's edge still counts as in good time (the rider sees "full refund until …")
    expect(refundFor(facts({ nowMs: start - 48 * HOUR }))).toMatchObject({ amountMinor: 2000 });
  });

  it('a rider cancelling inside the window gets nothing back: the deposit is kept', () => {
    expect(refundFor(facts({ nowMs: start - 48 * HOUR + 1 }))).toBeNull();
    expect(refundFor(facts({ nowMs: start - HOUR }))).toBeNull();
  });

  it('a move made inside the window keeps the deposit, whatever the new time', () => {
    // moved from a time 24 hours away to one 30 days away: the deposit stays due
    expect(refundFor(facts({ nowMs: start - 30 * 24 * HOUR, depositKept: true }))).toBeNull();
    expect(refundFor(facts({ event: 'decline', side: 'staff', depositKept: true }))).toMatchObject({
      amountMinor: 2000,
    });
  });

  it('a decline, a shop cancellation and a late payment return everything, whenever', () => {
    for (const nowMs of [start - 72 * HOUR, start - HOUR]) {
      expect(refundFor(facts({ event: 'decline', side: 'staff', nowMs }))).toMatchObject({
        kind: 'decline',
        amountMinor: 2000,
      });
      expect(refundFor(facts({ side: 'staff', nowMs }))).toMatchObject({
        kind: 'shop-cancel',
        amountMinor: 2000,
      });
      expect(refundFor(facts({ event: 'late-payment', side: 'system', nowMs }))).toMatchObject({
        kind: 'late-payment',
        amountMinor: 2000,
      });
    }
  });

  it('never gives back more than is left after earlier refunds, and nothing when nothing was paid', () => {
    expect(refundFor(facts({ refundedMinor: 500 }))).toMatchObject({ amountMinor: 1500 });
    expect(refundFor(facts({ refundedMinor: 2000 }))).toBeNull();
    expect(refundFor(facts({ paidMinor: 0 }))).toBeNull();
  });

  it('property: 0 ≤ refund ≤ paid − refunded, and the deposit is kept only inside the window', () => {
    fc.assert(
      fc.property(
        fc.constantFrom<RefundFacts['event']>('decline', 'cancel', 'late-payment'),
        fc.constantFrom<RefundFacts['side']>('rider', 'staff', 'system'),
        fc.integer({ min: 0, max: 100_000 }),
        fc.integer({ min: 0, max: 100_000 }),
        fc.integer({ min: 0, max: 100_000 }),
        fc.integer({ min: -200, max: 200 }),
        fc.integer({ min: 0, max: 168 }),
        (event, side, paid, refundedRaw, charged, hoursBefore, windowH) => {
          const refunded = Math.min(paid, refundedRaw);
          const f = facts({
            event,
            side,
            paidMinor: paid,
            refundedMinor: refunded,
            chargedMinor: Math.min(charged, paid),
            nowMs: start - hoursBefore * HOUR,
            cancellationWindowHours: windowH,
          });
          const d = refundFor(f);
          const amount = d?.amountMinor ?? 0;
          expect(amount).toBeGreaterThanOrEqual(0);
          expect(amount).toBeLessThanOrEqual(paid - refunded);
          if (d) expect(d.amountMinor).toBeGreaterThan(0);
          const keepsDeposit = event === 'cancel' && side === 'rider' && (insideWindow(f) || !!f.depositKept);
          if (!keepsDeposit) expect(amount).toBe(paid - refunded);
          else expect(amount).toBe(Math.max(0, paid - refunded - f.chargedMinor));
        },
      ),
      { numRuns: 1000 },
    );
  });
});
