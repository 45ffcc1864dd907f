import useSWR from 'swr';
import type { WorkshopAppointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentsKey } from './get-appointments';

export const appointmentKey = (id: string) => `${appointmentsKey}/${encodeURIComponent(id)}`;

/** `GET /api/workshop/appointments/:id`: with the rider's weight, bike, sheet and history. */
export function useWorkshopAppointment(id: string | undefined) {
  return useSWR<WorkshopAppointment, Error>(id ? appointmentKey(id) : null, (key: string) =>
    api<WorkshopAppointment>(key),
  );
}
