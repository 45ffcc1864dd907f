import type { RefundKind } from '@loamline/shared-types';

const HOUR = 3_600_000;

/** The facts a refund decision needs; money in minor units. */
export interface RefundFacts {
  /** what ended the appointment, and from which side */
  event: 'decline' | 'cancel' | 'late-payment';
  side: 'rider' | 'staff' | 'system';
  /** received by the payment service */
  paidMinor: number;
  /** already given back or on its way */
  refundedMinor: number;
  /** what was charged when booking (the deposit, or the full price) */
  chargedMinor: number;
  nowMs: number;
  startMs: number;
  cancellationWindowHours: number;
  /**
   * the rider moved the appointment while inside the window of its old time: the deposit was
   * already due then, and a move must not buy a fresh window
   */
  depositKept?: boolean;
}

export interface RefundDecision {
  kind: RefundKind;
  amountMinor: number;
  /** in the rider's words, recorded with the refund */
  reason: string;
}

/**
 * Who gets what back (docs/payments.md):
 * - the shop declines or cancels: everything paid;
 * - a payment arrives after its hold expired: everything, at once;
 * - the rider cancels at least the shop's cancellation window ahead: everything;
 *   later (inside the window): the charge taken at booking is kept.
 * Never more than what is left to refund; null when nothing goes back.
 */
export function refundFor(f: RefundFacts): RefundDecision | null {
  const left = Math.max(0, f.paidMinor - f.refundedMinor);
  if (left === 0) return null;
  let d: RefundDecision;
  if (f.event === 'late-payment')
    d = {
      kind: 'late-payment',
      amountMinor: left,
      reason: 'The payment arrived after the hold had ended.',
    };
  else if (f.event === 'decline')
    d = { kind: 'decline', amountMinor: left, reason: 'The shop declined the booking.' };
  else if (f.side !== 'rider')
    d = { kind: 'shop-cancel', amountMinor: left, reason: 'The shop cancelled the appointment.' };
  else if (insideWindow(f) || f.depositKept)
    d = {
      kind: 'rider-cancel',
      amountMinor: Math.max(0, left - f.chargedMinor),
      reason:
        f.depositKept && !insideWindow(f)
          ? `Cancelled by the rider after moving the appointment inside the ${f.cancellationWindowHours}-hour cancellation window: the deposit is kept.`
          : `Cancelled by the rider inside the ${f.cancellationWindowHours}-hour cancellation window: the deposit is kept.`,
    };
  else
    d = {
      kind: 'rider-cancel',
      amountMinor: left,
      reason: `Cancelled by the rider more than ${f.cancellationWindowHours} hours ahead.`,
    };
  return d.amountMinor > 0 ? d : null;
}

/** True once the rider is inside the shop's cancellation window (a cancellation then keeps the deposit). */
export function insideWindow(f: Pick<RefundFacts, 'nowMs' | 'startMs' | 'cancellationWindowHours'>): boolean {
  return f.nowMs > f.startMs - f.cancellationWindowHours * HOUR;
}
