import { DateTime } from 'luxon';
import {
  availability,
  AvailabilityInputError,
  type AvailabilityInput,
  freeBenches,
  gridCells,
  type WeeklyInterval,
} from './availability';

/*
 * Availability against the IANA time-zone data as the runtime's Intl reads it (ECMA-402
 * Intl.DateTimeFormat with timeZone; tz database 2024+): every offered start must read, in the
 * shop's zone, as the wall-clock time the shop's hours say — also on the days the clocks change.
 * Dates of the changes: EU rule (Directive 2000/84/EC: last Sunday of March and of October, 01:00
 * UTC); US rule (Energy Policy Act of 2005: second Sunday of March, first Sunday of November, 02:00
 * local).
 */

const everyDay = (startMinute: number, endMinute: number): WeeklyInterval[] =>
  [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, startMinute, endMinute }));

const base = (over: Partial<AvailabilityInput>): AvailabilityInput => ({
  timeZone: 'Europe/Berlin',
  hours: everyDay(9 * 60, 17 * 60),
  closures: [],
  benches: 1,
  rules: { slotStepMinutes: 60, minNoticeMinutes: 0, maxDaysAhead: 400 },
  service: { durationMinutes: 60, bufferAfterMinutes: 0 },
  busy: [],
  from: '2027-01-04',
  to: '2027-01-04',
  nowMs: Date.parse('2027-01-01T00:00:00Z'),
  ...over,
});

/** The wall-clock time and date of an instant in a zone, as Intl reads the IANA data. */
function intlWallClock(iso: string, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).formatToParts(new Date(iso));
  const get = (t: string) => parts.find((p) => p.type === t)!.value;
  return `${get('year')}-${get('month')}-${get('day')} ${get('hour')}:${get('minute')}`;
}

/** The zone's UTC offset at an instant, in minutes, from Intl's "longOffset" (e.g. GMT+02:00). */
function intlOffsetMinutes(iso: string, timeZone: string): number {
  const name = new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'longOffset' })
    .formatToParts(new Date(iso))
    .find((p) => p.type === 'timeZoneName')!.value;
  const m = /GMT([+-])(\d{2}):(\d{2})/.exec(name);
  return m ? (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3])) : 0;
}

describe('availability across daylight-saving changes (IANA data through Intl)', () => {
  const cases = [
    { zone: 'Europe/Berlin', day: '2027-03-28', before: 60, after: 120, what: 'EU spring forward' },
    { zone: 'Europe/Berlin', day: '2027-10-31', before: 120, after: 60, what: 'EU fall back' },
    { zone: 'America/Denver', day: '2027-03-14', before: -420, after: -360, what: 'US spring forward' },
    { zone: 'America/Denver', day: '2027-11-07', before: -360, after: -420, what: 'US fall back' },
  ];
  for (const c of cases) {
    it(`${c.zone} on ${c.day} (${c.what}): starts at 09:00…16:00 wall clock, offsets as the tz data says`, () => {
      const dayBefore = DateTime.fromISO(c.day).minus({ days: 1 }).toISODate()!;
      const slots = availability(base({ timeZone: c.zone, from: dayBefore, to: c.day }));
      const onDay = slots.filter((s) => s.start.startsWith(c.day));
      const before = slots.filter((s) => s.start.startsWith(dayBefore));
      expect(onDay.map((s) => intlWallClock(s.start, c.zone).slice(11))).toEqual([
        '09:00',
        '10:00',
        '11:00',
        '12:00',
        '13:00',
        '14:00',
        '15:00',
        '16:00',
      ]);
      for (const s of onDay) {
        expect(intlWallClock(s.start, c.zone).slice(0, 10)).toBe(c.day);
        expect(intlOffsetMinutes(s.start, c.zone)).toBe(c.after);
        expect(Date.parse(s.end) - Date.parse(s.start)).toBe(3_600_000); // one real hour
      }
      for (const s of before) expect(intlOffsetMinutes(s.start, c.zone)).toBe(c.before);
      // the same 09:00 is a different UTC time on either side of the change
      expect(Date.parse(onDay[0].start) - Date.parse(before[0].start)).toBe(
        24 * 3_600_000 - (c.after - c.before) * 60_000,
      );
    });
  }

  it('a shop open through the night: the skipped hour offers nothing, the doubled hour once per instant', () => {
    const spring = availability(
      base({ timeZone: 'Europe/Berlin', hours: everyDay(0, 6 * 60), from: '2027-03-28', to: '2027-03-28' }),
    );
    const wall = spring.map((s) => intlWallClock(s.start, 'Europe/Berlin').slice(11));
    expect(wall).not.toContain('02:00'); // 02:00–03:00 does not exist that night
    expect(wall).toEqual(['00:00', '01:00', '03:00', '04:00', '05:00']);
    const fall = availability(
      base({ timeZone: 'Europe/Berlin', hours: everyDay(0, 6 * 60), from: '2027-10-31', to: '2027-10-31' }),
    );
    const starts = fall.map((s) => Date.parse(s.start));
    expect(new Set(starts).size).toBe(starts.length);
    for (const s of fall) expect(Date.parse(s.end) - Date.parse(s.start)).toBe(3_600_000);
  });
});

describe('availability rules', () => {
  it('minimum notice: nothing before now + notice', () => {
    const now = Date.parse('2027-01-04T09:30:00+01:00');
    const slots = availability(
      base({ nowMs: now, rules: { slotStepMinutes: 60, minNoticeMinutes: 120, maxDaysAhead: 30 } }),
    );
    expect(slots[0].start).toBe('2027-01-04T12:00:00+01:00');
  });

  it('days ahead: nothing past today + N in the shop’s zone', () => {
    const slots = availability(
      base({
        nowMs: Date.parse('2027-01-01T12:00:00+01:00'),
        rules: { slotStepMinutes: 60, minNoticeMinutes: 0, maxDaysAhead: 3 },
        from: '2027-01-01',
        to: '2027-01-10',
      }),
    );
    const days = new Set(slots.map((s) => s.start.slice(0, 10)));
    expect([...days]).toEqual(['2027-01-01', '2027-01-02', '2027-01-03', '2027-01-04']);
  });

  it('closures (single days and ranges) remove whole local days', () => {
    const slots = availability(
      base({
        from: '2027-01-04',
        to: '2027-01-10',
        closures: [
          { from: '2027-01-05', to: '2027-01-05' },
          { from: '2027-01-07', to: '2027-01-09' },
        ],
      }),
    );
    expect([...new Set(slots.map((s) => s.start.slice(0, 10)))]).toEqual([
      '2027-01-04',
      '2027-01-06',
      '2027-01-10',
    ]);
  });

  it('several intervals a day, the service must end by closing time, step and duration apart', () => {
    const slots = availability(
      base({
        hours: [
          { weekday: 1, startMinute: 9 * 60, endMinute: 12 * 60 },
          { weekday: 1, startMinute: 13 * 60, endMinute: 15 * 60 },
        ],
        rules: { slotStepMinutes: 30, minNoticeMinutes: 0, maxDaysAhead: 30 },
        service: { durationMinutes: 90, bufferAfterMinutes: 15 },
      }),
    );
    expect(slots.map((s) => s.start.slice(11, 16))).toEqual([
      '09:00',
      '09:30',
      '10:00',
      '10:30',
      '13:00',
      '13:30',
    ]);
  });

  it('buffers and capacity: a live appointment keeps its bench through its buffer', () => {
    const at = (t: string) => Date.parse(`2027-01-04T${t}:00+01:00`);
    const busy = [{ bench: 1, startMs: at('10:00'), endMs: at('11:30') }]; // 60 min + 30 buffer
    const one = availability(
      base({ busy, rules: { slotStepMinutes: 30, minNoticeMinutes: 0, maxDaysAhead: 30 } }),
    );
    const starts = one.map((s) => s.start.slice(11, 16));
    expect(starts).not.toContain('09:30'); // would run into the appointment
    expect(starts).not.toContain('10:00');
    expect(starts).not.toContain('11:00'); // inside the buffer
    expect(starts).toContain('09:00');
    expect(starts).toContain('11:30');
    const two = availability(
      base({ busy, benches: 2, rules: { slotStepMinutes: 30, minNoticeMinutes: 0, maxDaysAhead: 30 } }),
    );
    const ten = two.find((s) => s.start.slice(11, 16) === '10:00')!;
    expect(ten.benchesFree).toBe(1);
    expect(ten.benches).toEqual([2]);
    expect(two.find((s) => s.start.slice(11, 16) === '15:00')!.benchesFree).toBe(2);
  });

  it('refuses unknown zones, bad dates and too long a range', () => {
    expect(() => availability(base({ timeZone: 'Mars/Olympus' }))).toThrow(AvailabilityInputError);
    expect(() => availability(base({ from: '2027-02-30' }))).toThrow(AvailabilityInputError);
    expect(() => availability(base({ from: '2027-01-10', to: '2027-01-01' }))).toThrow(
      AvailabilityInputError,
    );
    expect(() => availability(base({ from: '2027-01-01', to: '2027-06-01' }))).toThrow(
      AvailabilityInputError,
    );
  });
});

describe('kept offered starts (the same calendar asked again)', () => {
  it('other bench time, another now or other rules are applied to a kept list', () => {
    const at = (t: string) => Date.parse(`2027-01-04T${t}:00+01:00`);
    const input = base({ rules: { slotStepMinutes: 60, minNoticeMinutes: 0, maxDaysAhead: 30 } });
    const starts = (i: AvailabilityInput) => availability(i).map((s) => s.start.slice(11, 16));
    // source: base() above — Berlin, 09:00–17:00, one-hour service on the hour
    expect(starts(input)).toEqual(['09:00', '10:00', '11:00', '12:00', '13:00', '14:00', '15:00', '16:00']);
    // the same calendar again, now with an appointment 10:00–12:00 on the only bench
    const busy = [{ bench: 1, startMs: at('10:00'), endMs: at('12:00') }];
    expect(starts({ ...input, busy })).toEqual(['09:00', '12:00', '13:00', '14:00', '15:00', '16:00']);
    // and at 13:30 that day with no notice: only what is still ahead
    expect(starts({ ...input, nowMs: at('13:30') })).toEqual(['14:00', '15:00', '16:00']);
    // and a day past the last bookable day: nothing
    expect(starts({ ...input, rules: { ...input.rules, maxDaysAhead: 2 } })).toEqual([]);
    expect(starts(input)).toHaveLength(8);
  });

  it('a changed calendar (hours, closures, step, zone) is asked afresh', () => {
    const starts = (i: AvailabilityInput) => availability(i).map((s) => s.start);
    expect(starts(base({}))[0]).toBe('2027-01-04T09:00:00+01:00');
    // source: the inputs themselves — one hour later, closed that day, another zone (New York, −05:00 in winter)
    expect(starts(base({ hours: everyDay(10 * 60, 17 * 60) }))[0]).toBe('2027-01-04T10:00:00+01:00');
    expect(starts(base({ closures: [{ from: '2027-01-04', to: '2027-01-04' }] }))).toEqual([]);
    expect(starts(base({ timeZone: 'America/New_York' }))[0]).toBe('2027-01-04T09:00:00-05:00');
    expect(
      starts(base({ rules: { slotStepMinutes: 30, minNoticeMinutes: 0, maxDaysAhead: 400 } })),
    ).toHaveLength(15);
  });

  it('an interval that closes at midnight ends its last start at the next day’s 00:00', () => {
    const out = availability(base({ hours: everyDay(22 * 60, 24 * 60) }));
    // source: wallClock's rule for minute 24·60 (the next local day's start), Berlin +01:00 in January
    expect(out.map((s) => [s.start, s.end])).toEqual([
      ['2027-01-04T22:00:00+01:00', '2027-01-04T23:00:00+01:00'],
      ['2027-01-04T23:00:00+01:00', '2027-01-05T00:00:00+01:00'],
    ]);
  });
});

describe('grid cells and benches', () => {
  it('an appointment keeps one 5-minute cell per bench from its start to the end of its buffer', () => {
    const start = Date.parse('2027-03-28T07:00:00Z');
    const cells = gridCells(start, 75);
    expect(cells).toHaveLength(15);
    expect(cells[14] - cells[0]).toBe(70 * 60_000);
    expect(() => gridCells(start + 60_000, 60)).toThrow(AvailabilityInputError);
  });

  it('free benches: half-open intervals, touching is not overlapping', () => {
    const busy = [
      { bench: 1, startMs: 0, endMs: 100 },
      { bench: 2, startMs: 50, endMs: 150 },
    ];
    expect(freeBenches(busy, 3, 100, 200)).toEqual([1, 3]);
    expect(freeBenches(busy, 2, 0, 50)).toEqual([2]);
  });
});
