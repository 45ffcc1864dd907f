/** Who a signed-in user is. Technicians and owners are staff of one shop. */
export const ROLES = ['rider', 'technician', 'owner'] as const;
export type Role = (typeof ROLES)[number];

/**
 * The life of an appointment (the words of this product).
 * held: time kept while the rider pays, expires · requested: paid, waiting for the shop ·
 * confirmed · declined · cancelled · expired · completed · no_show
 */
export const APPOINTMENT_STATES = [
  'held',
  'requested',
  'confirmed',
  'declined',
  'cancelled',
  'expired',
  'completed',
  'no_show',
] as const;
export type AppointmentState = (typeof APPOINTMENT_STATES)[number];

/** Riding styles the baseline knows. */
export const RIDING_STYLES = ['cross-country', 'trail', 'enduro', 'downhill', 'park'] as const;
export type RidingStyle = (typeof RIDING_STYLES)[number];

/** How the rider wants the suspension to feel. */
export const RIDING_FEELS = ['supple', 'balanced', 'firm'] as const;
export type RidingFeel = (typeof RIDING_FEELS)[number];

export const SPRING_TYPES = ['air', 'coil'] as const;
export type SpringType = (typeof SPRING_TYPES)[number];
