import { DateTime } from 'luxon';
import { zoneLabelBetween } from './zoned-time';

/*
 * Zoned arithmetic (a local day → its first and last instant, across clock changes) on Luxon. Only the
 * day-and-time picker uses it, and that chunk loads Luxon for the MUI X pickers anyway, so the pages
 * that just show times keep Luxon out of their own chunks.
 */

/** The zone named for a local day (YYYY-MM-DD) in it, both short names on a day the clocks change. */
export function zoneLabelForDay(zone: string, date: string, locale?: string): string {
  const start = DateTime.fromISO(date, { zone }).startOf('day');
  return zoneLabelBetween(zone, start.toJSDate(), start.endOf('day').toJSDate(), locale);
}
