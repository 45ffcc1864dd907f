import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentKey } from './get-appointment';
import { afterAction } from './update-cache';

/** `POST /api/appointments/:id/accept-proposal`: take the shop's time; confirmed there. */
export async function acceptProposal(id: string) {
  return afterAction(
    await api<Appointment>(`${appointmentKey(id)}/accept-proposal`, { method: 'POST', body: {} }),
  );
}
