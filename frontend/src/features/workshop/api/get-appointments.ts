import useSWR, { mutate } from 'swr';
import type { AppointmentState, WorkshopAppointment } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const appointmentsKey = '/workshop/appointments';

export interface AppointmentsQuery {
  status?: readonly AppointmentState[];
  /** local dates in the shop's zone, inclusive */
  from?: string;
  to?: string;
  q?: string;
}

/** The SWR key (and API path) of one filtered list. */
export function appointmentsListKey(query: AppointmentsQuery): string {
  const p = new URLSearchParams();
  if (query.status?.length) p.set('status', query.status.join(','));
  if (query.from) p.set('from', query.from);
  if (query.to) p.set('to', query.to);
  if (query.q?.trim()) p.set('q', query.q.trim());
  const s = p.toString();
  return s ? `${appointmentsKey}?${s}` : appointmentsKey;
}

/** `GET /api/workshop/appointments?status&from&to&q` (staff of the shop). */
export function useWorkshopAppointments(
  query: AppointmentsQuery | null,
  options: { keepPreviousData?: boolean } = {},
) {
  return useSWR<WorkshopAppointment[], Error>(
    query ? appointmentsListKey(query) : null,
    (key: string) => api<WorkshopAppointment[]>(key),
    options,
  );
}

/** After any change: every list and every single appointment load again. */
export const revalidateAppointments = () =>
  mutate((key) => typeof key === 'string' && key.startsWith(appointmentsKey));
