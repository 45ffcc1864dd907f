/*
 * Times of a shop, always in the shop's zone (the API sends ISO times with that zone's offset;
 * the rider's browser may be anywhere). `locale` undefined is the browser's.
 */

/** "Berlin" for Europe/Berlin, "Port of Spain" for America/Port_of_Spain. */
export function zoneCity(zone: string): string {
  const last = zone.split('/').pop() ?? zone;
  return last.replace(/_/g, ' ');
}

/** The zone's short name at that moment: "CEST", "GMT+2", "MDT" (the locale decides which). */
export function zoneAbbreviation(zone: string, iso: string | Date = new Date(), locale?: string): string {
  const at = typeof iso === 'string' ? new Date(iso) : iso;
  const part = new Intl.DateTimeFormat(locale, { timeZone: zone, timeZoneName: 'short' })
    .formatToParts(at)
    .find((p) => p.type === 'timeZoneName');
  return part?.value ?? zone;
}

/** The zone named for people: "Berlin time (CEST)". */
export function zoneLabel(zone: string, iso: string | Date = new Date(), locale?: string): string {
  return `${zoneCity(zone)} time (${zoneAbbreviation(zone, iso, locale)})`;
}

/** The wall-clock time in the zone: "09:00" or "9:00 AM". */
export function formatTime(iso: string, zone: string, locale?: string): string {
  return new Intl.DateTimeFormat(locale, { timeZone: zone, hour: 'numeric', minute: '2-digit' }).format(
    new Date(iso),
  );
}

/** The day in the zone: "Tuesday, 14 October 2025" (en-GB). */
export function formatDay(iso: string, zone: string, locale?: string): string {
  return new Intl.DateTimeFormat(locale, {
    timeZone: zone,
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
  }).format(new Date(iso));
}

/** The date in the zone, short: "14 Oct 2025" (en-GB) or "Oct 14, 2025" (en-US). */
export function formatDate(iso: string, zone: string, locale?: string): string {
  return new Intl.DateTimeFormat(locale, {
    timeZone: zone,
    day: 'numeric',
    month: 'short',
    year: 'numeric',
  }).format(new Date(iso));
}

/** An instant in the zone, short, the zone not named: "14 Oct 2025, 10:00" or "Oct 14, 2025, 10:00 AM". */
export function formatDateTime(iso: string, zone: string, locale?: string): string {
  return `${formatDate(iso, zone, locale)}, ${formatTime(iso, zone, locale)}`;
}

/** A local date YYYY-MM-DD as people read it: "Tuesday, 14 October 2025". */
export function formatLocalDate(date: string, locale?: string): string {
  return new Intl.DateTimeFormat(locale, {
    timeZone: 'UTC',
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
  }).format(new Date(`${date}T12:00:00Z`));
}

/** Start and end in the shop's zone, the zone named: "Tue, 14 Oct 2025, 10:00–11:00 Berlin time (CEST)". */
export function formatSlot(startIso: string, endIso: string | null, zone: string, locale?: string): string {
  const day = new Intl.DateTimeFormat(locale, {
    timeZone: zone,
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
  }).format(new Date(startIso));
  const times = endIso
    ? `${formatTime(startIso, zone, locale)}–${formatTime(endIso, zone, locale)}`
    : formatTime(startIso, zone, locale);
  return `${day}, ${times} ${zoneLabelBetween(zone, startIso, endIso ?? startIso, locale)}`;
}

/**
 * The zone named for a stretch of time: "Berlin time (CET)", or, when the clocks change inside it
 * (a daylight-saving day), both short names: "Denver time (MST, then MDT after the clock change)".
 */
export function zoneLabelBetween(
  zone: string,
  fromIso: string | Date,
  toIso: string | Date,
  locale?: string,
): string {
  const before = zoneAbbreviation(zone, fromIso, locale);
  const after = zoneAbbreviation(zone, toIso, locale);
  return before === after
    ? `${zoneCity(zone)} time (${before})`
    : `${zoneCity(zone)} time (${before}, then ${after} after the clock change)`;
}

/** The local date (YYYY-MM-DD) of an instant in the zone. */
export function localDate(iso: string, zone: string): string {
  return dayIn(new Date(iso), zone);
}

/** Today in the zone, YYYY-MM-DD. */
export function todayIn(zone: string, now: Date = new Date()): string {
  return dayIn(now, zone);
}

function dayIn(at: Date, zone: string): string {
  // en-US: Gregorian calendar and Latin digits whatever the browser's language, read part by part
  const parts = new Intl.DateTimeFormat('en-US', {
    timeZone: zone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).formatToParts(at);
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year').padStart(4, '0')}-${part('month')}-${part('day')}`;
}

/** The browser's own zone, when its clock differs from the shop's now (for a note under the times). */
export function otherBrowserZone(
  shopZone: string,
  mine: string = Intl.DateTimeFormat().resolvedOptions().timeZone,
  now: Date = new Date(),
): string | null {
  if (!mine) return null;
  // the same wall clock at the same instant is the same offset from UTC
  const wall = (zone: string) =>
    new Intl.DateTimeFormat('en-US', {
      timeZone: zone,
      year: 'numeric',
      month: 'numeric',
      day: 'numeric',
      hour: 'numeric',
      minute: 'numeric',
      hourCycle: 'h23',
    }).format(now);
  return mine !== shopZone && wall(mine) !== wall(shopZone) ? mine : null;
}
