import { render, screen, within } from '@testing-library/react';
import type { PaymentSummary } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import { AppTheme } from '@/theme/app-theme';
import { PaymentReceipt } from './payment-receipt';

// a $65 service, $20 deposit paid, $5 refunded by hand: the rest still goes ahead
const refundedInPart: PaymentSummary = {
  id: 'p1',
  status: 'succeeded',
  kind: 'deposit',
  currency: 'USD',
  amountMinor: 2000,
  paidMinor: 2000,
  paidAt: '2026-12-02T01:06:00-07:00',
  card: { brand: 'visa', last4: '4242' },
  refundedMinor: 500,
  netMinor: 1500,
  balanceDueMinor: 4500,
  lastError: null,
  refunds: [
    {
      id: 'r1',
      amountMinor: 500,
      kind: 'manual',
      reason: 'Seal kit was cheaper',
      by: 'staff',
      byName: 'Olu Owner',
      status: 'succeeded',
      createdAt: '2026-12-02T02:00:00-07:00',
    },
  ],
};

const amountOf = (label: RegExp) => within(screen.getByRole('row', { name: label })).getAllByRole('cell')[0];

function show(p: PaymentSummary, props: { priceMinor?: number; appointmentStatus?: string } = {}) {
  render(
    <AppTheme>
      <PaymentReceipt payment={p} zone="America/Denver" viewer="rider" {...props} />
    </AppTheme>,
  );
}

describe('the receipt adds up after a refund by hand', () => {
  it('price − refunded = net paid + to pay at the shop, said as a line', () => {
    show(refundedInPart, { priceMinor: 6500, appointmentStatus: 'requested' });
    expect(amountOf(/Price of the service/)).toHaveTextContent('$65.00');
    expect(amountOf(/Total for the service after refunds/)).toHaveTextContent('$60.00');
    expect(amountOf(/Net paid/)).toHaveTextContent('$15.00');
    expect(amountOf(/To pay at the shop/)).toHaveTextContent('$45.00');
  });

  it('refunded in full while it still goes ahead', () => {
    show(
      { ...refundedInPart, refundedMinor: 2000, netMinor: 0 },
      { priceMinor: 6500, appointmentStatus: 'confirmed' },
    );
    expect(amountOf(/Total for the service after refunds/)).toHaveTextContent('$45.00');
    expect(amountOf(/Net paid/)).toHaveTextContent('$0.00');
    expect(amountOf(/To pay at the shop/)).toHaveTextContent('$45.00');
  });

  it('the owner’s list has no price: it is what was paid plus what is left at the shop', () => {
    show(refundedInPart, { appointmentStatus: 'requested' });
    expect(amountOf(/Total for the service after refunds/)).toHaveTextContent('$60.00');
  });

  it('no line without a refund, nor once the appointment is off', () => {
    show(
      { ...refundedInPart, refundedMinor: 0, netMinor: 2000, refunds: [] },
      { priceMinor: 6500, appointmentStatus: 'requested' },
    );
    expect(screen.queryByText(/after refunds/)).not.toBeInTheDocument();
  });

  it('cancelled after a refund: no total for a service that does not happen', () => {
    show({ ...refundedInPart, balanceDueMinor: 0 }, { priceMinor: 6500, appointmentStatus: 'cancelled' });
    expect(screen.queryByText(/after refunds/)).not.toBeInTheDocument();
  });
});

describe('an unpaid payment that will never be paid', () => {
  const unpaid: PaymentSummary = {
    ...refundedInPart,
    status: 'requires_payment_method',
    paidMinor: 0,
    paidAt: null,
    card: null,
    refundedMinor: 0,
    netMinor: 0,
    balanceDueMinor: 4500,
    lastError: 'Your card was declined.',
    refunds: [],
  };

  it('still held: to pay online, not paid', () => {
    show(unpaid, { priceMinor: 6500, appointmentStatus: 'held' });
    expect(amountOf(/To pay online \(deposit\) — not paid/)).toHaveTextContent('$20.00');
  });

  it.each(['expired', 'cancelled'])(
    '%s: nothing was charged, nothing owed at the shop',
    (appointmentStatus) => {
      show(unpaid, { priceMinor: 6500, appointmentStatus });
      expect(amountOf(/Nothing was charged/)).toHaveTextContent('$0.00');
      expect(screen.queryByText(/not paid/)).not.toBeInTheDocument();
      expect(screen.queryByText(/To pay at the shop/)).not.toBeInTheDocument();
      expect(screen.queryByText(/Last attempt/)).not.toBeInTheDocument();
    },
  );

  it('the intent was cancelled: nothing was charged', () => {
    show({ ...unpaid, status: 'canceled' }, { priceMinor: 6500 });
    expect(screen.getByRole('row', { name: /Nothing was charged/ })).toBeInTheDocument();
  });
});
