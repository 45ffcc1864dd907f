import useSWR, { type SWRConfiguration } from 'swr';
import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const appointmentKey = (id: string) => `/appointments/${encodeURIComponent(id)}`;

export const getAppointment = (id: string) => api<Appointment>(appointmentKey(id));

/** `GET /api/appointments/:id`: one of mine (`config`: e.g. a refresh interval while a payment lands). */
export function useAppointment(id: string | undefined, config?: SWRConfiguration<Appointment, Error>) {
  return useSWR<Appointment, Error>(id ? appointmentKey(id) : null, () => getAppointment(id!), config);
}
