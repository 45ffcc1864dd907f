import useSWR from 'swr';
import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const appointmentKey = (id: string) => `/appointments/${encodeURIComponent(id)}`;

export const getAppointment = (id: string) => api<Appointment>(appointmentKey(id));

/** `GET /api/appointments/:id`: one of mine. */
export function useAppointment(id: string | undefined) {
  return useSWR<Appointment, Error>(id ? appointmentKey(id) : null, () => getAppointment(id!));
}
