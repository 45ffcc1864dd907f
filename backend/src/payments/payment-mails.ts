import type { OutgoingMail } from '../mail/mail.service';
import { layout } from '../mail/templates';
import { shopTime } from '../appointments/appointment-mails';

/** What a payment mail says; money in minor units of `currency`. */
export interface PaymentMailFacts {
  riderName: string;
  shopName: string;
  shopTown: string;
  serviceName: string;
  timeZone: string;
  start: Date;
  currency: string;
  priceMinor: number;
  paidMinor: number;
  paidAt: Date | null;
  card: { brand: string; last4: string } | null;
  refundedMinor: number;
  refund: { amountMinor: number; reason: string } | null;
  link: string;
  appointmentId: string;
}

/** Minor units in the currency's own number of digits (ISO 4217), formatted by Intl. */
export function money(minor: number, currency: string, locale = 'en-GB'): string {
  const f = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const digits = f.resolvedOptions().maximumFractionDigits ?? 2;
  return f.format(minor / 10 ** digits);
}

/**
 * The receipt lines every payment mail ends with: paid, refunded, kept, and what is left to pay at
 * the shop. Amounts by `Intl.NumberFormat` in the shop's currency.
 */
export function receiptLines(f: PaymentMailFacts): string[] {
  const m = (n: number) => money(n, f.currency);
  const card = f.card ? ` with ${cardBrand(f.card.brand)} ending ${f.card.last4}` : '';
  const lines = [
    `Receipt for ${f.serviceName} at ${f.shopName}, ${f.shopTown} — reference ${f.appointmentId.slice(0, 8).toUpperCase()}`,
    `Service price: ${m(f.priceMinor)}. Paid online${card}${f.paidAt ? ` on ${shopTime(f.paidAt, f.timeZone)}` : ''}: ${m(f.paidMinor)}.`,
  ];
  if (f.refundedMinor > 0)
    lines.push(`Refunded: ${m(f.refundedMinor)}. Kept: ${m(f.paidMinor - f.refundedMinor)}.`);
  return lines;
}

export function paymentMail(
  kind: 'receipt' | 'late-payment' | 'paid-after-cancel' | 'refund',
  to: string,
  f: PaymentMailFacts,
): OutgoingMail {
  const m = (n: number) => money(n, f.currency);
  const when = shopTime(f.start, f.timeZone);
  let subject: string;
  let lines: string[];
  if (kind === 'receipt') {
    const rest = f.priceMinor - f.paidMinor;
    subject = `Payment received: ${m(f.paidMinor)} for ${f.serviceName}`;
    lines = [
      `Hello ${f.riderName},`,
      `We received ${m(f.paidMinor)} for ${f.serviceName} at ${f.shopName} on ${when}. ${f.shopName} now confirms the time or proposes another; we e-mail you either way.`,
      ...(rest > 0 ? [`The rest, ${m(rest)}, is paid at the shop.`] : []),
      ...receiptLines(f),
    ];
  } else if (kind === 'late-payment') {
    subject = `Refunded: your payment for ${f.serviceName} came after the hold ended`;
    lines = [
      `Hello ${f.riderName},`,
      `Your payment of ${m(f.paidMinor)} arrived after the time held for ${f.serviceName} on ${when} had been released, so it is not booked. The whole amount goes back to your card at once; a refund receipt follows.`,
      'Book again whenever you like.',
    ];
  } else if (kind === 'paid-after-cancel') {
    subject = `Refunded: your payment for ${f.serviceName} came after it was cancelled`;
    lines = [
      `Hello ${f.riderName},`,
      `Your payment of ${m(f.paidMinor)} went through after ${f.serviceName} on ${when} had been cancelled, so nothing is booked. The whole amount goes back to your card at once; a refund receipt follows.`,
    ];
  } else {
    subject = `Refund: ${m(f.refund?.amountMinor ?? 0)} for ${f.serviceName}`;
    lines = [
      `Hello ${f.riderName},`,
      `${m(f.refund?.amountMinor ?? 0)} is on its way back to your card${f.refund?.reason ? `: ${sentence(f.refund.reason)}` : '.'} Banks usually show it within 5–10 days.`,
      ...receiptLines(f),
    ];
  }
  const link = { href: f.link, label: 'See your appointment and receipt' };
  return {
    to,
    subject,
    text: `${lines.join('\n\n')}\n\n${link.label}: ${link.href}\n`,
    html: layout(subject, lines, link),
  };
}

/** "visa" → "Visa": the payment service's lower-case brand code, as people write it. */
export function cardBrand(code: string): string {
  return code.length ? code[0].toUpperCase() + code.slice(1) : code;
}

/** A reason typed by staff, ending with a full stop. */
function sentence(s: string): string {
  const t = s.trim();
  return /[.!?]$/.test(t) ? t : `${t}.`;
}
