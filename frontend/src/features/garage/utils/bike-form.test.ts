import type { Bike } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import {
  LIMITS,
  bikeFormSchema,
  bikeToForm,
  emptyBikeForm,
  formToBike,
  type BikeFormValues,
} from './bike-form';

// 1 psi = 6894.757293168361 Pa and 1 bar = 100 000 Pa (NIST SP 811, App. B.8), so
// 1 bar = 100000 / 6894.757293168361 psi = 14.503773773022 psi.
const PSI_PER_BAR = 14.503773773022;

const stored: Bike = {
  id: 'b-1',
  name: 'Long-travel enduro',
  fork: {
    travelMm: 160,
    stanchionMm: 36,
    spring: 'air',
    spacers: 1,
    endStroke: { pressurePsi: 180, maxPressurePsi: 300 },
    maxPressurePsi: 120,
    targetSagPct: 28,
    geometry: { pistonDiameterMm: 35 },
  },
  shock: { strokeMm: 65, wheelTravelMm: 165, spring: 'air', spacers: 0, maxPressurePsi: 350 },
  createdAt: '2026-03-01T10:00:00.000Z',
  updatedAt: '2026-03-01T10:00:00.000Z',
};

const errorsOf = (values: BikeFormValues, unit: 'psi' | 'bar' = 'psi') => {
  const r = bikeFormSchema(unit).safeParse(values);
  return r.success ? {} : Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message]));
};

describe('bike form', () => {
  it('round-trips a stored bike in psi, keeping what the dialog does not show', () => {
    const values = bikeToForm(stored, 'psi');
    expect(values.fork).toMatchObject({
      travelMm: '160',
      endStroke: true,
      endStrokePressure: '180',
      maxPressure: '120',
    });
    expect(errorsOf(values)).toEqual({});
    const body = formToBike(values, 'psi', stored);
    expect(body.fork).toEqual(stored.fork); // target sag and real geometry survive the edit
    expect(body.shock).toEqual(stored.shock);
  });

  it('reads pressures typed in bar as psi (NIST SP 811 factors), a decimal comma included', () => {
    const values = bikeToForm(stored, 'bar');
    expect(values.fork.maxPressure).toBe('8.3'); // 120 psi = 8.27 bar, shown to 0.1 bar
    values.fork.maxPressure = '8,5';
    values.fork.endStrokePressure = '12.4';
    const body = formToBike(values, 'bar', stored);
    expect(body.fork?.maxPressurePsi).toBeCloseTo(8.5 * PSI_PER_BAR, 9);
    expect(body.fork?.endStroke?.pressurePsi).toBeCloseTo(12.4 * PSI_PER_BAR, 9);
  });

  it('turning the end-stroke chamber off, or a coil spring, drops the air-only settings', () => {
    const values = bikeToForm(stored, 'psi');
    values.fork.endStroke = false;
    values.shock.spring = 'coil';
    const body = formToBike(values, 'psi', stored);
    expect(body.fork).not.toHaveProperty('endStroke');
    expect(body.shock).toEqual({ strokeMm: 65, wheelTravelMm: 165, spring: 'coil', spacers: 0 });
  });

  it('"none" stores no part (a hardtail)', () => {
    const values: BikeFormValues = {
      ...emptyBikeForm,
      name: 'Hardtail',
      fork: { ...emptyBikeForm.fork, travelMm: '120', stanchionMm: '34' },
      shock: { ...emptyBikeForm.shock, spring: 'none' },
    };
    expect(errorsOf(values)).toEqual({});
    expect(formToBike(values, 'psi')).toEqual({
      name: 'Hardtail',
      fork: { travelMm: 120, stanchionMm: 34, spring: 'air', spacers: 0 },
      shock: null,
    });
  });

  it('names each bad input: blanks, junk, half spacers, a wheel travel below the stroke', () => {
    const values: BikeFormValues = {
      name: ' ',
      fork: { ...emptyBikeForm.fork, travelMm: '', stanchionMm: 'abc', spacers: '1.5' },
      shock: { ...emptyBikeForm.shock, strokeMm: '65', wheelTravelMm: '60' },
    };
    expect(errorsOf(values)).toEqual({
      name: 'Give the bike a name.',
      'fork.travelMm': 'Enter the travel.',
      'fork.stanchionMm': 'Enter the stanchion size as a number.',
      'fork.spacers': 'Enter a whole number of spacers.',
      'shock.wheelTravelMm': 'Should be more than the shock stroke.',
    });
  });

  it('checks the rated maximum in psi whatever the unit', () => {
    const values = bikeToForm(stored, 'bar');
    const maxBar = LIMITS.maxPressurePsi.max / PSI_PER_BAR;
    values.shock.maxPressure = (maxBar + 0.1).toFixed(2); // just above the bound in psi
    expect(Object.keys(errorsOf(values, 'bar'))).toEqual(['shock.maxPressure']);
    values.shock.maxPressure = (maxBar - 0.1).toFixed(2); // just below it
    expect(errorsOf(values, 'bar')).toEqual({});
  });

  it('keeps the end-stroke pressure optional (recommended when empty) and its own maximum', () => {
    const values = bikeToForm(stored, 'psi');
    expect(values.fork.endStrokeMaxPressure).toBe('300');
    values.fork.endStrokePressure = '';
    expect(errorsOf(values)).toEqual({});
    // contract (shared-types EndStrokeInput): a chamber without a pressure gets a recommended one
    expect(formToBike(values, 'psi', stored).fork?.endStroke).toEqual({ maxPressurePsi: 300 });
    values.fork.endStrokeMaxPressure = '';
    expect(formToBike(values, 'psi', stored).fork?.endStroke).toEqual({});
    values.fork.endStrokePressure = '320';
    values.fork.endStrokeMaxPressure = '300';
    expect(errorsOf(values)).toEqual({
      'fork.endStrokePressure': 'Above the end-stroke maximum you entered.',
    });
  });

  it('a bike needs a fork or a shock', () => {
    const values = bikeToForm({ ...stored, fork: null, shock: null }, 'psi');
    expect(errorsOf(values)).toEqual({ 'fork.spring': 'A bike needs a fork or a shock for a baseline.' });
  });
});
