import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import type { StaffAction } from '../utils/states';
import { appointmentKey } from './get-appointment';
import { revalidateAppointments } from './get-appointments';

/**
 * `POST /api/workshop/appointments/:id/{confirm|decline|propose|cancel|complete|no-show}`; 409 when
 * the state does not allow it or someone changed it meanwhile. Lists and the page load again either
 * way, so a 409 also shows what changed.
 */
export async function actOnAppointment(
  id: string,
  action: StaffAction,
  body?: { reason?: string; start?: string },
): Promise<Appointment> {
  try {
    return await api<Appointment>(`${appointmentKey(id)}/${action}`, { method: 'POST', body: body ?? {} });
  } finally {
    await revalidateAppointments();
  }
}
