/**
 * Payments: the deposit or full price a rider pays when booking, refunds, receipts and the
 * owner's Payments page (docs/api). Money is in minor units of the shop's currency (ISO 4217);
 * times are ISO-8601 with the shop zone's offset.
 */

/**
 * The life of a payment intent, in the hosted payment service's own words (its documented
 * lifecycle), mirrored from the service.
 */
export const PAYMENT_STATES = [
  'requires_payment_method',
  'requires_confirmation',
  'requires_action',
  'processing',
  'succeeded',
  'canceled',
] as const;
export type PaymentState = (typeof PAYMENT_STATES)[number];

/** Why money went back. */
export const REFUND_KINDS = [
  /** the shop declined the booking: everything back */
  'decline',
  /** the rider cancelled: everything back before the cancellation window, the deposit kept after */
  'rider-cancel',
  /** the shop cancelled: everything back */
  'shop-cancel',
  /** the payment arrived after the hold had expired: everything back at once */
  'late-payment',
  /** an owner refunded by hand from Workshop → Payments */
  'manual',
] as const;
export type RefundKind = (typeof REFUND_KINDS)[number];

/** `GET /api/payments/config` (public): what the browser needs to load the payment library. */
export interface PaymentsClientConfig {
  publishableKey: string;
  /**
   * A script that defines `window.Stripe`, loaded before `loadStripe` of `@stripe/stripe-js/pure`
   * (the local payment fake serves one); null → the library loads the hosted service's own.
   */
  scriptUrl: string | null;
}

/**
 * What the payment step needs to take the money for a held appointment
 * (`POST /api/appointments` → `payment`, and `GET /api/appointments/:id/payment`).
 */
export interface PaymentSession {
  clientSecret: string;
  publishableKey: string;
  scriptUrl: string | null;
  amountMinor: number;
  currency: string;
  /** deposit: part of the price now, the rest at the shop; full: the whole price now */
  kind: 'deposit' | 'full';
  /** the hold ends then; unpaid, the time is freed */
  holdExpiresAt: string;
}

export interface RefundView {
  id: string;
  amountMinor: number;
  kind: RefundKind;
  reason: string;
  by: 'rider' | 'staff' | 'system';
  /** the staff member's name when staff refunded */
  byName: string | null;
  /** pending until the payment service has taken it */
  status: 'pending' | 'succeeded' | 'failed';
  createdAt: string;
}

/** The receipt of an appointment: what was charged, paid, refunded and is left. */
export interface PaymentSummary {
  id: string;
  status: PaymentState;
  kind: 'deposit' | 'full';
  currency: string;
  /** charged when booking */
  amountMinor: number;
  /** received by the payment service (0 until paid) */
  paidMinor: number;
  paidAt: string | null;
  /** e.g. "visa", with the last four digits, once paid */
  card: { brand: string; last4: string } | null;
  refundedMinor: number;
  /** paid − refunded: what the shop keeps so far */
  netMinor: number;
  /** still to pay at the shop for the service (price − paid) while the appointment goes ahead; 0 otherwise */
  balanceDueMinor: number;
  /** why the last attempt failed ("Your card was declined."), while unpaid */
  lastError: string | null;
  refunds: RefundView[];
}

/** `GET /api/workshop/payments?from&to` (owner): one row per payment. */
export interface WorkshopPaymentRow extends PaymentSummary {
  appointmentId: string;
  appointmentStatus: string;
  start: string;
  serviceName: string;
  rider: { id: string; name: string; email: string };
  /** the payment service's id of the intent (pi_…), to look it up there */
  intentId: string;
  createdAt: string;
}

/** Money moved on one local day of the shop: payments received and refunds made that day. */
export interface PaymentDayTotal {
  /** YYYY-MM-DD in the shop's zone */
  day: string;
  paidMinor: number;
  refundedMinor: number;
  netMinor: number;
  payments: number;
  refunds: number;
}

/** `GET /api/workshop/payments?from=YYYY-MM-DD&to=YYYY-MM-DD` (owner; default: the last 30 days). */
export interface WorkshopPayments {
  currency: string;
  from: string;
  to: string;
  rows: WorkshopPaymentRow[];
  days: PaymentDayTotal[];
  totals: { paidMinor: number; refundedMinor: number; netMinor: number };
}

/** `POST /api/workshop/payments/:id/refunds` (owner) → WorkshopPaymentRow */
export interface RefundRequest {
  /** 1 … what is left to refund */
  amountMinor: number;
  reason: string;
  /** a UUID made by the browser once per refund form: a repeated request refunds once */
  requestId: string;
}
