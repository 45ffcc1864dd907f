import type { AppointmentCreated, CreateAppointmentRequest } from '@loamline/shared-types';
import { mutate } from 'swr';
import { api } from '@/lib/api-client';
import { appointmentsKey } from './get-appointments';
import { isAvailabilityKey } from './get-availability';

/**
 * `POST /api/appointments` (riders): 201 requested or held (with the payment session); 409 taken or
 * not offered; 403 staff; 503 with the server's message when the payment service is down (nothing
 * was booked — the caller says so, not the global "can't reach Loamline").
 */
export async function createAppointment(body: CreateAppointmentRequest): Promise<AppointmentCreated> {
  try {
    const created = await api<AppointmentCreated>('/appointments', {
      method: 'POST',
      body: { ...body },
      unavailable: 'caller',
    });
    await mutate(appointmentsKey);
    return created;
  } finally {
    // booked or refused, the shop's free times changed
    await mutate(isAvailabilityKey(body.shopSlug));
  }
}
