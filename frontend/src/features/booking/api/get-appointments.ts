import useSWR from 'swr';
import type { Appointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const appointmentsKey = '/appointments';

export const getAppointments = () => api<Appointment[]>(appointmentsKey);

/** `GET /api/appointments`: mine, newest start first. */
export function useAppointments() {
  return useSWR<Appointment[], Error>(appointmentsKey, getAppointments);
}
