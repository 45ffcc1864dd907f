import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentKey } from '@/features/booking/api/get-appointment';
import { afterAction } from '@/features/booking/api/update-cache';

/**
 * `POST /api/appointments/:id/payment/sync`: the server asks the payment service about the intent
 * and applies it (held → requested once paid). The webhook does the same in the background.
 */
export async function syncPayment(appointmentId: string): Promise<Appointment> {
  return afterAction(
    await api<Appointment>(`${appointmentKey(appointmentId)}/payment/sync`, { method: 'POST', body: {} }),
  );
}
