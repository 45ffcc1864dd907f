import { describe, expect, it } from 'vitest';
import {
  formatDay,
  formatLocalDate,
  formatSlot,
  formatTime,
  localDate,
  todayIn,
  zoneCity,
  zoneLabel,
  zoneLabelForDay,
} from './zoned-time';

/*
 * Whatever zone the test process runs in (vitest takes the machine's), times come out in the shop's
 * zone. Offsets from the IANA database as Intl knows it: Berlin +02:00 in summer, +01:00 in winter;
 * Denver −06:00 in summer; Tokyo +09:00 all year.
 */

describe('times in the shop’s zone', () => {
  it('shows the shop’s wall clock, not the browser’s', () => {
    const iso = '2027-06-15T10:00:00+02:00'; // 08:00 UTC
    expect(formatTime(iso, 'Europe/Berlin', 'en-GB')).toBe('10:00');
    expect(formatTime(iso, 'Asia/Tokyo', 'en-GB')).toBe('17:00');
    expect(formatTime(iso, 'America/Denver', 'en-US')).toBe('2:00 AM');
  });

  it('the day can differ by zone', () => {
    const iso = '2027-06-15T23:30:00+02:00';
    expect(formatDay(iso, 'Europe/Berlin', 'en-GB')).toBe('Tuesday, 15 June 2027');
    expect(formatDay(iso, 'Asia/Tokyo', 'en-GB')).toBe('Wednesday, 16 June 2027');
    expect(localDate(iso, 'Asia/Tokyo')).toBe('2027-06-16');
    expect(localDate(iso, 'Europe/Berlin')).toBe('2027-06-15');
  });

  it('names the zone with its city and the short name in force at that time', () => {
    expect(zoneCity('America/Port_of_Spain')).toBe('Port of Spain');
    expect(zoneLabel('Europe/Berlin', '2027-06-15T10:00:00+02:00', 'en-GB')).toBe('Berlin time (CEST)');
    expect(zoneLabel('Europe/Berlin', '2027-01-15T10:00:00+01:00', 'en-GB')).toBe('Berlin time (CET)');
    expect(zoneLabel('America/Denver', '2027-06-15T10:00:00-06:00', 'en-US')).toBe('Denver time (MDT)');
  });

  it('writes a slot with day, start–end and zone', () => {
    expect(
      formatSlot('2027-06-15T10:00:00+02:00', '2027-06-15T11:30:00+02:00', 'Europe/Berlin', 'en-GB'),
    ).toBe('Tue, 15 Jun 2027, 10:00–11:30 Berlin time (CEST)');
  });

  it('names both short names when the clocks change inside a slot or a day', () => {
    // Denver springs forward at 02:00 MST on 14 March 2027: 01:30 MST + 30 min is 03:00 MDT
    expect(
      formatSlot('2027-03-14T01:30:00-07:00', '2027-03-14T03:00:00-06:00', 'America/Denver', 'en-US'),
    ).toBe('Sun, Mar 14, 2027, 1:30 AM–3:00 AM Denver time (MST, then MDT after the clock change)');
    expect(
      formatSlot('2027-03-14T03:00:00-06:00', '2027-03-14T03:30:00-06:00', 'America/Denver', 'en-US'),
    ).toBe('Sun, Mar 14, 2027, 3:00 AM–3:30 AM Denver time (MDT)');
    expect(zoneLabelForDay('Europe/Berlin', '2027-03-28', 'en-GB')).toBe(
      'Berlin time (CET, then CEST after the clock change)',
    );
    expect(zoneLabelForDay('Europe/Berlin', '2027-03-29', 'en-GB')).toBe('Berlin time (CEST)');
  });

  it('a local date reads the same in every zone', () => {
    expect(formatLocalDate('2027-03-28', 'en-GB')).toBe('Sunday, 28 March 2027');
  });

  it('today is the shop’s today', () => {
    const now = new Date('2027-06-15T22:30:00Z');
    expect(todayIn('Europe/Berlin', now)).toBe('2027-06-16');
    expect(todayIn('America/Denver', now)).toBe('2027-06-15');
  });
});
