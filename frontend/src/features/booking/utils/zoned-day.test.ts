import { describe, expect, it } from 'vitest';
import { zoneLabelForDay } from './zoned-day';

/* Berlin springs forward at 02:00 CET on 28 March 2027 (the last Sunday of March, IANA tz database). */

describe('the zone named for a local day', () => {
  it('names both short names on the day the clocks change', () => {
    expect(zoneLabelForDay('Europe/Berlin', '2027-03-28', 'en-GB')).toBe(
      'Berlin time (CET, then CEST after the clock change)',
    );
    expect(zoneLabelForDay('Europe/Berlin', '2027-03-29', 'en-GB')).toBe('Berlin time (CEST)');
  });
});
