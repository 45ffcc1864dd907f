import type { Appointment } from '@loamline/shared-types';
import { mutate } from 'swr';
import { appointmentKey } from './get-appointment';
import { appointmentsKey } from './get-appointments';
import { isAvailabilityKey } from './get-availability';

/** After an action: the appointment as answered, the list, and the shop's free times (freed at once). */
export async function afterAction(updated: Appointment): Promise<Appointment> {
  await mutate(appointmentKey(updated.id), updated, { revalidate: false });
  await Promise.all([mutate(appointmentsKey), mutate(isAvailabilityKey(updated.shop.slug))]);
  return updated;
}
