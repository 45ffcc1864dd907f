import type { OpeningInterval, ShopClosure } from '@loamline/shared-types';
import { localDate, localMinutes, toMinutes, weekday } from './time';

/** What the schedule needs of an appointment: times as ISO with the shop zone's offset, its bench. */
export interface ScheduleItem {
  id: string;
  start: string;
  end: string;
  bench: number;
}

export interface ScheduleBlock<T extends ScheduleItem> {
  item: T;
  /** minutes since the local midnight of the day shown */
  startMin: number;
  endMin: number;
  /** side by side when two blocks of one lane overlap (should not happen; shown, not hidden) */
  column: number;
  columns: number;
}

export interface ScheduleLane<T extends ScheduleItem> {
  bench: number;
  blocks: ScheduleBlock<T>[];
}

export interface ScheduleDay<T extends ScheduleItem> {
  date: string;
  /** the closure that covers this day, if any */
  closure: ShopClosure | null;
  /** opening intervals of the weekday, in minutes since midnight, sorted */
  open: { startMin: number; endMin: number }[];
  lanes: ScheduleLane<T>[];
}

export interface ScheduleLayout<T extends ScheduleItem> {
  /** the hours every day column shows: whole hours around opening times and appointments */
  startMin: number;
  endMin: number;
  days: ScheduleDay<T>[];
}

const DEFAULT_WINDOW = { startMin: 8 * 60, endMin: 18 * 60 };

/** Side-by-side columns for the blocks of one lane: each overlapping group shares its width. */
function assignColumns<T extends ScheduleItem>(blocks: Omit<ScheduleBlock<T>, 'column' | 'columns'>[]) {
  const sorted = [...blocks].sort((a, b) => a.startMin - b.startMin || a.endMin - b.endMin);
  const out: ScheduleBlock<T>[] = [];
  let group: ScheduleBlock<T>[] = [];
  let groupEnd = -1;
  const close = () => {
    const columns = Math.max(1, ...group.map((b) => b.column + 1));
    for (const b of group) b.columns = columns;
    out.push(...group);
    group = [];
  };
  for (const b of sorted) {
    if (group.length && b.startMin >= groupEnd) close();
    const used = new Set(group.filter((g) => g.endMin > b.startMin).map((g) => g.column));
    let column = 0;
    while (used.has(column)) column += 1;
    group.push({ ...b, column, columns: 1 });
    groupEnd = Math.max(groupEnd, b.endMin);
  }
  if (group.length) close();
  return out;
}

/**
 * Lays appointments out for the schedule: one column per day, one lane per bench, blocks placed by
 * their wall-clock minutes in the shop's zone. Appointments on a bench the shop no longer has get a
 * lane of their own, so nothing booked disappears from view.
 */
export function layoutSchedule<T extends ScheduleItem>(
  items: readonly T[],
  opts: {
    days: readonly string[];
    benches: number;
    hours: readonly OpeningInterval[];
    closures: readonly ShopClosure[];
  },
): ScheduleLayout<T> {
  const benches = new Set<number>([...Array(Math.max(0, opts.benches)).keys()].map((i) => i + 1));
  for (const it of items) if (opts.days.includes(localDate(it.start))) benches.add(it.bench);
  const laneOrder = [...benches].sort((a, b) => a - b);

  let startMin = Infinity;
  let endMin = -Infinity;
  const days = opts.days.map((date): ScheduleDay<T> => {
    const open = opts.hours
      .filter((h) => h.weekday === weekday(date))
      .map((h) => ({ startMin: toMinutes(h.start), endMin: toMinutes(h.end) }))
      .sort((a, b) => a.startMin - b.startMin);
    const closure = opts.closures.find((c) => c.from <= date && date <= c.to) ?? null;
    if (!closure)
      for (const o of open) {
        startMin = Math.min(startMin, o.startMin);
        endMin = Math.max(endMin, o.endMin);
      }
    const lanes = laneOrder.map((bench): ScheduleLane<T> => {
      const raw = items
        .filter((it) => it.bench === bench && localDate(it.start) === date)
        .map((item) => {
          const s = localMinutes(item.start);
          const e = localDate(item.end) === date ? localMinutes(item.end) : 24 * 60;
          return { item, startMin: s, endMin: Math.max(e, s + 5) };
        });
      for (const b of raw) {
        startMin = Math.min(startMin, b.startMin);
        endMin = Math.max(endMin, b.endMin);
      }
      return { bench, blocks: assignColumns(raw) };
    });
    return { date, closure, open, lanes };
  });
  if (!Number.isFinite(startMin)) ({ startMin, endMin } = DEFAULT_WINDOW);
  return {
    startMin: Math.floor(startMin / 60) * 60,
    endMin: Math.min(24 * 60, Math.ceil(endMin / 60) * 60),
    days,
  };
}
