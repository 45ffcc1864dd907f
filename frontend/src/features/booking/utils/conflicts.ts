import type { ApiError, Appointment } from '@loamline/shared-types';
import { LIVE_STATES } from './words';

/**
 * Which 409 `POST /api/appointments` answered (backend `appointments.service.ts`):
 * - `not-offered`: `requireOffered`, with `fields.start` — the time is outside the hours, too soon or too far;
 * - `own-clash`: `book` — the rider already has a live appointment overlapping that time (no `fields`);
 * - `taken`: `claimBench` — no bench is free at that time any more (no `fields`);
 * - `other`: anything else; its message is the server's to say.
 */
export type BookingConflict = 'not-offered' | 'own-clash' | 'taken' | 'other';

export function bookingConflict(body: ApiError): BookingConflict {
  if (body.fields?.start) return 'not-offered';
  if (/already have an appointment/i.test(body.message)) return 'own-clash';
  if (/no longer free/i.test(body.message)) return 'taken';
  return 'other';
}

/** The rider's live appointment overlapping [start, end), if the list has it. */
export function clashingAppointment(
  list: Appointment[],
  startIso: string,
  endIso: string,
): Appointment | undefined {
  const start = Date.parse(startIso);
  const end = Date.parse(endIso);
  return list.find(
    (a) => LIVE_STATES.includes(a.status) && Date.parse(a.start) < end && Date.parse(a.end) > start,
  );
}
