import { APPOINTMENT_STATES } from '@loamline/shared-types';
import {
  APPOINTMENT_EVENTS,
  canTransition,
  transition,
  TransitionRefused,
  TRANSITIONS,
} from './appointment-transitions';

describe('appointment transitions (the one table)', () => {
  it('the journeys: pay, confirm, complete; expire; decline; cancel; move', () => {
    expect(transition('held', 'paid', 'system')).toBe('requested');
    expect(transition('requested', 'confirm', 'staff')).toBe('confirmed');
    expect(transition('confirmed', 'complete', 'staff')).toBe('completed');
    expect(transition('held', 'expire', 'system')).toBe('expired');
    expect(transition('requested', 'decline', 'staff')).toBe('declined');
    expect(transition('confirmed', 'cancel', 'rider')).toBe('cancelled');
    expect(transition('confirmed', 'move', 'rider')).toBe('requested');
    expect(transition('requested', 'propose', 'staff')).toBe('requested');
    expect(transition('requested', 'accept-proposal', 'rider')).toBe('confirmed');
  });

  it('every pair not in the table is refused, with a reason', () => {
    let refused = 0;
    for (const state of APPOINTMENT_STATES)
      for (const event of APPOINTMENT_EVENTS)
        for (const actor of ['rider', 'staff', 'system'] as const) {
          const allowed = TRANSITIONS[event].from.includes(state) && TRANSITIONS[event].by.includes(actor);
          expect(canTransition(state, event, actor)).toBe(allowed);
          if (!allowed) {
            expect(() => transition(state, event, actor)).toThrow(TransitionRefused);
            refused++;
          }
        }
    expect(refused).toBeGreaterThan(200);
  });

  it('says what the appointment is now when someone else acted first', () => {
    const reason = (state: Parameters<typeof transition>[0], event: Parameters<typeof transition>[1]) => {
      try {
        transition(state, event, 'staff');
      } catch (e) {
        return (e as Error).message;
      }
      return null;
    };
    // a second tab confirms what the first already confirmed
    expect(reason('confirmed', 'confirm')).toBe('this appointment is already confirmed');
    // the rider cancelled while the shop was about to confirm
    expect(reason('cancelled', 'confirm')).toBe(
      'this appointment is cancelled now, so it cannot be confirmed',
    );
    expect(reason('no_show', 'complete')).toBe(
      'this appointment is marked as a no-show now, so it cannot be completed',
    );
    expect(() => transition('requested', 'confirm', 'rider')).toThrow('only staff may do that');
  });

  it('ended appointments never move again', () => {
    for (const state of ['declined', 'cancelled', 'expired', 'completed', 'no_show'] as const)
      for (const event of APPOINTMENT_EVENTS)
        for (const actor of ['rider', 'staff', 'system'] as const)
          expect(canTransition(state, event, actor)).toBe(false);
  });

  it('a rider cannot confirm, a shop cannot pay', () => {
    expect(() => transition('requested', 'confirm', 'rider')).toThrow('only staff');
    expect(() => transition('held', 'paid', 'staff')).toThrow('only system');
  });
});
