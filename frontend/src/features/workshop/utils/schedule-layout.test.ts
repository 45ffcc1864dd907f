import type { OpeningInterval } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import { layoutSchedule } from './schedule-layout';

const hours: OpeningInterval[] = [
  { weekday: 1, start: '09:00', end: '12:30' },
  { weekday: 1, start: '13:30', end: '17:45' },
  { weekday: 2, start: '10:00', end: '16:00' },
];
const item = (id: string, start: string, end: string, bench: number) => ({ id, start, end, bench });

describe('layoutSchedule', () => {
  it('puts each appointment in its bench lane on its local day, by its own wall clock', () => {
    const items = [
      item('a', '2027-03-29T09:00:00+02:00', '2027-03-29T10:00:00+02:00', 1),
      item('b', '2027-03-29T09:30:00+02:00', '2027-03-29T11:00:00+02:00', 2),
      // the day after the clocks went forward: the string's own offset, wall clock 10:00
      item('c', '2027-03-30T10:00:00+02:00', '2027-03-30T10:45:00+02:00', 1),
    ];
    const layout = layoutSchedule(items, {
      days: ['2027-03-29', '2027-03-30'],
      benches: 2,
      hours,
      closures: [],
    });
    const [mon, tue] = layout.days;
    expect(mon.lanes.map((l) => l.bench)).toEqual([1, 2]);
    expect(mon.lanes[0].blocks).toMatchObject([
      { item: { id: 'a' }, startMin: 540, endMin: 600, column: 0, columns: 1 },
    ]);
    expect(mon.lanes[1].blocks).toMatchObject([{ item: { id: 'b' }, startMin: 570, endMin: 660 }]);
    expect(tue.lanes[0].blocks).toMatchObject([{ item: { id: 'c' }, startMin: 600, endMin: 645 }]);
    expect(tue.lanes[1].blocks).toEqual([]);
    expect(mon.open).toEqual([
      { startMin: 540, endMin: 750 },
      { startMin: 810, endMin: 1065 },
    ]);
  });

  it('shows whole hours around opening times and appointments, 08–18 for an empty week', () => {
    const layout = layoutSchedule([item('x', '2027-03-29T07:15:00+02:00', '2027-03-29T08:00:00+02:00', 1)], {
      days: ['2027-03-29'],
      benches: 1,
      hours,
      closures: [],
    });
    expect([layout.startMin, layout.endMin]).toEqual([7 * 60, 18 * 60]);
    const empty = layoutSchedule([], { days: ['2027-04-03'], benches: 1, hours, closures: [] });
    expect([empty.startMin, empty.endMin]).toEqual([8 * 60, 18 * 60]);
  });

  it('marks closed days and leaves their hours out of the window', () => {
    const layout = layoutSchedule([], {
      days: ['2027-03-29', '2027-03-30'],
      benches: 1,
      hours,
      closures: [{ from: '2027-03-28', to: '2027-03-29', reason: 'Stocktake' }],
    });
    expect(layout.days[0].closure?.reason).toBe('Stocktake');
    expect(layout.days[1].closure).toBeNull();
    expect([layout.startMin, layout.endMin]).toEqual([10 * 60, 16 * 60]);
  });

  it('keeps an appointment on a bench the shop no longer has in a lane of its own', () => {
    const layout = layoutSchedule(
      [item('old', '2027-03-29T09:00:00+02:00', '2027-03-29T10:00:00+02:00', 3)],
      {
        days: ['2027-03-29'],
        benches: 1,
        hours,
        closures: [],
      },
    );
    expect(layout.days[0].lanes.map((l) => l.bench)).toEqual([1, 3]);
    expect(layout.days[0].lanes[1].blocks).toHaveLength(1);
  });

  it('puts overlapping blocks of one lane side by side', () => {
    const layout = layoutSchedule(
      [
        item('p', '2027-03-29T09:00:00+02:00', '2027-03-29T10:00:00+02:00', 1),
        item('q', '2027-03-29T09:30:00+02:00', '2027-03-29T10:30:00+02:00', 1),
        item('r', '2027-03-29T11:00:00+02:00', '2027-03-29T12:00:00+02:00', 1),
      ],
      { days: ['2027-03-29'], benches: 1, hours, closures: [] },
    );
    const blocks = layout.days[0].lanes[0].blocks.map((b) => [b.item.id, b.column, b.columns]);
    expect(blocks).toEqual([
      ['p', 0, 2],
      ['q', 1, 2],
      ['r', 0, 1],
    ]);
  });

  it('ends a block that runs past midnight at the end of its day', () => {
    const layout = layoutSchedule([item('n', '2027-03-29T23:00:00+02:00', '2027-03-30T00:30:00+02:00', 1)], {
      days: ['2027-03-29'],
      benches: 1,
      hours: [],
      closures: [],
    });
    expect(layout.days[0].lanes[0].blocks[0]).toMatchObject({ startMin: 1380, endMin: 1440 });
    expect(layout.endMin).toBe(1440);
  });
});
