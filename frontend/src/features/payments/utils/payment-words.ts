import type { PaymentState, PaymentSummary, RefundView } from '@loamline/shared-types';

/* What riders and staff read about payments: one place for the words. */

/** Why money went back, in plain words. */
export function refundWhy(r: Pick<RefundView, 'kind' | 'reason'>, viewer: 'rider' | 'staff'): string {
  switch (r.kind) {
    case 'decline':
      return 'The shop declined the booking';
    case 'rider-cancel':
      return viewer === 'rider' ? 'You cancelled' : 'The rider cancelled';
    case 'shop-cancel':
      return 'The shop cancelled';
    case 'late-payment':
      return 'The payment came after the hold had ended';
    case 'manual':
      return r.reason.trim() ? `Refunded by the shop: “${r.reason.trim()}”` : 'Refunded by the shop';
  }
}

/** A refund's progress: pending is "on its way". */
export function refundStatusWords(status: RefundView['status']): string {
  switch (status) {
    case 'pending':
      return 'on its way';
    case 'succeeded':
      return 'refunded';
    case 'failed':
      return 'failed — not refunded';
  }
}

/** "deposit" or "full price". */
export const kindWords = (kind: PaymentSummary['kind']): string =>
  kind === 'deposit' ? 'deposit' : 'full price';

/** The payment's state for the owner's list. */
export const PAYMENT_STATE_LABELS: Record<PaymentState, string> = {
  requires_payment_method: 'Not paid',
  requires_confirmation: 'Not paid',
  requires_action: 'Waiting for the bank',
  processing: 'Processing',
  succeeded: 'Paid',
  canceled: 'Not paid (ended)',
};

/** Paid, partly refunded or refunded, as the owner reads a row. */
export function paymentStatusWords(
  p: Pick<PaymentSummary, 'status' | 'paidMinor' | 'refundedMinor'>,
): string {
  if (p.status === 'succeeded' && p.paidMinor > 0) {
    if (p.refundedMinor >= p.paidMinor) return 'Refunded';
    if (p.refundedMinor > 0) return 'Partly refunded';
    return 'Paid';
  }
  return PAYMENT_STATE_LABELS[p.status];
}

/** "Visa ····4242". */
export function cardWords(card: PaymentSummary['card']): string | null {
  if (!card) return null;
  const brand = card.brand ? card.brand.charAt(0).toUpperCase() + card.brand.slice(1) : 'Card';
  return `${brand} ····${card.last4}`;
}

/** What is left to refund: paid minus every refund that has not failed (and never below 0). */
export function refundableMinor(p: Pick<PaymentSummary, 'paidMinor' | 'refundedMinor' | 'refunds'>): number {
  const notFailed = p.refunds.filter((r) => r.status !== 'failed').reduce((sum, r) => sum + r.amountMinor, 0);
  return Math.max(0, p.paidMinor - Math.max(p.refundedMinor, notFailed));
}
