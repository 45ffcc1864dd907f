import type { AppointmentState } from '@loamline/shared-types';

export const STATE_LABELS: Record<AppointmentState, string> = {
  held: 'Held (paying)',
  requested: 'Requested',
  confirmed: 'Confirmed',
  declined: 'Declined',
  cancelled: 'Cancelled',
  expired: 'Expired',
  completed: 'Completed',
  no_show: 'No-show',
};

export type StaffAction = 'confirm' | 'decline' | 'propose' | 'cancel' | 'complete' | 'no-show';

/**
 * What staff may do in each state: the server's transition table (backend appointment-transitions.ts)
 * seen from the shop's side. Complete and no-show also wait until the appointment has started.
 */
const FROM: Record<StaffAction, readonly AppointmentState[]> = {
  confirm: ['requested'],
  decline: ['requested', 'confirmed'],
  propose: ['requested', 'confirmed'],
  cancel: ['held', 'requested', 'confirmed'],
  complete: ['confirmed'],
  'no-show': ['confirmed'],
};

export function staffActions(
  a: { status: AppointmentState; start: string },
  now: Date = new Date(),
): StaffAction[] {
  const started = new Date(a.start).getTime() <= now.getTime();
  return (Object.keys(FROM) as StaffAction[]).filter((k) => {
    if (!FROM[k].includes(a.status)) return false;
    if (k === 'complete' || k === 'no-show') return started;
    if (k === 'propose') return !started;
    return true;
  });
}

/** Chip colours for the states: live ones stand out, ended ones are quiet. */
export const STATE_COLORS: Record<
  AppointmentState,
  'default' | 'primary' | 'secondary' | 'success' | 'error' | 'warning' | 'info'
> = {
  held: 'default',
  requested: 'warning',
  confirmed: 'primary',
  declined: 'error',
  cancelled: 'default',
  expired: 'default',
  completed: 'success',
  no_show: 'error',
};
