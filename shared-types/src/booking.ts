import type { ShopSummary } from './accounts';
import type { AppointmentState } from './enums';
import type { PaymentSession, PaymentSummary } from './payments';

/**
 * Shops, their settings, availability and appointments: the bodies of the booking routes
 * (docs/api). Times on the wire are ISO-8601 with the shop zone's offset; local dates YYYY-MM-DD
 * in the shop's zone; money in minor units of the shop's currency (ISO 4217).
 */

export interface ShopService {
  id: string;
  name: string;
  description: string;
  durationMinutes: number;
  /** bench time kept after the service (cleaning, notes); not bookable by others */
  bufferAfterMinutes: number;
  /** minor units; 0 for a free check */
  priceMinor: number;
  /** minor units charged when booking; 0 … price; equal to the price for full payment */
  depositMinor: number;
  active: boolean;
  /** the work this service includes: the service report's checklist (null: Loamline's default list) */
  checklist: string[] | null;
}

/** `GET /api/shops/:slug` */
export interface ShopDetail extends ShopSummary {
  services: ShopService[];
  /** hours of notice for a full refund when the rider cancels */
  cancellationWindowHours: number;
  minNoticeMinutes: number;
  maxDaysAhead: number;
}

/** One opening interval on a weekday (ISO: 1 = Monday … 7 = Sunday), wall clock in the shop's zone. */
export interface OpeningInterval {
  weekday: number;
  /** HH:mm */
  start: string;
  /** HH:mm, after start; 24:00 allowed */
  end: string;
}

export interface ShopClosure {
  /** YYYY-MM-DD, first closed day */
  from: string;
  /** YYYY-MM-DD, last closed day (inclusive) */
  to: string;
  reason: string;
}

export interface BookingRules {
  /** minutes between offered starts (5-minute grid) */
  slotStepMinutes: number;
  minNoticeMinutes: number;
  maxDaysAhead: number;
  /** how long an unpaid booking keeps its time */
  holdMinutes: number;
  /** a rider who cancels at least this many hours ahead gets everything back */
  cancellationWindowHours: number;
}

/** `GET|PUT /api/workshop/settings` (owner) */
export interface ShopSettings {
  timeZone: string;
  currency: string;
  /** how many appointments at once */
  benches: number;
  hours: OpeningInterval[];
  closures: ShopClosure[];
  rules: BookingRules;
}

/** `GET /api/shops/:slug/availability?serviceId&from&to` → AvailableStart[] */
export interface AvailableStart {
  start: string;
  end: string;
  benchesFree: number;
}

/** `POST /api/appointments` */
export interface CreateAppointmentRequest {
  shopSlug: string;
  serviceId: string;
  start: string;
  bikeId?: string;
  baselineSheetId?: string;
  notes?: string;
}

/** `POST /api/appointments` → 201 */
export interface AppointmentCreated {
  id: string;
  status: AppointmentState;
  holdExpiresAt?: string;
  /** for a held appointment: what the payment step needs */
  payment?: PaymentSession;
}

export interface AppointmentBike {
  id: string;
  name: string;
  description: string;
}

/** An appointment as its rider sees it (`GET /api/appointments`, `/:id`). */
export interface Appointment {
  id: string;
  status: AppointmentState;
  shop: ShopSummary;
  service: Pick<ShopService, 'id' | 'name' | 'durationMinutes' | 'priceMinor' | 'depositMinor'>;
  start: string;
  end: string;
  bench: number;
  holdExpiresAt: string | null;
  bike: AppointmentBike | null;
  baselineSheetId: string | null;
  notes: string;
  /** a time the shop proposed instead, waiting for the rider's answer */
  proposedStart: string | null;
  declineReason: string | null;
  cancelReason: string | null;
  /** what the rider may do now under the shop's rules */
  canCancel: boolean;
  canMove: boolean;
  /** true while a cancellation would still be refunded in full */
  fullRefundIfCancelled: boolean;
  /** what a cancellation now would give back (minor units): all that was paid, or that minus the deposit */
  refundIfCancelledMinor: number;
  /** the receipt; null for a free service */
  payment: PaymentSummary | null;
  createdAt: string;
}

/** One entry of an appointment's history: what happened, when, and who did it. */
export interface AppointmentHistoryEntry {
  /** `created`, `reminder` or an event of the transition table (`confirm`, `decline`, `propose`, …) */
  event: string;
  at: string;
  /** who did it: rider, staff (with their name) or the system (expiry, payments) */
  by: 'rider' | 'staff' | 'system';
  byName: string | null;
  /** a decline or cancel reason */
  reason: string | null;
  /** the proposed start, or where a move went (ISO with the shop zone's offset) */
  start: string | null;
}

/** An appointment as the shop's staff see it (`GET /api/workshop/appointments`). */
export interface WorkshopAppointment extends Appointment {
  rider: { id: string; name: string; email: string; massKg: number | null };
  /** oldest first; only on `GET /api/workshop/appointments/:id` */
  history?: AppointmentHistoryEntry[];
}

export interface MoveAppointmentRequest {
  start: string;
}
export interface DeclineAppointmentRequest {
  reason: string;
}
export interface CancelAppointmentRequest {
  reason?: string;
}
