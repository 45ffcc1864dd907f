import { describe, expect, it } from 'vitest';
import {
  formatDay,
  formatLocalDate,
  formatSlot,
  formatTime,
  localDate,
  todayIn,
  zoneCity,
  otherBrowserZone,
  zoneLabel,
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

  it('names both short names when the clocks change inside a slot', () => {
    // Denver springs forward at 02:00 MST on 14 March 2027: 01:30 MST + 30 min is 03:00 MDT
    expect(
      formatSlot('2027-03-14T01:30:00-07:00', '2027-03-14T03:00:00-06:00', 'America/Denver', 'en-US'),
    ).toBe('Sun, Mar 14, 2027, 1:30 AM–3:00 AM Denver time (MST, then MDT after the clock change)');
    expect(
      formatSlot('2027-03-14T03:00:00-06:00', '2027-03-14T03:30:00-06:00', 'America/Denver', 'en-US'),
    ).toBe('Sun, Mar 14, 2027, 3:00 AM–3:30 AM Denver time (MDT)');
  });

  it('a local date reads the same in every zone', () => {
    expect(formatLocalDate('2027-03-28', 'en-GB')).toBe('Sunday, 28 March 2027');
  });

  it('today is the shop’s today', () => {
    const now = new Date('2027-06-15T22:30:00Z');
    expect(todayIn('Europe/Berlin', now)).toBe('2027-06-16');
    expect(todayIn('America/Denver', now)).toBe('2027-06-15');
  });

  /*
   * Day keys on either side of the clock changes, from the rules in the IANA tz database (from
   * memory): Europe/London moves to BST (+01:00) at 01:00 UTC on the last Sunday of March (28 March
   * 2027) and back to GMT at 01:00 UTC on the last Sunday of October (31 October 2027);
   * America/New_York moves to EDT (−04:00) at 02:00 EST (07:00 UTC) on the second Sunday of March
   * (14 March 2027) and back to EST (−05:00) at 02:00 EDT (06:00 UTC) on the first Sunday of November
   * (7 November 2027); Asia/Kolkata is +05:30 all year.
   */
  it('keys the day with the offset in force at that instant', () => {
    // London: 23:30 UTC is 23:30 GMT the night before the change, 00:30 BST the night after it
    expect(localDate('2027-03-27T23:30:00Z', 'Europe/London')).toBe('2027-03-27');
    expect(localDate('2027-03-28T23:30:00Z', 'Europe/London')).toBe('2027-03-29');
    expect(localDate('2027-10-30T23:30:00Z', 'Europe/London')).toBe('2027-10-31');
    expect(localDate('2027-10-31T23:30:00Z', 'Europe/London')).toBe('2027-10-31');
    // New York: 04:30 UTC is 23:30 EST before the spring change, 00:30 EDT after it, and back in autumn
    expect(localDate('2027-03-14T04:30:00Z', 'America/New_York')).toBe('2027-03-13');
    expect(localDate('2027-03-15T04:30:00Z', 'America/New_York')).toBe('2027-03-15');
    expect(localDate('2027-11-07T04:30:00Z', 'America/New_York')).toBe('2027-11-07');
    expect(localDate('2027-11-08T04:30:00Z', 'America/New_York')).toBe('2027-11-07');
    // Kolkata: midnight is 18:30 UTC the day before
    expect(todayIn('Asia/Kolkata', new Date('2027-06-15T18:29:59Z'))).toBe('2027-06-15');
    expect(todayIn('Asia/Kolkata', new Date('2027-06-15T18:30:00Z'))).toBe('2027-06-16');
  });

  /*
   * Same offsets from the IANA tz database (from memory): America/Panama is −05:00 all year, as New
   * York in winter; Africa/Abidjan is +00:00 all year, as London in winter; Asia/Colombo is +05:30 as
   * Kolkata; Asia/Kathmandu is +05:45.
   */
  it('names the browser’s zone only when its clock differs from the shop’s', () => {
    const winter = new Date('2027-01-15T12:00:00Z');
    const summer = new Date('2027-07-15T12:00:00Z');
    expect(otherBrowserZone('Europe/London', 'Europe/London', summer)).toBeNull();
    expect(otherBrowserZone('America/New_York', 'America/Panama', winter)).toBeNull();
    expect(otherBrowserZone('America/New_York', 'America/Panama', summer)).toBe('America/Panama');
    expect(otherBrowserZone('Europe/London', 'Africa/Abidjan', winter)).toBeNull();
    expect(otherBrowserZone('Europe/London', 'Africa/Abidjan', summer)).toBe('Africa/Abidjan');
    // the week New York has changed and London has not (14–28 March 2027): five hours apart, then four
    expect(otherBrowserZone('Europe/London', 'America/New_York', new Date('2027-03-20T12:00:00Z'))).toBe(
      'America/New_York',
    );
    expect(otherBrowserZone('Asia/Kolkata', 'Asia/Colombo', summer)).toBeNull();
    expect(otherBrowserZone('Asia/Kolkata', 'Asia/Kathmandu', summer)).toBe('Asia/Kathmandu');
    expect(otherBrowserZone('Europe/Berlin', '', summer)).toBeNull(); // the browser names no zone
  });
});
