import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import InputAdornment from '@mui/material/InputAdornment';
import Stack from '@mui/material/Stack';
import type { WorkshopPaymentRow } from '@loamline/shared-types';
import { useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { TextInput } from '@/components/ui/text-input';
import { ApiRequestError } from '@/lib/api-client';
import { refundPayment, revalidatePayments } from '../api/workshop-payments';
import { formatMoney, minorDigits, toMajorInput, toMinor } from '../utils/money';
import { cardWords, refundableMinor } from '../utils/payment-words';

interface RefundForm {
  amount: string;
  reason: string;
}

/** The currency's symbol or code as the browser writes it, for the amount field ("£", "¥", "KWD"). */
function currencySign(currency: string): string {
  return (
    new Intl.NumberFormat(undefined, { style: 'currency', currency })
      .formatToParts(0)
      .find((p) => p.type === 'currency')?.value ?? currency
  );
}

/** The amount typed, in minor units, or why it can't be refunded. */
export function checkRefundAmount(typed: string, currency: string, leftMinor: number): number | string {
  const minor = toMinor(typed, currency);
  const digits = minorDigits(currency);
  if (minor === null)
    return digits === 0
      ? 'Enter a whole amount, like 1500.'
      : `Enter an amount like ${(12.5).toFixed(digits)} (at most ${digits} decimals).`;
  if (minor <= 0) return 'Enter more than nothing.';
  if (minor > leftMinor) return `At most ${formatMoney(leftMinor, currency)} is left to refund.`;
  return minor;
}

/**
 * Refund part or all of a payment (owner). The amount starts at what is left; the reason is
 * required; what happens is said before the button. One `requestId` per opened dialog: a double
 * click or a retry after a lost answer refunds once. Mount it only while open.
 */
export function RefundDialog({
  row,
  onClose,
  onRefunded,
}: {
  row: WorkshopPaymentRow;
  onClose: () => void;
  onRefunded: (row: WorkshopPaymentRow, amountMinor: number) => void;
}) {
  const currency = row.currency;
  const left = refundableMinor(row);
  const [requestId] = useState(() => crypto.randomUUID());
  const inFlight = useRef(false);
  const [serverError, setServerError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    watch,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<RefundForm>({
    mode: 'onTouched',
    defaultValues: { amount: toMajorInput(left, currency), reason: '' },
  });
  const typed = checkRefundAmount(watch('amount'), currency, left);
  const amountOk = typeof typed === 'number' ? typed : null;
  const money = (minor: number) => formatMoney(minor, currency);
  const card = cardWords(row.card);
  /** why the amount was refused, from what is left now */
  const amountWords = (asked: number, leftNow: number): string =>
    leftNow <= 0
      ? 'Nothing is left to refund: this payment has been refunded in full.'
      : asked > leftNow
        ? `At most ${money(leftNow)} is left to refund.`
        : `This payment changed meanwhile: at most ${money(leftNow)} is left to refund. Check the amount and try again.`;

  const submit = handleSubmit(async ({ amount, reason }) => {
    const minor = checkRefundAmount(amount, currency, left);
    if (typeof minor !== 'number' || inFlight.current) return;
    inFlight.current = true;
    setServerError(null);
    try {
      const updated = await refundPayment(row.id, { amountMinor: minor, reason: reason.trim(), requestId });
      onRefunded(updated, minor);
    } catch (e) {
      // refused or not answered: the payment may have changed meanwhile (another tab refunded), so
      // the row is asked again and the dialog's numbers follow it (the page passes the fresh row)
      const fresh = await revalidatePayments(row.appointmentId, row.id).catch(() => undefined);
      const leftNow = fresh ? refundableMinor(fresh) : left;
      if (e instanceof ApiRequestError && e.status === 400 && e.body.fields) {
        const { amountMinor, reason: why, ...other } = e.body.fields;
        // the amount in our own words and money format, from what is left now (the server's
        // message formats money its own way)
        if (amountMinor) setError('amount', { message: amountWords(minor, leftNow) });
        if (why) setError('reason', { message: why });
        if (!amountMinor && !why) setServerError(Object.values(other)[0] ?? e.body.message);
      } else {
        setServerError(
          e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.',
        );
      }
    } finally {
      inFlight.current = false;
    }
  });

  return (
    <Dialog open onClose={onClose} fullWidth maxWidth="sm" aria-labelledby="refund-title">
      <DialogTitle id="refund-title">Refund {row.rider.name}</DialogTitle>
      <Stack component="form" noValidate onSubmit={(e) => void submit(e)}>
        <DialogContent sx={{ pt: 0 }}>
          <DialogContentText sx={{ mb: 2 }}>
            {row.serviceName}: paid {money(row.paidMinor)}
            {row.refundedMinor > 0 ? `, refunded ${money(row.refundedMinor)} so far` : ''}. Left to refund:{' '}
            <strong>{money(left)}</strong>.
          </DialogContentText>
          <Stack spacing={2}>
            <TextInput
              label="Amount to refund"
              autoFocus
              inputMode="decimal"
              error={!!errors.amount}
              helperText={errors.amount?.message ?? `At most ${money(left)}.`}
              slotProps={{
                input: {
                  startAdornment: <InputAdornment position="start">{currencySign(currency)}</InputAdornment>,
                },
              }}
              {...register('amount', {
                validate: (v) => {
                  const r = checkRefundAmount(v, currency, left);
                  return typeof r === 'number' || r;
                },
              })}
            />
            <TextInput
              label="Reason"
              required
              multiline
              minRows={2}
              error={!!errors.reason}
              helperText={
                errors.reason?.message ?? 'Kept with the payment; the rider sees it on the receipt.'
              }
              slotProps={{ htmlInput: { maxLength: 500 } }}
              {...register('reason', {
                validate: (v) => !!v.trim() || 'Say why: it goes on the receipt and in your books.',
              })}
            />
            <Alert severity="warning" aria-live="polite">
              {amountOk !== null ? (
                <>
                  {money(amountOk)} goes back to {row.rider.name}
                  {card ? `’s ${card}` : ''}.{' '}
                  {left - amountOk > 0
                    ? `${money(left - amountOk)} of this payment stays with the shop and can still be refunded later.`
                    : 'Nothing of this payment stays with the shop.'}{' '}
                  A refund can&apos;t be undone; it takes a few days to reach the card.
                </>
              ) : (
                'Enter an amount to see what goes back.'
              )}
            </Alert>
            {serverError && (
              <Alert severity="error" role="alert">
                {serverError}
              </Alert>
            )}
          </Stack>
        </DialogContent>
        <DialogActions sx={{ px: 3, pb: 2 }}>
          <Button onClick={onClose}>Keep the money</Button>
          <Button type="submit" variant="contained" color="error" disabled={isSubmitting}>
            {isSubmitting ? 'Refunding…' : amountOk !== null ? `Refund ${money(amountOk)}` : 'Refund'}
          </Button>
        </DialogActions>
      </Stack>
    </Dialog>
  );
}
