import type { AppointmentState } from '@loamline/shared-types';

/**
 * The life of an appointment in one table: every event, who may cause it, the states it may happen
 * in and the state it leads to. Anything not in the table is refused (the API answers 409).
 *
 * held ──paid──▶ requested ──confirm──▶ confirmed ──complete──▶ completed
 *   │                │  ▲                  │  └──no-show──▶ no_show
 *   expire        decline/cancel/move     decline/cancel/move
 *   ▼                ▼                     ▼
 * expired        declined / cancelled   declined / cancelled
 *
 * A proposal from the shop is not a state: it is a proposed start on a requested or confirmed
 * appointment, which the rider accepts (a move, confirmed at once) or turns down.
 */

export const APPOINTMENT_EVENTS = [
  'paid',
  'expire',
  'confirm',
  'decline',
  'propose',
  'accept-proposal',
  'reject-proposal',
  'move',
  'cancel',
  'complete',
  'no-show',
] as const;
export type AppointmentEvent = (typeof APPOINTMENT_EVENTS)[number];

export type Actor = 'rider' | 'staff' | 'system';

export interface Transition {
  from: readonly AppointmentState[];
  /** null: the state stays (the event changes something else, e.g. a proposal) */
  to: AppointmentState | null;
  by: readonly Actor[];
}

export const TRANSITIONS: Record<AppointmentEvent, Transition> = {
  paid: { from: ['held'], to: 'requested', by: ['system'] },
  expire: { from: ['held'], to: 'expired', by: ['system'] },
  confirm: { from: ['requested'], to: 'confirmed', by: ['staff'] },
  decline: { from: ['requested', 'confirmed'], to: 'declined', by: ['staff'] },
  propose: { from: ['requested', 'confirmed'], to: null, by: ['staff'] },
  'accept-proposal': { from: ['requested', 'confirmed'], to: 'confirmed', by: ['rider'] },
  'reject-proposal': { from: ['requested', 'confirmed'], to: null, by: ['rider'] },
  move: { from: ['requested', 'confirmed'], to: 'requested', by: ['rider'] },
  cancel: { from: ['held', 'requested', 'confirmed'], to: 'cancelled', by: ['rider', 'staff'] },
  complete: { from: ['confirmed'], to: 'completed', by: ['staff'] },
  'no-show': { from: ['confirmed'], to: 'no_show', by: ['staff'] },
};

/** States in which an appointment keeps its time (a held one only until its hold expires). */
export const LIVE_STATES: readonly AppointmentState[] = ['held', 'requested', 'confirmed'];

export class TransitionRefused extends Error {
  override readonly name = 'TransitionRefused';
  constructor(
    readonly event: AppointmentEvent,
    readonly state: AppointmentState,
    readonly actor: Actor,
  ) {
    // Mostly met when someone else (another tab, a colleague, the rider) acted first: say what the
    // appointment is now rather than recite the rule.
    const t = TRANSITIONS[event];
    super(
      !t.by.includes(actor)
        ? `only ${t.by.join(' or ')} may do that`
        : t.to === state
          ? `this appointment is already ${STATE_WORDS[state]}`
          : `this appointment is ${STATE_WORDS[state]} now, so it cannot be ${PAST[event]}`,
    );
  }
}

const STATE_WORDS: Record<AppointmentState, string> = {
  held: 'held, not yet paid',
  requested: 'requested',
  confirmed: 'confirmed',
  declined: 'declined',
  cancelled: 'cancelled',
  expired: 'expired (its hold ran out)',
  completed: 'completed',
  no_show: 'marked as a no-show',
};

const PAST: Record<AppointmentEvent, string> = {
  paid: 'paid for',
  expire: 'expired',
  confirm: 'confirmed',
  decline: 'declined',
  propose: 'given another time',
  'accept-proposal': 'moved to the proposed time',
  'reject-proposal': 'answered',
  move: 'moved',
  cancel: 'cancelled',
  complete: 'completed',
  'no-show': 'marked as a no-show',
};

/** The state after `event`, or a TransitionRefused when the table does not allow it. */
export function transition(state: AppointmentState, event: AppointmentEvent, actor: Actor): AppointmentState {
  const t = TRANSITIONS[event];
  if (!t.by.includes(actor) || !t.from.includes(state)) throw new TransitionRefused(event, state, actor);
  return t.to ?? state;
}

export function canTransition(state: AppointmentState, event: AppointmentEvent, actor: Actor): boolean {
  const t = TRANSITIONS[event];
  return t.by.includes(actor) && t.from.includes(state);
}
