import type { Appointment, CancelAppointmentRequest } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentKey } from './get-appointment';
import { afterAction } from './update-cache';

/** `POST /api/appointments/:id/cancel`: the time is free again at once. */
export async function cancelAppointment(id: string, body: CancelAppointmentRequest = {}) {
  return afterAction(
    await api<Appointment>(`${appointmentKey(id)}/cancel`, { method: 'POST', body: { ...body } }),
  );
}
