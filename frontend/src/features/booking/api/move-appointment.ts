import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentKey } from './get-appointment';
import { afterAction } from './update-cache';

/** `POST /api/appointments/:id/move`: to another free time; it waits for the shop again. */
export async function moveAppointment(id: string, start: string) {
  return afterAction(
    await api<Appointment>(`${appointmentKey(id)}/move`, { method: 'POST', body: { start } }),
  );
}
