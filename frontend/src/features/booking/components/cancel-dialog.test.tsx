import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Appointment, PaymentSummary } from '@loamline/shared-types';
import { describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, serve } from '@/features/auth/testing/render-routes';
import type * as apiClient from '@/lib/api-client';
import { CancelDialog } from './cancel-dialog';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const deposit: PaymentSummary = {
  id: 'p1',
  status: 'succeeded',
  kind: 'deposit',
  currency: 'GBP',
  amountMinor: 2000,
  paidMinor: 2000,
  paidAt: '2027-06-01T10:05:00+01:00',
  card: { brand: 'visa', last4: '4242' },
  refundedMinor: 0,
  netMinor: 2000,
  balanceDueMinor: 6900,
  lastError: null,
  refunds: [],
};

const booked = (over: Partial<Appointment>): Appointment => ({
  id: 'a1',
  status: 'confirmed',
  shop: {
    id: 's',
    slug: 'ridge-works',
    name: 'Ridge Works',
    town: 'Hillcombe',
    timeZone: 'Europe/London',
    currency: 'GBP',
  },
  service: { id: 'v', name: 'Fork lower service', durationMinutes: 60, priceMinor: 8900, depositMinor: 2000 },
  start: '2027-06-15T10:00:00+01:00',
  end: '2027-06-15T11:00:00+01:00',
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
  payment: deposit,
  createdAt: '2027-06-01T10:00:00Z',
  ...over,
});

async function open(a: Appointment, windowHours?: number) {
  await renderRoutes(
    [{ path: '/', element: <CancelDialog a={a} windowHours={windowHours} open onClose={() => {}} /> }],
    '/',
  );
  return screen.findByRole('dialog', { name: 'Cancel this appointment?' });
}

describe('the cancel dialog says what comes back before the rider confirms', () => {
  it('early enough: the whole deposit back', async () => {
    const dialog = await open(booked({}), 48);
    expect(dialog).toHaveTextContent("You'll get £20.00 back: it is early enough for a full refund.");
  });

  it('inside the window: the deposit is kept, the window named', async () => {
    const dialog = await open(booked({ fullRefundIfCancelled: false, refundIfCancelledMinor: 0 }), 48);
    expect(dialog).toHaveTextContent(
      "The deposit of £20.00 is kept: you're inside the shop's 48-hour cancellation window.",
    );
    expect(dialog).not.toHaveTextContent("You'll get");
  });

  it('the amount is what the server says comes back, not the service’s deposit', async () => {
    // the shop already refunded £5.00 by hand: £15.00 is left to come back
    const partly = { ...deposit, refundedMinor: 500, netMinor: 1500 };
    const dialog = await open(booked({ payment: partly, refundIfCancelledMinor: 1500 }), 48);
    expect(dialog).toHaveTextContent("You'll get £15.00 back");
  });

  it('free services: unchanged', async () => {
    const dialog = await open(
      booked({
        service: { id: 'f', name: 'Free bench check', durationMinutes: 20, priceMinor: 0, depositMinor: 0 },
        payment: null,
        refundIfCancelledMinor: 0,
      }),
    );
    expect(dialog).toHaveTextContent('Nothing was paid in advance, so cancelling costs nothing.');
  });
});

describe('the cancel dialog when the server refuses (409)', { timeout: 30_000 }, () => {
  it('a hold that lapsed meanwhile: a plain sentence, not the raw state, and the page is asked again', async () => {
    const past = new Date(Date.now() - 1000).toISOString();
    const unpaidHold = { ...deposit, status: 'requires_payment_method' as const, paidMinor: 0, netMinor: 0 };
    const get = vi.fn(() =>
      booked({ status: 'expired', holdExpiresAt: past, canCancel: false, payment: unpaidHold }),
    );
    serve({
      'POST /appointments/a1/cancel': () => {
        throw apiError(409, 'an appointment that is expired cannot be cancelled');
      },
      'GET /appointments/a1': get,
      'GET /appointments': () => [],
    });
    const dialog = await open(booked({ status: 'held', holdExpiresAt: past, payment: unpaidHold }));
    await userEvent.setup().click(screen.getByRole('button', { name: 'Cancel appointment' }));
    expect(
      await screen.findByText(
        'There is nothing to cancel: the hold had already ended, so the time went back to other riders and nothing was charged.',
      ),
    ).toBeInTheDocument();
    expect(dialog).not.toHaveTextContent('cannot be cancelled');
    expect(get).toHaveBeenCalled();
    // nothing to confirm any more
    expect(screen.queryByRole('button', { name: 'Cancel appointment' })).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Close' })).toBeInTheDocument();
  });
});
