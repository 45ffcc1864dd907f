import { DateTime } from 'luxon';

/**
 * Free appointment starts for one shop and one service: weekly hours − closures − live
 * appointments (and their buffers) − minimum notice − days ahead, bench by bench. Pure: no Nest, no
 * I/O; time-zone arithmetic only through Luxon (the IANA database as the runtime's Intl has it), no
 * hand-made offsets. Hours are wall-clock times in the shop's zone, so a day when the clocks change
 * keeps its opening times; an appointment's length is real elapsed time.
 */

/** Every time the booking system keeps is on this grid (minutes): starts, durations, buffers, steps. */
export const GRID_MINUTES = 5;

export interface WeeklyInterval {
  /** ISO weekday: 1 = Monday … 7 = Sunday */
  weekday: number;
  /** minutes after local midnight, on the grid */
  startMinute: number;
  /** minutes after local midnight, > start, at most 24·60 */
  endMinute: number;
}

export interface Closure {
  /** first closed local date, YYYY-MM-DD */
  from: string;
  /** last closed local date, YYYY-MM-DD (inclusive) */
  to: string;
}

export interface AvailabilityRules {
  /** distance between offered starts, minutes (on the grid) */
  slotStepMinutes: number;
  /** the earliest start is now + this, minutes */
  minNoticeMinutes: number;
  /** the last bookable local date is today (shop zone) + this many days */
  maxDaysAhead: number;
}

/** A bench kept by a live appointment over [startMs, endMs) (the end includes its buffer). */
export interface BusyInterval {
  bench: number;
  startMs: number;
  endMs: number;
}

export interface AvailabilityInput {
  timeZone: string;
  hours: readonly WeeklyInterval[];
  closures: readonly Closure[];
  benches: number;
  rules: AvailabilityRules;
  service: { durationMinutes: number; bufferAfterMinutes: number };
  busy: readonly BusyInterval[];
  /** local dates in the shop's zone, inclusive */
  from: string;
  to: string;
  nowMs: number;
}

export interface FreeStart {
  /** ISO-8601 with the shop zone's offset */
  start: string;
  end: string;
  benchesFree: number;
  /** the free bench numbers, lowest first (for the booking that takes one) */
  benches: number[];
}

/** The longest span one availability request may cover, days. */
export const MAX_RANGE_DAYS = 62;

export class AvailabilityInputError extends Error {
  override readonly name = 'AvailabilityInputError';
}

function localDate(iso: string, zone: string, field: string): DateTime {
  const d = DateTime.fromISO(iso, { zone });
  if (!/^\d{4}-\d{2}-\d{2}$/.test(iso) || !d.isValid)
    throw new AvailabilityInputError(`${field} must be a date YYYY-MM-DD`);
  return d.startOf('day');
}

/** True when the zone is a name the runtime's IANA database knows. */
export function isKnownTimeZone(zone: string): boolean {
  return DateTime.now().setZone(zone).isValid;
}

/**
 * The instant of a wall-clock time on a local date, or null when that time does not exist (the
 * hour skipped when the clocks go forward). An hour that happens twice resolves to its first
 * occurrence (Luxon's rule).
 */
export function wallClock(date: DateTime, minute: number): DateTime | null {
  if (minute === 24 * 60) return date.plus({ days: 1 }).startOf('day');
  const t = date.set({ hour: Math.floor(minute / 60), minute: minute % 60, second: 0, millisecond: 0 });
  if (t.hour * 60 + t.minute !== minute || !t.hasSame(date, 'day')) return null;
  return t;
}

/** Bench numbers 1…benches with no busy interval overlapping [startMs, endMs). */
export function freeBenches(
  busy: readonly BusyInterval[],
  benches: number,
  startMs: number,
  endMs: number,
): number[] {
  const taken = new Set<number>();
  for (const b of busy) if (b.startMs < endMs && startMs < b.endMs) taken.add(b.bench);
  const out: number[] = [];
  for (let bench = 1; bench <= benches; bench++) if (!taken.has(bench)) out.push(bench);
  return out;
}

export function isClosed(date: DateTime, closures: readonly Closure[]): boolean {
  const d = date.toISODate()!;
  return closures.some((c) => c.from <= d && d <= c.to);
}

const pad2 = (n: number): string => String(n).padStart(2, '0');

/**
 * The ISO string of minute `minute` (< 24·60) of the day of `dayIso` (Luxon's `toISO` of a time on
 * that day, without milliseconds), with that time's offset: the same string Luxon writes for it
 * when the offset does not change in between.
 */
function wallIso(dayIso: string, minute: number): string {
  return `${dayIso.slice(0, 11)}${pad2(Math.floor(minute / 60))}:${pad2(minute % 60)}:00${dayIso.slice(19)}`;
}

/** A start the shop's hours offer, before notice, days ahead and bench time are applied. */
interface Offered {
  startMs: number;
  /** the local date it is on, YYYY-MM-DD */
  day: string;
  start: string;
  end: string;
}

/** How many offered-start lists `availability` keeps (a month of one service is about 200 kB). */
const OFFERED_CACHE_SIZE = 64;
const offeredCache = new Map<string, readonly Offered[]>();

/**
 * Every start the weekly hours offer between two local dates, outside closures, in time order, each
 * instant once. It depends only on its inputs (never on now or on bookings), so it is kept by its
 * inputs' value: the Luxon work, most of a request's time, is done once per shop calendar, service
 * length and range, and a changed calendar is a different key, on every instance alike.
 */
function offeredStarts(input: AvailabilityInput): readonly Offered[] {
  const { timeZone: zone, hours, closures, rules, service } = input;
  const key = JSON.stringify([
    zone,
    hours,
    closures,
    rules.slotStepMinutes,
    service.durationMinutes,
    input.from,
    input.to,
  ]);
  const hit = offeredCache.get(key);
  if (hit) return hit;

  if (!isKnownTimeZone(zone)) throw new AvailabilityInputError(`unknown time zone ${zone}`);
  const from = localDate(input.from, zone, 'from');
  const to = localDate(input.to, zone, 'to');
  if (to < from) throw new AvailabilityInputError('to must not be before from');
  if (to.diff(from, 'days').days > MAX_RANGE_DAYS)
    throw new AvailabilityInputError(`at most ${MAX_RANGE_DAYS} days at a time`);
  const step = rules.slotStepMinutes;
  const durationMs = service.durationMinutes * 60_000;
  const out: Offered[] = [];
  const seen = new Set<number>();
  for (let date = from; date <= to; date = date.plus({ days: 1 }).startOf('day')) {
    if (isClosed(date, closures)) continue;
    const day = date.toISODate()!;
    const intervals = hours
      .filter((h) => h.weekday === date.weekday)
      .sort((a, b) => a.startMinute - b.startMinute);
    for (const h of intervals) {
      const close = wallClock(date, h.endMinute);
      if (!close) continue;
      const closeMs = close.toMillis();
      const open = wallClock(date, h.startMinute);
      const openIso = open?.toISO({ suppressMilliseconds: true }) ?? null;
      // Linear interval: the clocks do not change between opening and closing (the same offset at
      // both ends, as Luxon reads it from the tz data), so every wall time in it exists once and is
      // `open` plus its minutes, with `open`'s date and offset. Luxon then runs twice per interval
      // instead of twice per start. Otherwise (a day the clocks change): Luxon for every start.
      const linear =
        open !== null &&
        openIso !== null &&
        open.offset === close.offset &&
        /^(?:[+-]\d{2}:\d{2}|Z)$/.test(openIso.slice(19));
      const openMs = open?.toMillis() ?? 0;
      for (let m = h.startMinute; m + service.durationMinutes <= h.endMinute; m += step) {
        let startMs: number;
        let start: DateTime | null = null;
        if (linear) startMs = openMs + (m - h.startMinute) * 60_000;
        else {
          start = wallClock(date, m);
          if (!start) continue; // a wall time the clocks skip
          startMs = start.toMillis();
        }
        if (startMs + durationMs > closeMs) continue; // a day the clocks skip an hour
        if (seen.has(startMs)) continue;
        seen.add(startMs);
        const endMinute = m + service.durationMinutes;
        out.push({
          startMs,
          day,
          start: linear ? wallIso(openIso, m) : start!.toISO({ suppressMilliseconds: true })!,
          end: linear
            ? endMinute === h.endMinute
              ? close.toISO({ suppressMilliseconds: true })!
              : wallIso(openIso, endMinute)
            : DateTime.fromMillis(startMs + durationMs, { zone }).toISO({ suppressMilliseconds: true })!,
        });
      }
    }
  }
  out.sort((a, b) => a.startMs - b.startMs);
  if (offeredCache.size >= OFFERED_CACHE_SIZE) offeredCache.delete(offeredCache.keys().next().value!);
  offeredCache.set(key, out);
  return out;
}

/** Every bookable start between two local dates, in time order. */
export function availability(input: AvailabilityInput): FreeStart[] {
  const offered = offeredStarts(input);
  const { rules, service } = input;
  const earliestMs = input.nowMs + rules.minNoticeMinutes * 60_000;
  const lastDay = DateTime.fromMillis(input.nowMs, { zone: input.timeZone })
    .startOf('day')
    .plus({ days: rules.maxDaysAhead })
    .toISODate()!;
  const keepMs = (service.durationMinutes + service.bufferAfterMinutes) * 60_000;
  // bench time by start, and the longest one: the intervals that can overlap a start are found
  // from a moving index instead of a pass over all of them for every start
  const busy = [...input.busy].sort((a, b) => a.startMs - b.startMs);
  const longest = busy.reduce((m, b) => Math.max(m, b.endMs - b.startMs), 0);
  let lo = 0;
  const out: FreeStart[] = [];
  for (const o of offered) {
    if (o.day > lastDay) break;
    if (o.startMs < earliestMs) continue;
    const endMs = o.startMs + keepMs;
    while (lo < busy.length && busy[lo].startMs <= o.startMs - longest) lo++;
    let hi = lo;
    while (hi < busy.length && busy[hi].startMs < endMs) hi++;
    const benches = freeBenches(busy.slice(lo, hi), input.benches, o.startMs, endMs);
    if (benches.length === 0) continue;
    out.push({ start: o.start, end: o.end, benchesFree: benches.length, benches });
  }
  return out;
}

/**
 * The grid cells (UTC epoch ms, every GRID_MINUTES) an appointment keeps on its bench: from its
 * start to the end of its buffer. One database row per bench and cell, unique, makes a double
 * booking impossible whatever the interleaving.
 */
export function gridCells(startMs: number, keepMinutes: number): number[] {
  const grid = GRID_MINUTES * 60_000;
  if (startMs % grid !== 0) throw new AvailabilityInputError('a start must be on the 5-minute grid');
  const out: number[] = [];
  for (let t = startMs; t < startMs + keepMinutes * 60_000; t += grid) out.push(t);
  return out;
}
