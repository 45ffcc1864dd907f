import type { ShopSettings } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import { formPathOfField, formToSettings, settingsFormSchema, settingsToForm } from './settings-form';

const stored: ShopSettings = {
  timeZone: 'America/Denver',
  currency: 'USD',
  benches: 2,
  hours: [
    { weekday: 2, start: '13:30', end: '18:00' },
    { weekday: 2, start: '09:00', end: '12:30' },
    { weekday: 6, start: '08:00', end: '24:00' },
  ],
  closures: [
    { from: '2027-07-05', to: '2027-07-09', reason: 'Summer break' },
    { from: '2027-05-31', to: '2027-05-31', reason: 'Holiday' },
  ],
  rules: {
    slotStepMinutes: 30,
    minNoticeMinutes: 720,
    maxDaysAhead: 60,
    holdMinutes: 15,
    cancellationWindowHours: 48,
  },
};

describe('settings form ⇄ body', () => {
  it('holds the week as seven days with sorted intervals, one-day closures without an end', () => {
    const form = settingsToForm(stored);
    expect(form.days.map((d) => d.intervals.length)).toEqual([0, 2, 0, 0, 0, 1, 0]);
    expect(form.days[1].intervals).toEqual([
      { start: '09:00', end: '12:30' },
      { start: '13:30', end: '18:00' },
    ]);
    expect(form.closures).toEqual([
      { from: '2027-05-31', to: '', reason: 'Holiday' },
      { from: '2027-07-05', to: '2027-07-09', reason: 'Summer break' },
    ]);
    expect(form.benches).toBe('2');
    expect(settingsFormSchema.safeParse(form).success).toBe(true);
  });

  it('comes back as the same settings (order of the week), with the form path of every interval', () => {
    const { body, hourPaths } = formToSettings(settingsToForm(stored));
    expect(body).toEqual({
      ...stored,
      hours: [
        { weekday: 2, start: '09:00', end: '12:30' },
        { weekday: 2, start: '13:30', end: '18:00' },
        { weekday: 6, start: '08:00', end: '24:00' },
      ],
      closures: [stored.closures[1], stored.closures[0]],
    });
    expect(hourPaths).toEqual(['days.1.intervals.0', 'days.1.intervals.1', 'days.5.intervals.0']);
  });

  it('puts server field names on the right input', () => {
    const paths = ['days.1.intervals.0', 'days.1.intervals.1', 'days.5.intervals.0'];
    expect(formPathOfField('hours.2', paths, 'must close after it opens')).toBe('days.5.intervals.0.end');
    expect(formPathOfField('hours.2', paths, 'opening times must be on the 5-minute grid')).toBe(
      'days.5.intervals.0.start',
    );
    expect(formPathOfField('hours.0.end', paths)).toBe('days.1.intervals.0.end');
    expect(formPathOfField('hours.1.start', paths)).toBe('days.1.intervals.1.start');
    expect(formPathOfField('hours.9', paths)).toBeNull();
    expect(formPathOfField('closures.0.to', paths)).toBe('closures.0.to');
    expect(formPathOfField('closures.1', paths)).toBe('closures.1.from');
    expect(formPathOfField('timeZone', paths)).toBe('timeZone');
    expect(formPathOfField('rules.slotStepMinutes', paths)).toBe('rules.slotStepMinutes');
    expect(formPathOfField('rules', paths)).toBeNull();
  });

  it('refuses an interval that closes before it opens, overlaps, a backwards closure and odd numbers', () => {
    const form = settingsToForm(stored);
    form.days[0].intervals = [
      { start: '10:00', end: '09:00' },
      { start: '12:00', end: '14:00' },
      { start: '13:00', end: '15:00' },
    ];
    form.closures[1].to = '2027-07-01';
    form.rules.slotStepMinutes = '7';
    form.benches = '0';
    const r = settingsFormSchema.safeParse(form);
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join('.')).sort();
    expect(paths).toEqual([
      'benches',
      'closures.1.to',
      'days.0.intervals.0.end',
      'days.0.intervals.2.start',
      'rules.slotStepMinutes',
    ]);
  });
});
