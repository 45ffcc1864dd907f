import type { Appointment, AppointmentState, ShopService } from '@loamline/shared-types';
import { formatMoney } from './money';

/*
 * What the rider reads about money, rules and states: one place for the words, tested as they are.
 */

type Priced = Pick<ShopService, 'priceMinor' | 'depositMinor'>;

export type PaymentKind = 'free' | 'at-shop' | 'deposit' | 'full';

export function paymentKind({ priceMinor, depositMinor }: Priced): PaymentKind {
  if (priceMinor <= 0) return 'free';
  if (depositMinor <= 0) return 'at-shop';
  return depositMinor >= priceMinor ? 'full' : 'deposit';
}

/** "1 hour", "48 hours", "90 minutes". */
export function hoursInWords(hours: number): string {
  return hours === 1 ? '1 hour' : `${hours} hours`;
}

/** "45 min", "1 h", "1 h 30 min". */
export function durationInWords(minutes: number): string {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  if (!h) return `${m} min`;
  return m ? `${h} h ${m} min` : `${h} h`;
}

/** The price line: "Free" or "€89.00". */
export function priceInWords(s: Priced, currency: string, locale?: string): string {
  return s.priceMinor <= 0 ? 'Free' : formatMoney(s.priceMinor, currency, locale);
}

/** How paying works for this service, in words. */
export function paymentInWords(s: Priced, currency: string, locale?: string): string {
  const money = (minor: number) => formatMoney(minor, currency, locale);
  switch (paymentKind(s)) {
    case 'free':
      return 'Free: nothing to pay.';
    case 'at-shop':
      return `Nothing to pay when booking; you pay ${money(s.priceMinor)} at the shop.`;
    case 'full':
      return `Paid in full when booking: ${money(s.priceMinor)}.`;
    case 'deposit':
      return `A deposit of ${money(s.depositMinor)} when booking; the other ${money(
        s.priceMinor - s.depositMinor,
      )} at the shop.`;
  }
}

/** The shop's cancellation rule as it applies to this service. */
export function cancellationPolicy(windowHours: number, s?: Priced): string {
  const hours = hoursInWords(windowHours);
  const kind = s ? paymentKind(s) : 'deposit';
  if (kind === 'free' || kind === 'at-shop')
    return `Nothing is paid in advance, so cancelling costs nothing; please cancel at least ${hours} before if you can't come.`;
  if (kind === 'full')
    return `Cancel at least ${hours} before for a full refund; later, the payment is kept.`;
  return `Cancel at least ${hours} before for a full refund; later, the deposit is kept.`;
}

/** The shop's rule in general (the shop page, before a service is picked). */
export function shopCancellationPolicy(windowHours: number): string {
  const hours = hoursInWords(windowHours);
  return `Cancel at least ${hours} before for a full refund; later, the deposit is kept. Free services cost nothing to cancel.`;
}

/**
 * What cancelling this appointment now means for the rider's money, from what the server says a
 * cancellation would give back (`refundIfCancelledMinor`, `fullRefundIfCancelled`). `windowHours`:
 * the shop's cancellation window, named when the deposit is kept.
 */
export function cancelConsequence(a: Appointment, locale?: string, windowHours?: number): string {
  const money = (minor: number) => formatMoney(minor, a.payment?.currency ?? a.shop.currency, locale);
  const kind = paymentKind(a.service);
  if (kind === 'free' || kind === 'at-shop')
    return 'Nothing was paid in advance, so cancelling costs nothing.';
  const nothingPaid = a.payment ? a.payment.paidMinor <= 0 : a.status === 'held';
  if (nothingPaid) return 'Nothing has been paid for this hold, so nothing is charged.';
  const back = Math.max(0, a.refundIfCancelledMinor);
  if (a.fullRefundIfCancelled) return `You'll get ${money(back)} back: it is early enough for a full refund.`;
  const why =
    windowHours !== undefined
      ? `you're inside the shop's ${windowHours}-hour cancellation window`
      : 'it is too close to the start for a full refund';
  const what = kind === 'full' ? 'The payment' : 'The deposit';
  // what the shop keeps: what it holds now (paid − refunded) minus what would come back
  const kept = a.payment ? Math.max(0, a.payment.netMinor - back) : null;
  const keptWords = kept !== null ? `${what} of ${money(kept)} is kept: ${why}.` : `${what} is kept: ${why}.`;
  return back > 0 ? `${keptWords} You'll get ${money(back)} back.` : keptWords;
}

/**
 * After a cancellation or a decline, where the money paid online stands, in one sentence: what comes
 * back (on its way or done), or that the deposit was kept. Null when nothing was paid or the
 * appointment is still on.
 */
export function moneyBackInWords(a: Pick<Appointment, 'status' | 'payment'>, locale?: string): string | null {
  const p = a.payment;
  if (!p || p.paidMinor <= 0 || (a.status !== 'cancelled' && a.status !== 'declined')) return null;
  const money = (minor: number) => formatMoney(minor, p.currency, locale);
  const live = p.refunds.filter((r) => r.status !== 'failed');
  const back = live.reduce((sum, r) => sum + r.amountMinor, 0);
  if (back <= 0)
    return p.refunds.length > 0
      ? "The refund didn't go through; ask the shop about it. The receipt below has the details."
      : `${money(p.paidMinor)} paid online is kept by the shop.`;
  return live.some((r) => r.status === 'pending')
    ? `${money(back)} is on its way back to your card.`
    : `${money(back)} went back to your card; it can take a few days to show.`;
}

export const STATE_LABELS: Record<AppointmentState, string> = {
  held: 'Held, not paid',
  requested: 'Requested',
  confirmed: 'Confirmed',
  declined: 'Declined by the shop',
  cancelled: 'Cancelled',
  expired: 'Lapsed',
  completed: 'Done',
  no_show: 'Missed',
};

/** One sentence on where the appointment stands. */
export function stateInWords(a: Pick<Appointment, 'status' | 'declineReason' | 'shop'>): string {
  switch (a.status) {
    case 'held':
      return 'The time is held for you until the payment arrives; unpaid, it goes back to other riders when the hold ends.';
    case 'requested':
      return `Waiting for ${a.shop.name} to confirm.`;
    case 'confirmed':
      return `${a.shop.name} confirmed it. See you at the bench.`;
    case 'declined':
      return a.declineReason
        ? `${a.shop.name} declined it: “${a.declineReason}”`
        : `${a.shop.name} declined it.`;
    case 'cancelled':
      return 'Cancelled. The time is free for others again.';
    case 'expired':
      return 'The hold lapsed without payment; the time went back to other riders.';
    case 'completed':
      return 'The service is done.';
    case 'no_show':
      return 'The shop marked this appointment as missed.';
  }
}

export const LIVE_STATES: readonly AppointmentState[] = ['held', 'requested', 'confirmed'];

/**
 * By time, whatever the state (each row shows its state): upcoming = not over yet (a future start,
 * or under way now), soonest first; past: the rest, latest first. A cancelled or declined
 * appointment next week is still next week's.
 */
export function splitAppointments(list: Appointment[], now: number = Date.now()) {
  const upcoming: Appointment[] = [];
  const past: Appointment[] = [];
  for (const a of list) {
    if (Date.parse(a.end) > now) upcoming.push(a);
    else past.push(a);
  }
  upcoming.sort((x, y) => Date.parse(x.start) - Date.parse(y.start));
  past.sort((x, y) => Date.parse(y.start) - Date.parse(x.start));
  return { upcoming, past };
}

/** How far ahead the shop takes bookings: "Book at least 2 hours ahead and up to 60 days ahead." */
export function bookingWindowInWords(minNoticeMinutes: number, maxDaysAhead: number): string {
  const upTo = `up to ${maxDaysAhead} ${maxDaysAhead === 1 ? 'day' : 'days'} ahead`;
  if (minNoticeMinutes <= 0) return `Book ${upTo}.`;
  const notice =
    minNoticeMinutes % 60 === 0 ? hoursInWords(minNoticeMinutes / 60) : `${minNoticeMinutes} minutes`;
  return `Book at least ${notice} ahead and ${upTo}.`;
}
