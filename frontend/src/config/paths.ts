/** Every URL of the app in one place; components never spell one. */
export const paths = {
  home: '/',
  baseline: '/baseline',
  signIn: '/sign-in',
  register: '/register',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  join: '/join',
  garage: '/garage',
  sheets: '/sheets',
  sheet: '/sheets/:id',
  workshop: '/workshop',
  workshopTeam: '/workshop/team',
  // Workshop › booking (issue 9, shop side)
  workshopRequests: '/workshop/requests',
  workshopAppointment: '/workshop/appointments/:id',
  workshopSchedule: '/workshop/schedule',
  workshopServices: '/workshop/services',
  workshopSettings: '/workshop/hours',
  // Workshop › payments (owner)
  workshopPayments: '/workshop/payments',
  // booking, rider side (issue 9)
  shops: '/shops',
  shop: '/shops/:slug',
  appointments: '/appointments',
  appointment: '/appointments/:id',
} as const;

/** Addresses with a parameter, built from the patterns above. */
export const pathTo = {
  sheet: (id: string | number): string => `/sheets/${encodeURIComponent(String(id))}`,
  /** sign-in that brings the user back to `next` (an in-app path) afterwards */
  signIn: (next?: string): string => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
  register: (next?: string): string => (next ? `/register?next=${encodeURIComponent(next)}` : '/register'),
  /** the wizard with its Bike step filled from a garage bike */
  baselineWithBike: (bikeId: string | number): string =>
    `/baseline?bike=${encodeURIComponent(String(bikeId))}`,
  // Workshop › booking
  workshopAppointment: (id: string): string => `/workshop/appointments/${encodeURIComponent(id)}`,
  /** the schedule at a day (`YYYY-MM-DD`, shop zone) in the day or week view */
  workshopSchedule: (date?: string, view?: 'day' | 'week'): string => {
    const p = new URLSearchParams();
    if (date) p.set('date', date);
    if (view) p.set('view', view);
    const s = p.toString();
    return s ? `/workshop/schedule?${s}` : '/workshop/schedule';
  },
  /** the owner's payments between two local dates (YYYY-MM-DD, shop zone) */
  workshopPayments: (from?: string, to?: string): string => {
    const p = new URLSearchParams();
    if (from) p.set('from', from);
    if (to) p.set('to', to);
    const s = p.toString();
    return s ? `/workshop/payments?${s}` : '/workshop/payments';
  },
  // booking, rider side (issue 9)
  shop: (slug: string): string => `/shops/${encodeURIComponent(slug)}`,
  appointment: (id: string): string => `/appointments/${encodeURIComponent(id)}`,
  /** a completed appointment's service report (issue 11), on the appointment's page */
  appointmentReport: (id: string): string => `/appointments/${encodeURIComponent(id)}#report`,
};
