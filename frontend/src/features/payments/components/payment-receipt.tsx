import Alert from '@mui/material/Alert';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { PaymentSummary } from '@loamline/shared-types';
import type { ReactNode } from 'react';
import { formatDate } from '@/features/booking/utils/zoned-time';
import { formatMoney, formatRefund } from '../utils/money';
import { cardWords, kindWords, refundStatusWords, refundWhy } from '../utils/payment-words';

/** An appointment still on: the payment may still come (held) or the service still happens. */
const LIVE = ['held', 'requested', 'confirmed', 'completed'];
/** The service happens (or happened): what is left is paid at the shop. */
const GOES_AHEAD = ['requested', 'confirmed', 'completed'];

/** A date in the shop's zone: "3 Dec 2026" (the app's one short date). */
const day = (iso: string, zone: string) => formatDate(iso, zone);

function Line({
  label,
  amount,
  strong,
  muted,
}: {
  label: ReactNode;
  amount: string;
  strong?: boolean;
  muted?: boolean;
}) {
  const sx = { fontWeight: strong ? 700 : 400, color: muted ? 'text.secondary' : 'text.primary' };
  return (
    <TableRow>
      <TableCell component="th" scope="row" sx={{ ...sx, pl: 0 }}>
        {label}
      </TableCell>
      <TableCell
        align="right"
        sx={{ ...sx, pr: 0, whiteSpace: 'nowrap', fontVariantNumeric: 'tabular-nums' }}
      >
        {amount}
      </TableCell>
    </TableRow>
  );
}

/**
 * The receipt of an appointment: the service's price, what was paid online (when, which card),
 * each refund and why, what the shop keeps, and what is left to pay at the shop.
 */
export function PaymentReceipt({
  payment: p,
  priceMinor,
  zone,
  viewer,
  title,
  appointmentStatus,
}: {
  payment: PaymentSummary;
  /** the service's price, in the payment's currency; left out where it isn't known (the owner's list) */
  priceMinor?: number;
  /** the shop's zone: dates are the shop's */
  zone: string;
  viewer: 'rider' | 'staff';
  /** by default "Receipt" once paid, "Payment" before (nothing paid yet is no receipt) */
  title?: string;
  /**
   * where the appointment stands (the page passes "expired" once the hold has passed, before the
   * server says so): an unpaid payment of an appointment that is over was never charged
   */
  appointmentStatus?: string;
}) {
  const money = (minor: number) => formatMoney(minor, p.currency);
  const card = cardWords(p.card);
  const paid = p.paidMinor > 0;
  const titleId = `receipt-${p.id}`;
  // unpaid and never to be paid: the intent was cancelled, or the appointment lapsed or was called off
  const neverCharged =
    !paid && (p.status === 'canceled' || (!!appointmentStatus && !LIVE.includes(appointmentStatus)));
  const goesAhead = appointmentStatus ? GOES_AHEAD.includes(appointmentStatus) : p.balanceDueMinor > 0;
  // the service's price, or (the owner's list has no price) what was paid plus what is left at the shop
  const price = priceMinor ?? (goesAhead && paid ? p.paidMinor + p.balanceDueMinor : undefined);
  // after a refund by hand the rest still goes ahead: price − refunded = net paid + to pay at the shop
  const afterRefunds =
    goesAhead && p.refundedMinor > 0 && price !== undefined ? price - p.refundedMinor : null;
  const heading = title ?? (paid ? 'Receipt' : 'Payment');
  return (
    <section aria-labelledby={titleId} className="payment-receipt">
      <Typography id={titleId} variant="h3" component="h2" sx={{ fontSize: '1.05rem', mb: 0.5 }}>
        {heading}
      </Typography>
      <Table size="small" aria-labelledby={titleId} sx={{ '& td, & th': { borderColor: 'divider' } }}>
        <TableBody>
          {priceMinor !== undefined && <Line label="Price of the service" amount={money(priceMinor)} />}
          {paid ? (
            <Line
              label={
                <>
                  Paid online ({kindWords(p.kind)}){p.paidAt ? ` on ${day(p.paidAt, zone)}` : ''}
                  {card && (
                    <Typography
                      component="span"
                      variant="body2"
                      color="text.secondary"
                      sx={{ display: 'block' }}
                    >
                      {card}
                    </Typography>
                  )}
                </>
              }
              amount={money(p.paidMinor)}
            />
          ) : neverCharged ? (
            <Line label="Nothing was charged" amount={money(0)} muted />
          ) : (
            <Line
              label={`To pay online (${kindWords(p.kind)}) — not paid`}
              amount={money(p.amountMinor)}
              muted
            />
          )}
          {p.refunds.map((r) => (
            <Line
              key={r.id}
              muted={r.status === 'failed'}
              label={
                <>
                  Refund on {day(r.createdAt, zone)}
                  {r.status !== 'succeeded' && ` (${refundStatusWords(r.status)})`}
                  <Typography
                    component="span"
                    variant="body2"
                    color="text.secondary"
                    sx={{ display: 'block' }}
                  >
                    {refundWhy(r, viewer)}
                  </Typography>
                </>
              }
              amount={formatRefund(r.amountMinor, p.currency)}
            />
          ))}
          {afterRefunds !== null && (
            <Line label="Total for the service after refunds" amount={money(afterRefunds)} />
          )}
          {paid && <Line label="Net paid" amount={money(p.netMinor)} strong />}
          {p.balanceDueMinor > 0 && !neverCharged && (
            <Line label="To pay at the shop" amount={money(p.balanceDueMinor)} strong />
          )}
        </TableBody>
      </Table>
      {!paid && !neverCharged && p.lastError && (
        <Alert severity="warning" sx={{ mt: 1.5 }}>
          Last attempt: {p.lastError}
        </Alert>
      )}
    </section>
  );
}
