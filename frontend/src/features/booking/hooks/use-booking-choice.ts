import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router';

export const BOOKING_STEPS = ['time', 'details', 'review'] as const;
export type BookingStep = (typeof BOOKING_STEPS)[number];

/** What the rider has chosen so far. It lives in the URL, so sign-in's `?next=` brings it all back. */
export interface BookingChoice {
  serviceId: string | null;
  /** local date in the shop's zone */
  day: string | null;
  /** ISO start with the shop zone's offset, as availability gave it */
  start: string | null;
  bikeId: string | null;
  sheetId: string | null;
  step: BookingStep | null;
}

const KEYS: Record<keyof BookingChoice, string> = {
  serviceId: 'service',
  day: 'day',
  start: 'start',
  bikeId: 'bike',
  sheetId: 'sheet',
  step: 'step',
};

export function readChoice(params: URLSearchParams): BookingChoice {
  const step = params.get('step');
  const day = params.get('day');
  return {
    serviceId: params.get('service'),
    day: day && /^\d{4}-\d{2}-\d{2}$/.test(day) ? day : null,
    start: params.get('start'),
    bikeId: params.get('bike'),
    sheetId: params.get('sheet'),
    step: serviceStep(params.get('service'), step),
  };
}

function serviceStep(service: string | null, step: string | null): BookingStep | null {
  if (!service) return null;
  return (BOOKING_STEPS as readonly string[]).includes(step ?? '') ? (step as BookingStep) : 'time';
}

/** The query string for a choice (empty values left out). */
export function choiceSearch(choice: Partial<BookingChoice>): string {
  const params = new URLSearchParams();
  for (const [k, name] of Object.entries(KEYS) as [keyof BookingChoice, string][]) {
    const v = choice[k];
    if (v) params.set(name, v);
  }
  const s = params.toString();
  return s ? `?${s}` : '';
}

/** The booking choice in the URL, and a setter that merges (a new step is a new history entry). */
export function useBookingChoice() {
  const [params, setParams] = useSearchParams();
  const choice = useMemo(() => readChoice(params), [params]);
  const update = useCallback(
    (patch: Partial<BookingChoice>, opts: { replace?: boolean } = {}) => {
      const next = { ...readChoice(params), ...patch };
      setParams(new URLSearchParams(choiceSearch(next)), {
        replace: opts.replace ?? !('step' in patch),
        preventScrollReset: !('step' in patch),
      });
    },
    [params, setParams],
  );
  return { choice, update };
}

/** Notes are free text: kept for the tab in sessionStorage, not in the URL. */
const notesKey = (slug: string) => `loamline.booking.notes.${slug}`;
export const readNotes = (slug: string): string => window.sessionStorage.getItem(notesKey(slug)) ?? '';
export const writeNotes = (slug: string, notes: string): void => {
  if (notes) window.sessionStorage.setItem(notesKey(slug), notes);
  else window.sessionStorage.removeItem(notesKey(slug));
};
