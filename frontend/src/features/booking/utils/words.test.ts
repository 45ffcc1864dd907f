import type { Appointment, PaymentSummary } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import {
  bookingWindowInWords,
  cancelConsequence,
  cancellationPolicy,
  durationInWords,
  moneyBackInWords,
  paymentInWords,
  priceInWords,
  splitAppointments,
  stateInWords,
} from './words';

const free = { priceMinor: 0, depositMinor: 0 };
const atShop = { priceMinor: 4500, depositMinor: 0 };
const deposit = { priceMinor: 8900, depositMinor: 2000 };
const full = { priceMinor: 6900, depositMinor: 6900 };

/** A deposit of €20.00, paid by card, nothing refunded yet. */
const paidDeposit: PaymentSummary = {
  id: 'p1',
  status: 'succeeded',
  kind: 'deposit',
  currency: 'EUR',
  amountMinor: 2000,
  paidMinor: 2000,
  paidAt: '2027-06-01T10:05:00+02:00',
  card: { brand: 'visa', last4: '4242' },
  refundedMinor: 0,
  netMinor: 2000,
  balanceDueMinor: 6900,
  lastError: null,
  refunds: [],
};

const appointment = (over: Partial<Appointment> = {}): Appointment => ({
  id: 'a1',
  status: 'requested',
  shop: {
    id: 's',
    slug: 's',
    name: 'Test Shop',
    town: 'Testwick',
    timeZone: 'Europe/Berlin',
    currency: 'EUR',
  },
  service: { id: 'v', name: 'Air spring setup', durationMinutes: 60, ...deposit },
  start: '2027-06-15T10:00:00+02:00',
  end: '2027-06-15T11:00:00+02:00',
  bench: 1,
  holdExpiresAt: null,
  bike: null,
  baselineSheetId: null,
  notes: '',
  proposedStart: null,
  declineReason: null,
  cancelReason: null,
  canCancel: true,
  canMove: true,
  fullRefundIfCancelled: true,
  refundIfCancelledMinor: 2000,
  payment: paidDeposit,
  createdAt: '2027-06-01T10:00:00Z',
  ...over,
});

describe('money and rules in words', () => {
  it('prices and how paying works', () => {
    expect(priceInWords(free, 'EUR', 'en-GB')).toBe('Free');
    expect(priceInWords(deposit, 'EUR', 'en-GB')).toBe('€89.00');
    expect(paymentInWords(free, 'EUR', 'en-GB')).toBe('Free: nothing to pay.');
    expect(paymentInWords(atShop, 'EUR', 'en-GB')).toBe(
      'Nothing to pay when booking; you pay €45.00 at the shop.',
    );
    expect(paymentInWords(deposit, 'EUR', 'en-GB')).toBe(
      'A deposit of €20.00 when booking; the other €69.00 at the shop.',
    );
    expect(paymentInWords(full, 'USD', 'en-US')).toBe('Paid in full when booking: $69.00.');
  });

  it('the cancellation policy', () => {
    expect(cancellationPolicy(48, deposit)).toBe(
      'Cancel at least 48 hours before for a full refund; later, the deposit is kept.',
    );
    expect(cancellationPolicy(1, full)).toBe(
      'Cancel at least 1 hour before for a full refund; later, the payment is kept.',
    );
    expect(cancellationPolicy(24, free)).toMatch(/cancelling costs nothing; please cancel at least 24 hours/);
  });

  it('durations', () => {
    expect(durationInWords(45)).toBe('45 min');
    expect(durationInWords(60)).toBe('1 h');
    expect(durationInWords(90)).toBe('1 h 30 min');
  });

  it('what cancelling gives back, from refundIfCancelledMinor and fullRefundIfCancelled', () => {
    expect(cancelConsequence(appointment(), 'en-GB', 48)).toBe(
      "You'll get €20.00 back: it is early enough for a full refund.",
    );
    expect(
      cancelConsequence(
        appointment({ fullRefundIfCancelled: false, refundIfCancelledMinor: 0 }),
        'en-GB',
        48,
      ),
    ).toBe("The deposit of €20.00 is kept: you're inside the shop's 48-hour cancellation window.");
    // the window unknown (the shop's page not loaded): still the amount, without the hours
    expect(
      cancelConsequence(appointment({ fullRefundIfCancelled: false, refundIfCancelledMinor: 0 }), 'en-GB'),
    ).toBe('The deposit of €20.00 is kept: it is too close to the start for a full refund.');
    // paid in full: the payment is kept; the amount comes from the receipt, not the service
    const fullPaid = {
      ...paidDeposit,
      kind: 'full' as const,
      amountMinor: 6900,
      paidMinor: 6900,
      netMinor: 6900,
    };
    expect(
      cancelConsequence(
        appointment({
          service: { id: 'v', name: 'Fork service', durationMinutes: 60, ...full },
          payment: { ...fullPaid, balanceDueMinor: 0 },
          fullRefundIfCancelled: false,
          refundIfCancelledMinor: 0,
        }),
        'en-GB',
        24,
      ),
    ).toBe("The payment of €69.00 is kept: you're inside the shop's 24-hour cancellation window.");
    // a hold was never paid: nothing to keep or refund, whatever the clock says
    expect(
      cancelConsequence(
        appointment({
          status: 'held',
          fullRefundIfCancelled: false,
          refundIfCancelledMinor: 0,
          payment: {
            ...paidDeposit,
            status: 'requires_payment_method',
            paidMinor: 0,
            netMinor: 0,
            paidAt: null,
          },
        }),
      ),
    ).toBe('Nothing has been paid for this hold, so nothing is charged.');
    expect(
      cancelConsequence(
        appointment({
          service: { id: 'v', name: 'Check', durationMinutes: 30, ...free },
          payment: null,
          refundIfCancelledMinor: 0,
        }),
      ),
    ).toBe('Nothing was paid in advance, so cancelling costs nothing.');
  });

  it('where the money stands after a cancellation or a decline', () => {
    const refund = (status: 'pending' | 'succeeded' | 'failed') => ({
      id: 'r1',
      amountMinor: 2000,
      kind: 'rider-cancel' as const,
      reason: '',
      by: 'rider' as const,
      byName: null,
      status,
      createdAt: '2027-06-02T10:00:00Z',
    });
    const ended = (status: 'pending' | 'succeeded' | 'failed' | null) =>
      appointment({
        status: 'cancelled',
        payment: { ...paidDeposit, refunds: status ? [refund(status)] : [] },
      });
    expect(moneyBackInWords(appointment(), 'en-GB')).toBeNull(); // still on
    expect(moneyBackInWords(ended('pending'), 'en-GB')).toBe('€20.00 is on its way back to your card.');
    expect(moneyBackInWords(ended('succeeded'), 'en-GB')).toBe(
      '€20.00 went back to your card; it can take a few days to show.',
    );
    expect(moneyBackInWords(ended(null), 'en-GB')).toBe('€20.00 paid online is kept by the shop.');
    expect(moneyBackInWords(ended('failed'), 'en-GB')).toMatch(/^The refund didn't go through/);
    // nothing paid: nothing to say
    expect(
      moneyBackInWords(appointment({ status: 'cancelled', payment: { ...paidDeposit, paidMinor: 0 } })),
    ).toBeNull();
  });

  it('states in words', () => {
    expect(stateInWords(appointment())).toBe('Waiting for Test Shop to confirm.');
    expect(stateInWords(appointment({ status: 'declined', declineReason: 'Bench down' }))).toBe(
      'Test Shop declined it: “Bench down”',
    );
    expect(stateInWords(appointment({ status: 'held' }))).toMatch(/held for you until the payment arrives/);
  });

  it('upcoming soonest first, past latest first', () => {
    const now = Date.parse('2027-06-10T00:00:00Z');
    const later = appointment({
      id: 'later',
      start: '2027-06-20T10:00:00+02:00',
      end: '2027-06-20T11:00:00+02:00',
    });
    const soon = appointment({
      id: 'soon',
      start: '2027-06-12T10:00:00+02:00',
      end: '2027-06-12T11:00:00+02:00',
    });
    const cancelled = appointment({
      id: 'cancelled',
      status: 'cancelled',
      start: '2027-06-05T10:00:00+02:00',
      end: '2027-06-05T11:00:00+02:00',
    });
    const over = appointment({
      id: 'over',
      start: '2027-06-01T10:00:00+02:00',
      end: '2027-06-01T11:00:00+02:00',
    });
    const { upcoming, past } = splitAppointments([later, cancelled, soon, over], now);
    expect(upcoming.map((a) => a.id)).toEqual(['soon', 'later']);
    expect(past.map((a) => a.id)).toEqual(['cancelled', 'over']);
  });

  it('by time, whatever the state: a cancelled or declined one still ahead is upcoming', () => {
    const now = Date.parse('2027-06-10T00:00:00Z');
    const ahead = (id: string, status: Appointment['status'], day: string) =>
      appointment({
        id,
        status,
        start: `2027-06-${day}T10:00:00+02:00`,
        end: `2027-06-${day}T11:00:00+02:00`,
      });
    const { upcoming, past } = splitAppointments(
      [
        ahead('declined', 'declined', '16'),
        ahead('cancelled', 'cancelled', '12'),
        ahead('confirmed', 'confirmed', '14'),
        ahead('old-cancelled', 'cancelled', '02'),
      ],
      now,
    );
    expect(upcoming.map((a) => a.id)).toEqual(['cancelled', 'confirmed', 'declined']);
    expect(past.map((a) => a.id)).toEqual(['old-cancelled']);
  });
});

describe('booking window in words', () => {
  it('notice and days ahead', () => {
    expect(bookingWindowInWords(0, 60)).toBe('Book up to 60 days ahead.');
    expect(bookingWindowInWords(120, 30)).toBe('Book at least 2 hours ahead and up to 30 days ahead.');
    expect(bookingWindowInWords(90, 1)).toBe('Book at least 90 minutes ahead and up to 1 day ahead.');
  });
});
