import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Appointment, PaymentSession, PaymentSummary } from '@loamline/shared-types';
import type { PaymentIntentResult } from '@stripe/stripe-js';
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, rider, serve, Where } from '@/features/auth/testing/render-routes';
import { AppointmentPage } from '@/features/booking/components/appointment-page';
import { api } from '@/lib/api-client';
import type * as apiClient from '@/lib/api-client';
import { DECLINED, INSUFFICIENT_FUNDS } from '../utils/card-errors';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

/*
 * The payment library is the real `@stripe/stripe-js/pure` + `@stripe/react-stripe-js`; only
 * `window.Stripe` is a stand-in (as the local payment fake's script would define it): its card
 * element renders a labelled input, and `confirmCardPayment` answers what each test says.
 */
const confirmCardPayment = vi.fn<(secret: string, data: unknown) => Promise<PaymentIntentResult>>();
const card = {
  mount(node: HTMLElement) {
    node.innerHTML = '<label>Card number <input name="cardnumber" autocomplete="cc-number"></label>';
  },
  on: vi.fn(),
  off: vi.fn(),
  update: vi.fn(),
  unmount: vi.fn(),
  destroy: vi.fn(),
};
const stripe = {
  elements: () => ({ create: () => card, getElement: () => card, update: vi.fn() }),
  createToken: vi.fn(),
  createPaymentMethod: vi.fn(),
  confirmCardPayment,
};
beforeAll(() => {
  window.Stripe = Object.assign(() => stripe, { version: 'endive' }) as unknown as typeof window.Stripe;
});

const inTenMinutes = () => new Date(Date.now() + 10 * 60_000).toISOString();

const unpaid: PaymentSummary = {
  id: 'p1',
  status: 'requires_payment_method',
  kind: 'deposit',
  currency: 'GBP',
  amountMinor: 2000,
  paidMinor: 0,
  paidAt: null,
  card: null,
  refundedMinor: 0,
  netMinor: 0,
  balanceDueMinor: 0,
  lastError: null,
  refunds: [],
};

const held = (holdExpiresAt: string): Appointment => ({
  id: 'a1',
  status: 'held',
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
  holdExpiresAt,
  bike: null,
  baselineSheetId: null,
  notes: '',
  proposedStart: null,
  declineReason: null,
  cancelReason: null,
  canCancel: true,
  canMove: false,
  fullRefundIfCancelled: true,
  refundIfCancelledMinor: 0,
  payment: unpaid,
  createdAt: '2027-06-01T10:00:00Z',
});

const session = (holdExpiresAt: string): PaymentSession => ({
  clientSecret: 'pi_1_secret_2',
  publishableKey: 'pk_test_loamline',
  scriptUrl: null,
  amountMinor: 2000,
  currency: 'GBP',
  kind: 'deposit',
  holdExpiresAt,
});

const paidAppointment = (a: Appointment): Appointment => ({
  ...a,
  status: 'requested',
  holdExpiresAt: null,
  refundIfCancelledMinor: 2000,
  payment: {
    ...unpaid,
    status: 'succeeded',
    paidMinor: 2000,
    paidAt: '2027-06-01T10:05:00+01:00',
    card: { brand: 'visa', last4: '4242' },
    netMinor: 2000,
    balanceDueMinor: 6900,
  },
});

const routes = [
  { path: '/appointments/:id', element: <AppointmentPage /> },
  { path: '*', element: <Where /> },
];

function serveHeld(holdExpiresAt: string, sync = vi.fn(() => paidAppointment(held(holdExpiresAt)))) {
  let paid = false;
  serve({
    'GET /auth/me': () => rider,
    'GET /appointments/a1': () => (paid ? paidAppointment(held(holdExpiresAt)) : held(holdExpiresAt)),
    'GET /appointments/a1/payment': () => session(holdExpiresAt),
    'GET /shops/ridge-works': () => {
      throw apiError(404, 'No such shop.');
    },
    'POST /appointments/a1/payment/sync': () => {
      paid = true;
      return sync();
    },
  });
  return sync;
}

// the first render imports the lazy payment chunk; a busy 2-core runner needs more than the defaults
const slow = { timeout: 10_000 };

describe('the payment step on a held appointment', { timeout: 30_000 }, () => {
  beforeEach(() => {
    vi.clearAllMocks();
  });

  it('shows what is paid and until when, the test cards, and a labelled card field', async () => {
    serveHeld(inTenMinutes());
    await renderRoutes(routes, '/appointments/a1');
    expect(
      await screen.findByRole('heading', { name: 'Pay the deposit to keep this time' }),
    ).toBeInTheDocument();
    expect(
      screen.getByText('The deposit for Fork lower service; the rest, £69.00, at the shop.'),
    ).toBeInTheDocument();
    expect(screen.getByText(/Held for you until/)).toHaveTextContent(/London time/);
    expect(screen.getByText(/\d+:\d\d left/)).toBeInTheDocument();
    expect(screen.getByRole('complementary', { name: 'Test cards' })).toHaveTextContent(
      '4000 0000 0000 0002',
    );
    expect(await screen.findByLabelText('Card number', {}, slow)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Pay £20.00' })).toBeEnabled();
  });

  it('declined: says so, nothing charged, and the form stays for another card; then it pays and syncs', async () => {
    const sync = serveHeld(inTenMinutes());
    confirmCardPayment.mockResolvedValueOnce({
      error: {
        type: 'card_error',
        code: 'card_declined',
        decline_code: 'generic_decline',
        message: 'Declined.',
      },
    });
    await renderRoutes(routes, '/appointments/a1');
    const user = userEvent.setup();
    await screen.findByLabelText('Card number', {}, slow);
    await user.click(screen.getByRole('button', { name: 'Pay £20.00' }));
    const declined = await screen.findByText(DECLINED);
    expect(declined.closest('[role="alert"]')).toHaveFocus();
    expect(confirmCardPayment).toHaveBeenCalledWith('pi_1_secret_2', { payment_method: { card } });
    expect(sync).not.toHaveBeenCalled();

    // insufficient funds on the next card
    confirmCardPayment.mockResolvedValueOnce({
      error: { type: 'card_error', code: 'card_declined', decline_code: 'insufficient_funds', message: 'x' },
    });
    await user.click(screen.getByRole('button', { name: 'Pay £20.00' }));
    expect(await screen.findByText(INSUFFICIENT_FUNDS)).toBeInTheDocument();
    expect(screen.queryByText(DECLINED)).not.toBeInTheDocument();

    // a good card
    confirmCardPayment.mockResolvedValueOnce({
      paymentIntent: { status: 'succeeded' },
    } as PaymentIntentResult);
    await user.click(screen.getByRole('button', { name: 'Pay £20.00' }));
    expect(await screen.findByText('Paid — the shop will confirm your time')).toBeInTheDocument();
    expect(sync).toHaveBeenCalledTimes(1);
    // the form is gone (never offered twice) and the receipt shows the card
    expect(screen.queryByRole('button', { name: /^Pay / })).not.toBeInTheDocument();
    expect(await screen.findByText('Visa ····4242')).toBeInTheDocument();
    expect(screen.getByRole('row', { name: /To pay at the shop/ })).toHaveTextContent('£69.00');
  });

  it('when the hold has passed: the time was released, pick another', async () => {
    serveHeld(new Date(Date.now() - 1000).toISOString());
    await renderRoutes(routes, '/appointments/a1');
    expect(await screen.findByText('The time was released', {}, slow)).toBeInTheDocument();
    // the booking flow again, with the same service and day picked
    expect(screen.getByRole('link', { name: 'Pick another time' })).toHaveAttribute(
      'href',
      '/shops/ridge-works?service=v&day=2027-06-15&step=time',
    );
    expect(screen.queryByRole('button', { name: /^Pay / })).not.toBeInTheDocument();
  });

  it('when the hold ends with the page open, the whole page moves to lapsed and asks the server again', async () => {
    const ends = new Date(Date.now() + 1500).toISOString();
    serveHeld(ends);
    const gets = () =>
      vi.mocked(api).mock.calls.filter(([path, init]) => path === '/appointments/a1' && !init).length;
    await renderRoutes(routes, '/appointments/a1');
    expect(
      await screen.findByRole('heading', { name: 'Pay the deposit to keep this time' }),
    ).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Cancel appointment' })).toBeInTheDocument();
    expect(screen.getByRole('row', { name: /To pay online \(deposit\) — not paid/ })).toBeInTheDocument();
    const before = gets();

    expect(await screen.findByText('The time was released', {}, slow)).toBeInTheDocument();
    // the header, the pay wording, the receipt and the actions all agree, before the server does
    expect(screen.getByText('Lapsed')).toBeInTheDocument();
    expect(screen.queryByText('Held, not paid')).not.toBeInTheDocument();
    expect(screen.queryByText(/held for you until the payment arrives/)).not.toBeInTheDocument();
    expect(screen.queryByRole('heading', { name: /^Pay / })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /^Pay / })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Cancel appointment' })).not.toBeInTheDocument();
    expect(screen.getByRole('row', { name: /Nothing was charged/ })).toBeInTheDocument();
    expect(screen.queryByText(/To pay online/)).not.toBeInTheDocument();
    // asked again at zero
    await waitFor(() => expect(gets()).toBeGreaterThan(before));
  });

  it('an expired appointment: the payment box says nothing was charged, not "not paid"', async () => {
    const past = new Date(Date.now() - 60_000).toISOString();
    serve({
      'GET /auth/me': () => rider,
      'GET /appointments/a1': () => ({
        ...held(past),
        status: 'expired',
        canCancel: false,
        payment: { ...unpaid, status: 'canceled', balanceDueMinor: 0 },
      }),
      'GET /shops/ridge-works': () => {
        throw apiError(404, 'No such shop.');
      },
    });
    await renderRoutes(routes, '/appointments/a1');
    expect(await screen.findByText('The time was released')).toBeInTheDocument();
    expect(screen.getByRole('row', { name: /Nothing was charged/ })).toHaveTextContent('£0.00');
    expect(screen.queryByText(/not paid/)).not.toBeInTheDocument();
  });
});
