/** "14:05", or "3 Jun, 14:05" when not today, in the shop's zone (named by the page). */
export function savedAtLabel(iso: string, zone: string, now: Date = new Date()): string {
  const d = new Date(iso);
  const day = (x: Date) => x.toLocaleDateString('en-GB', { timeZone: zone });
  const time = d.toLocaleTimeString('en-GB', { timeZone: zone, hour: '2-digit', minute: '2-digit' });
  if (day(d) === day(now)) return time;
  return `${d.toLocaleDateString('en-GB', { timeZone: zone, day: 'numeric', month: 'short' })}, ${time}`;
}

/** "2 December 2026" in the shop's zone. */
export function longDate(iso: string, zone: string): string {
  return new Date(iso).toLocaleDateString('en-GB', {
    timeZone: zone,
    day: 'numeric',
    month: 'long',
    year: 'numeric',
  });
}
