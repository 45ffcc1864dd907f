import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { RefundRequest, WorkshopPaymentRow, WorkshopPayments } from '@loamline/shared-types';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, serve } from '@/features/auth/testing/render-routes';
import type * as apiClient from '@/lib/api-client';
import { useWorkshopPayments } from '../api/workshop-payments';
import { RefundDialog } from './refund-dialog';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

// £20.00 paid, £5.00 refunded already: £15.00 left
const row: WorkshopPaymentRow = {
  id: 'pay-1',
  status: 'succeeded',
  kind: 'deposit',
  currency: 'GBP',
  amountMinor: 2000,
  paidMinor: 2000,
  paidAt: '2027-06-01T10:05:00+01:00',
  card: { brand: 'visa', last4: '4242' },
  refundedMinor: 500,
  netMinor: 1500,
  balanceDueMinor: 6900,
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
      createdAt: '2027-06-02T09:00:00+01:00',
    },
  ],
  appointmentId: 'a1',
  appointmentStatus: 'confirmed',
  start: '2027-06-15T10:00:00+01:00',
  serviceName: 'Fork lower service',
  rider: { id: 'u-1', name: 'Ria Rider', email: 'ria@example.test' },
  intentId: 'pi_1',
  createdAt: '2027-06-01T10:00:00Z',
};

async function openDialog(onRefunded = vi.fn()) {
  await renderRoutes(
    [{ path: '/', element: <RefundDialog row={row} onClose={() => {}} onRefunded={onRefunded} /> }],
    '/',
  );
  await screen.findByRole('dialog', { name: 'Refund Ria Rider' });
  return {
    amount: screen.getByLabelText('Amount to refund'),
    reason: screen.getByLabelText(/^Reason/),
    onRefunded,
  };
}

describe('the refund dialog', { timeout: 30_000 }, () => {
  beforeEach(() => vi.clearAllMocks());

  it('starts at what is left, refuses more than that and nothing, and wants a reason', async () => {
    const post = vi.fn(() => ({ ...row, refundedMinor: 2000, netMinor: 0 }));
    serve({ 'POST /workshop/payments/pay-1/refunds': post });
    const { amount, reason } = await openDialog();
    expect(amount).toHaveValue('15.00');
    expect(screen.getByRole('dialog')).toHaveTextContent('Left to refund: £15.00');
    // the consequences, before the button
    expect(screen.getByText(/£15\.00 goes back to Ria Rider’s Visa ····4242/)).toBeInTheDocument();

    const user = userEvent.setup();
    await user.clear(amount);
    await user.type(amount, '15.01');
    await user.click(screen.getByRole('button', { name: 'Refund' }));
    expect(await screen.findByText('At most £15.00 is left to refund.')).toBeInTheDocument();
    expect(screen.getByText('Say why: it goes on the receipt and in your books.')).toBeInTheDocument();

    await user.clear(amount);
    await user.type(amount, '0');
    await user.click(screen.getByRole('button', { name: 'Refund' }));
    expect(await screen.findByText('Enter more than nothing.')).toBeInTheDocument();

    await user.type(reason, '   ');
    await user.click(screen.getByRole('button', { name: 'Refund' }));
    expect(screen.getByText('Say why: it goes on the receipt and in your books.')).toBeInTheDocument();
    expect(post).not.toHaveBeenCalled();
  });

  it('a double click sends one requestId; a retry after an error keeps it', async () => {
    let calls = 0;
    const post = vi.fn(async (_body: unknown) => {
      calls += 1;
      await new Promise((r) => setTimeout(r, 30));
      if (calls === 1) throw apiError(400, 'Too much.', { amountMinor: 'At most £15.00 is left to refund.' });
      return { ...row, refundedMinor: 1200, netMinor: 800 };
    });
    serve({ 'POST /workshop/payments/pay-1/refunds': post });
    const { amount, reason, onRefunded } = await openDialog();
    const user = userEvent.setup();
    await user.clear(amount);
    await user.type(amount, '7');
    await user.type(reason, 'Spring was not needed');
    expect(screen.getByText(/£7\.00 goes back to Ria Rider/)).toHaveTextContent(
      '£8.00 of this payment stays with the shop',
    );
    await user.dblClick(screen.getByRole('button', { name: 'Refund £7.00' }));
    // the server's field error lands on the field, in the dialog's own words and money format
    expect(
      await screen.findByText(
        'This payment changed meanwhile: at most £15.00 is left to refund. Check the amount and try again.',
      ),
    ).toBeInTheDocument();
    expect(post).toHaveBeenCalledTimes(1);

    await user.click(screen.getByRole('button', { name: 'Refund £7.00' }));
    await waitFor(() =>
      expect(onRefunded).toHaveBeenCalledWith(expect.objectContaining({ id: 'pay-1' }), 700),
    );
    expect(post).toHaveBeenCalledTimes(2);
    const bodies = post.mock.calls.map(([body]) => body as RefundRequest);
    expect(bodies[0]).toEqual({
      amountMinor: 700,
      reason: 'Spring was not needed',
      requestId: bodies[0].requestId,
    });
    expect(bodies[0].requestId).toMatch(/^[0-9a-f-]{36}$/);
    expect(new Set(bodies.map((b) => b.requestId)).size).toBe(1);
  });
});

/** The dialog as the Payments page mounts it: with the row as the list has it now. */
function FromTheList() {
  const { data } = useWorkshopPayments({});
  const fresh = data?.rows.find((r) => r.id === row.id);
  return fresh ? <RefundDialog row={fresh} onClose={() => {}} onRefunded={() => {}} /> : null;
}

describe('the refund dialog after another tab refunded', { timeout: 30_000 }, () => {
  it('a 400 asks for the row again: what is left follows it, in one money format', async () => {
    let refunded = 500;
    const list = (): WorkshopPayments => ({
      currency: 'GBP',
      from: '2027-05-16',
      to: '2027-06-15',
      rows: [{ ...row, refundedMinor: refunded, netMinor: 2000 - refunded }],
      days: [],
      totals: { paidMinor: 2000, refundedMinor: refunded, netMinor: 2000 - refunded },
    });
    const post = vi.fn(() => {
      // the other tab's £11.50 went first: £3.50 is left
      refunded = 1650;
      throw apiError(400, 'Too much.', { amountMinor: 'at most US$3.50 is left to refund' });
    });
    serve({ 'GET /workshop/payments': list, 'POST /workshop/payments/pay-1/refunds': post });
    await renderRoutes([{ path: '/', element: <FromTheList /> }], '/');
    const dialog = await screen.findByRole('dialog', { name: 'Refund Ria Rider' });
    expect(dialog).toHaveTextContent('Left to refund: £15.00');
    const user = userEvent.setup();
    const amount = screen.getByLabelText('Amount to refund');
    await user.clear(amount);
    await user.type(amount, '10');
    await user.type(screen.getByLabelText(/^Reason/), 'Two tabs');
    await user.click(screen.getByRole('button', { name: 'Refund £10.00' }));

    expect(await screen.findByText('At most £3.50 is left to refund.')).toBeInTheDocument();
    await waitFor(() => expect(dialog).toHaveTextContent('refunded £16.50 so far. Left to refund: £3.50.'));
    expect(dialog).not.toHaveTextContent('US$');
    // £10 is more than is left: no "goes back" sentence with stale numbers
    expect(dialog).not.toHaveTextContent('stays with the shop');
    expect(post).toHaveBeenCalledTimes(1);
  });
});
