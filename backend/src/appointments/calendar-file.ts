import { getVtimezoneComponent } from '@touch4it/ical-timezones';
import ical, { ICalCalendarMethod, ICalEventStatus } from 'ical-generator';
import { DateTime } from 'luxon';

/**
 * Calendar files (RFC 5545) for appointments: one event per appointment with a stable UID, a
 * SEQUENCE raised on every change of time, times in the shop's zone with its VTIMEZONE, METHOD
 * REQUEST for a booking and CANCEL when it ends; and the shop's private feed of its schedule.
 */

export interface CalendarEvent {
  /** the appointment id; the UID is `<id>@<domain>` */
  id: string;
  start: Date;
  end: Date;
  timeZone: string;
  sequence: number;
  summary: string;
  description: string;
  location: string;
  url?: string;
  cancelled?: boolean;
}

const PRODUCT = { company: 'Loamline', product: 'Loamline bookings', language: 'EN' } as const;

function build(
  name: string,
  timeZone: string,
  method: ICalCalendarMethod | null,
  events: CalendarEvent[],
  domain: string,
) {
  // The zone goes on each event (DTSTART;TZID=…); the calendar itself has none, so that DTSTAMP is
  // written in UTC as RFC 5545 requires (with a calendar zone the library writes it as local time).
  const cal = ical({ name, prodId: PRODUCT });
  if (method) cal.method(method);
  for (const e of events) {
    cal.createEvent({
      id: `${e.id}@${domain}`,
      sequence: e.sequence,
      // Luxon times in the shop's zone: written as its wall clock with TZID (not the server's clock)
      start: DateTime.fromJSDate(e.start, { zone: e.timeZone }),
      end: DateTime.fromJSDate(e.end, { zone: e.timeZone }),
      timezone: e.timeZone,
      summary: e.summary,
      description: e.description,
      location: e.location,
      url: e.url ?? null,
      status: e.cancelled ? ICalEventStatus.CANCELLED : ICalEventStatus.CONFIRMED,
      stamp: DateTime.utc(),
    });
  }
  const text = cal.toString();
  const vtimezone = getVtimezoneComponent(timeZone);
  if (!vtimezone) return text;
  const block = vtimezone.replace(/\r?\n/g, '\r\n').replace(/(\r\n)?$/, '\r\n');
  const at = text.indexOf('BEGIN:VEVENT');
  return at < 0
    ? text.replace('END:VCALENDAR', `${block}END:VCALENDAR`)
    : text.slice(0, at) + block + text.slice(at);
}

/** The file attached to a confirmation or a move (METHOD:REQUEST) or a cancellation (METHOD:CANCEL). */
export function appointmentCalendarFile(e: CalendarEvent, domain: string): string {
  return build(
    e.summary,
    e.timeZone,
    e.cancelled ? ICalCalendarMethod.CANCEL : ICalCalendarMethod.REQUEST,
    [e],
    domain,
  );
}

/** A shop's schedule for the staff's calendar apps (no METHOD: a published feed). */
export function scheduleFeed(
  shopName: string,
  timeZone: string,
  events: CalendarEvent[],
  domain: string,
): string {
  return build(`${shopName} — schedule`, timeZone, null, events, domain);
}
