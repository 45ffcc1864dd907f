import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentKey } from './get-appointment';
import { afterAction } from './update-cache';

/** `POST /api/appointments/:id/reject-proposal`: the request stays at its own time. */
export async function rejectProposal(id: string) {
  return afterAction(
    await api<Appointment>(`${appointmentKey(id)}/reject-proposal`, { method: 'POST', body: {} }),
  );
}
