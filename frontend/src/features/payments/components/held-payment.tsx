import Alert from '@mui/material/Alert';
import Skeleton from '@mui/material/Skeleton';
import type { PaymentSession } from '@loamline/shared-types';
import { lazy, Suspense, useEffect } from 'react';
import { LoadError } from '@/components/ui/load-error';
import { ApiRequestError } from '@/lib/api-client';
import { usePaymentSession } from '../api/get-payment-session';
import type { PaymentStepProps } from './payment-step';

// the payment library lives in this chunk only: fetched when a held appointment is on the screen
const PaymentStep = lazy(() => import('./payment-step'));

const placeholder = <Skeleton variant="rounded" height={320} aria-label="Loading the payment step" />;

/**
 * The payment step for a held appointment: with the session the booking answered (right after
 * booking), or asked for again (`GET /appointments/:id/payment`) after a reload or in another tab.
 */
export function HeldPayment({
  appointment: a,
  fromBooking,
  ...rest
}: Omit<PaymentStepProps, 'session'> & {
  /** the session `POST /appointments` answered, when this page came straight from the booking */
  fromBooking?: PaymentSession;
}) {
  const asked = usePaymentSession(fromBooking ? null : a.id);
  const session = fromBooking ?? asked.data;
  const gone = asked.error instanceof ApiRequestError && asked.error.status === 409;
  const { onExpired } = rest;
  // 409: not held or already paid — the appointment itself is stale; the page asks for it again
  useEffect(() => {
    if (gone) onExpired?.();
  }, [gone, onExpired]);

  if (gone) return <Alert severity="info">This appointment has nothing left to pay online.</Alert>;
  if (asked.error)
    return <LoadError what="The payment step" error={asked.error} onRetry={() => void asked.mutate()} />;
  if (!session) return placeholder;
  return (
    <Suspense fallback={placeholder}>
      <PaymentStep appointment={a} session={session} {...rest} />
    </Suspense>
  );
}
