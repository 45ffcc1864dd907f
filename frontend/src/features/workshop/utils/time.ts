/**
 * Times in the shop's zone. The API sends every time as ISO-8601 with the shop zone's offset
 * (`2027-03-29T09:00:00+02:00`), so an appointment's wall clock is in its own string; dates are
 * `YYYY-MM-DD` in the shop's zone. Only "now" needs the zone rules, and Intl has them.
 */

export const WEEKDAYS = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];
export const WEEKDAYS_SHORT = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** `YYYY-MM-DD` of an ISO time with offset, as its wall clock reads. */
export const localDate = (iso: string): string => iso.slice(0, 10);
/** `HH:mm` of an ISO time with offset, as its wall clock reads. */
export const localTime = (iso: string): string => iso.slice(11, 16);
/** Minutes since the local midnight of an ISO time with offset. */
export const localMinutes = (iso: string): number => toMinutes(localTime(iso));

/** `HH:mm` → minutes since midnight (`24:00` → 1440). */
export function toMinutes(hhmm: string): number {
  const [h, m] = hhmm.split(':').map(Number);
  return h * 60 + m;
}
/** minutes since midnight → `HH:mm` */
export function fromMinutes(min: number): string {
  const h = Math.floor(min / 60);
  const m = min % 60;
  return `${String(h).padStart(2, '0')}:${String(m).padStart(2, '0')}`;
}

const utc = (date: string): Date => new Date(`${date}T00:00:00Z`);
const iso = (d: Date): string => d.toISOString().slice(0, 10);

export const addDays = (date: string, days: number): string => {
  const d = utc(date);
  d.setUTCDate(d.getUTCDate() + days);
  return iso(d);
};
/** ISO weekday: 1 = Monday … 7 = Sunday */
export const weekday = (date: string): number => ((utc(date).getUTCDay() + 6) % 7) + 1;
/** The Monday of `date`'s week. */
export const startOfWeek = (date: string): string => addDays(date, 1 - weekday(date));

/** "Mon 29 Mar" */
export function dayLabel(date: string): string {
  const d = utc(date);
  return `${WEEKDAYS_SHORT[weekday(date) - 1]} ${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`;
}
/** "Monday 29 March 2027" */
export function longDayLabel(date: string): string {
  const d = utc(date);
  const month = new Intl.DateTimeFormat('en-GB', { month: 'long', timeZone: 'UTC' }).format(d);
  return `${WEEKDAYS[weekday(date) - 1]} ${d.getUTCDate()} ${month} ${d.getUTCFullYear()}`;
}

/** "Mon 29 Mar, 09:00" for an ISO time with offset, in its own wall clock. */
export const whenLabel = (isoTime: string): string =>
  `${dayLabel(localDate(isoTime))}, ${localTime(isoTime)}`;

/** Today's date in `timeZone`. */
export function todayIn(timeZone: string, now: Date = new Date()): string {
  return new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(now);
}

/** "Europe/Berlin (CET)": the zone named, with its abbreviation or offset at `at`. */
export function zoneLabel(timeZone: string, at: Date = new Date()): string {
  try {
    const part = new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'short' })
      .formatToParts(at)
      .find((p) => p.type === 'timeZoneName')?.value;
    return `${timeZone.replace(/_/g, ' ')}${part ? ` (${part})` : ''}`;
  } catch {
    return timeZone;
  }
}
