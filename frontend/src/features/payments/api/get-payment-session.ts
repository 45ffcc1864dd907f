import useSWR from 'swr';
import type { PaymentSession } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentKey } from '@/features/booking/api/get-appointment';

export const paymentSessionKey = (appointmentId: string) => `${appointmentKey(appointmentId)}/payment`;

/**
 * `GET /api/appointments/:id/payment`: what the payment step needs while the appointment is held
 * and unpaid (409 otherwise) — so a reload or another tab can go on paying. `null` id: not asked.
 */
export function usePaymentSession(appointmentId: string | null) {
  return useSWR<PaymentSession, Error>(
    appointmentId ? paymentSessionKey(appointmentId) : null,
    (key: string) => api<PaymentSession>(key),
    // the client secret does not change; asking again on focus would only race a payment in flight
    { revalidateOnFocus: false, revalidateIfStale: false, shouldRetryOnError: false },
  );
}
