import type { OpeningInterval } from '@loamline/shared-types';

/**
 * The demo scenario's booking side (invented): each demo shop's hours, a closure, benches, rules
 * and services, and a spread of appointments in every state around the day the demo is first
 * started, so that no Workshop page is empty. Money in minor units of the shop's currency.
 */

export interface DemoService {
  name: string;
  description: string;
  durationMinutes: number;
  bufferAfterMinutes: number;
  priceMinor: number;
  depositMinor: number;
}

export interface DemoBookingShop {
  slug: string;
  benches: number;
  hours: OpeningInterval[];
  /** a closure this many days after the seed day, for this many days */
  closure: { inDays: number; days: number; reason: string };
  rules: {
    slotStepMinutes: number;
    minNoticeMinutes: number;
    maxDaysAhead: number;
    holdMinutes: number;
    cancellationWindowHours: number;
  };
  services: DemoService[];
}

const weekdays = (days: number[], intervals: [string, string][]): OpeningInterval[] =>
  days.flatMap((weekday) => intervals.map(([start, end]) => ({ weekday, start, end })));

const SERVICES = (p: (major: number) => number): DemoService[] => [
  {
    name: 'Air spring setup — fork',
    description:
      'Air let out, main and end-stroke chambers set for your weight, spacers checked, sag measured.',
    durationMinutes: 45,
    bufferAfterMinutes: 15,
    priceMinor: p(65),
    depositMinor: p(20),
  },
  {
    name: 'Air spring setup — fork and shock',
    description:
      'Both ends set up for your weight and riding, sag measured front and rear, settings written down.',
    durationMinutes: 75,
    bufferAfterMinutes: 15,
    priceMinor: p(110),
    depositMinor: p(30),
  },
  {
    name: 'Lower-leg service',
    description:
      'Lowers off, seals and foam rings cleaned or replaced, fresh bath oil. Paid in full when booking.',
    durationMinutes: 60,
    bufferAfterMinutes: 15,
    priceMinor: p(90),
    depositMinor: p(90),
  },
  {
    name: 'Full damper service',
    description: 'Damper stripped, oil and seals replaced, bled and tested.',
    durationMinutes: 180,
    bufferAfterMinutes: 30,
    priceMinor: p(260),
    depositMinor: p(80),
  },
  {
    name: 'Bench curve check',
    description: 'Your fork or shock on the bench: the measured spring curve against the model. Free.',
    durationMinutes: 30,
    bufferAfterMinutes: 0,
    priceMinor: 0,
    depositMinor: 0,
  },
];

export const DEMO_BOOKING: DemoBookingShop[] = [
  {
    slug: 'kettle-ridge-suspension-lab',
    benches: 2,
    hours: [
      ...weekdays(
        [2, 3, 4, 5],
        [
          ['09:00', '12:30'],
          ['13:30', '18:00'],
        ],
      ),
      ...weekdays([6], [['09:00', '14:00']]),
    ],
    closure: { inDays: 17, days: 3, reason: 'Staff training' },
    rules: {
      slotStepMinutes: 30,
      minNoticeMinutes: 720,
      maxDaysAhead: 60,
      holdMinutes: 15,
      cancellationWindowHours: 48,
    },
    services: SERVICES((usd) => usd * 100),
  },
  {
    slug: 'mossgrund-federwerk',
    benches: 1,
    hours: weekdays(
      [1, 2, 3, 4, 5],
      [
        ['08:00', '12:00'],
        ['13:00', '17:00'],
      ],
    ),
    closure: { inDays: 10, days: 1, reason: 'Inventory day' },
    rules: {
      slotStepMinutes: 30,
      minNoticeMinutes: 1440,
      maxDaysAhead: 45,
      holdMinutes: 20,
      cancellationWindowHours: 24,
    },
    services: SERVICES((eur) => Math.round(eur * 0.9) * 100),
  },
];

/**
 * The appointments of each demo shop, relative to the seed day: `day` is the n-th open day after
 * (positive) or before (negative) it, `at` the local start, `service` an index into its services.
 */
export const DEMO_APPOINTMENTS: {
  day: number;
  at: string;
  service: number;
  status: 'held' | 'requested' | 'confirmed' | 'declined' | 'cancelled' | 'expired' | 'completed' | 'no_show';
  rider: 'demo' | 'guest';
  notes?: string;
  reason?: string;
  proposeDay?: number;
}[] = [
  {
    day: -12,
    at: '09:00',
    service: 1,
    status: 'completed',
    rider: 'demo',
    notes: 'Fork feels harsh on roots.',
  },
  { day: -9, at: '10:00', service: 0, status: 'completed', rider: 'guest' },
  { day: -7, at: '14:00', service: 3, status: 'completed', rider: 'guest', notes: 'Knock at top-out.' },
  { day: -5, at: '09:30', service: 4, status: 'no_show', rider: 'guest' },
  {
    day: -4,
    at: '11:00',
    service: 0,
    status: 'declined',
    rider: 'guest',
    reason: 'That fork needs a part we cannot get this month.',
  },
  { day: -3, at: '15:00', service: 2, status: 'cancelled', rider: 'demo', reason: 'Away that week.' },
  { day: -2, at: '10:30', service: 1, status: 'expired', rider: 'guest' },
  {
    day: 2,
    at: '09:00',
    service: 1,
    status: 'confirmed',
    rider: 'demo',
    notes: 'Bring the shock pump back, please.',
  },
  { day: 2, at: '14:00', service: 4, status: 'confirmed', rider: 'guest' },
  { day: 3, at: '10:00', service: 0, status: 'requested', rider: 'guest', notes: 'New bike, first setup.' },
  { day: 4, at: '09:00', service: 3, status: 'requested', rider: 'demo', proposeDay: 5 },
  { day: 6, at: '15:00', service: 2, status: 'confirmed', rider: 'guest' },
  { day: 7, at: '11:00', service: 0, status: 'requested', rider: 'guest' },
  { day: 8, at: '13:30', service: 1, status: 'held', rider: 'guest' },
];

/** Invented riders who book at the demo shops (sign-ins not printed; they only fill the lists). */
export const DEMO_GUESTS = [
  { email: 'guest.sol@example.test', name: 'Sol' },
  { email: 'guest.ines@example.test', name: 'Ines' },
  { email: 'guest.kai@example.test', name: 'Kai' },
];
