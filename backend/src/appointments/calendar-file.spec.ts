import ICAL from 'ical.js';
import { appointmentCalendarFile, scheduleFeed } from './calendar-file';

/* Checked by parsing with ical.js (an independent RFC 5545 parser) and its own time-zone maths. */

const event = {
  id: '7d3c6a3e-0000-4000-8000-000000000001',
  start: new Date('2027-03-28T07:00:00Z'), // 09:00 in Berlin, the first day of summer time
  end: new Date('2027-03-28T08:15:00Z'),
  timeZone: 'Europe/Berlin',
  sequence: 2,
  summary: 'Air spring setup — fork and shock',
  description: 'At Mossgrund Federwerk',
  location: 'Mossgrund Federwerk, Mossgrund',
};

function parse(text: string) {
  const comp = new ICAL.Component(ICAL.parse(text));
  for (const tz of comp.getAllSubcomponents('vtimezone')) ICAL.TimezoneService.register(tz);
  return comp;
}

describe('calendar files (RFC 5545, parsed with ical.js)', () => {
  it('a confirmation: METHOD:REQUEST, stable UID, SEQUENCE, local start with the zone’s VTIMEZONE', () => {
    const comp = parse(appointmentCalendarFile(event, 'loamline.test'));
    expect(comp.getFirstPropertyValue('method')).toBe('REQUEST');
    const tz = comp.getFirstSubcomponent('vtimezone')!;
    expect(tz.getFirstPropertyValue('tzid')).toBe('Europe/Berlin');
    const vevent = new ICAL.Event(comp.getFirstSubcomponent('vevent')!);
    expect(vevent.uid).toBe(`${event.id}@loamline.test`);
    expect(vevent.sequence).toBe(2);
    expect(vevent.startDate.zone?.tzid).toBe('Europe/Berlin');
    expect(vevent.startDate.toString()).toBe('2027-03-28T09:00:00');
    expect(vevent.startDate.toJSDate().toISOString()).toBe('2027-03-28T07:00:00.000Z');
    expect(vevent.endDate.toJSDate().toISOString()).toBe('2027-03-28T08:15:00.000Z');
  });

  it('a cancellation: METHOD:CANCEL, STATUS:CANCELLED, same UID', () => {
    const comp = parse(appointmentCalendarFile({ ...event, sequence: 3, cancelled: true }, 'loamline.test'));
    expect(comp.getFirstPropertyValue('method')).toBe('CANCEL');
    const v = comp.getFirstSubcomponent('vevent')!;
    expect(v.getFirstPropertyValue('status')).toBe('CANCELLED');
    expect(v.getFirstPropertyValue('uid')).toBe(`${event.id}@loamline.test`);
  });

  it('a feed of several events, no METHOD, in the shop’s zone (America/Denver)', () => {
    const denver = {
      ...event,
      timeZone: 'America/Denver',
      start: new Date('2027-03-14T16:00:00Z'),
      end: new Date('2027-03-14T17:00:00Z'),
    };
    const comp = parse(
      scheduleFeed(
        'Kettle Ridge Suspension Lab',
        'America/Denver',
        [denver, { ...denver, id: 'x2' }],
        'loamline.test',
      ),
    );
    expect(comp.getFirstPropertyValue('method')).toBeNull();
    const events = comp.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v));
    expect(events).toHaveLength(2);
    expect(events[0].startDate.toString()).toBe('2027-03-14T10:00:00'); // MDT (UTC−6) from 2027-03-14
  });
});
