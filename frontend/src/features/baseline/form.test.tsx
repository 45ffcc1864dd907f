import type { BaselineInput } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import { DEFAULT_UNITS } from '@/lib/units';
import { baselineSchema, emptyFormValues, formValuesToInput, inputToFormValues } from './form';

// An input in the contract's shape (SPRING-MODEL.md, "The compute API"), every optional field given.
const full: BaselineInput = {
  rider: { massKg: 82, frontShare: 0.42 },
  riding: { style: 'enduro', feel: 'firm' },
  conditions: { altitudeM: 1200, temperatureC: 8 },
  fork: {
    travelMm: 160,
    stanchionMm: 36,
    spring: 'air',
    spacers: 2,
    endStroke: { pressurePsi: 180 },
    maxPressurePsi: 120,
    targetSagPct: 28,
    geometry: { pistonDiameterMm: 32, positiveLengthMm: 230, polytropicIndex: 1.3 },
  },
  shock: {
    strokeMm: 65,
    wheelTravelMm: 165,
    spring: 'air',
    spacers: 1,
    maxPressurePsi: 350,
    targetSagPct: 30,
    geometry: { negativeVolumeCm3: 40 },
  },
};

describe('form values ↔ BaselineInput', () => {
  it('gives back the same input it was set from (a baseline sheet or a garage bike)', () => {
    expect(formValuesToInput(inputToFormValues(full))).toEqual(full);
    const minimal: BaselineInput = {
      rider: { massKg: 64 },
      riding: { style: 'cross-country', feel: 'supple' },
      fork: { travelMm: 100, stanchionMm: 32, spring: 'air', spacers: 0 },
      shock: null,
    };
    expect(formValuesToInput(inputToFormValues(minimal))).toEqual(minimal);
  });

  it('leaves out blanks and a coil spring’s air settings', () => {
    const v = inputToFormValues(full);
    v.fork.spring = 'coil';
    v.rider.frontShare = Number.NaN;
    v.conditions = { altitudeM: Number.NaN, temperatureC: Number.NaN };
    v.shock.present = false;
    expect(formValuesToInput(v)).toEqual({
      rider: { massKg: 82 },
      riding: { style: 'enduro', feel: 'firm' },
      fork: { travelMm: 160, stanchionMm: 36, spring: 'coil', spacers: 0, targetSagPct: 28 },
      shock: null,
    });
  });
});

describe('the schema', () => {
  const check = (values: ReturnType<typeof emptyFormValues>) => {
    const r = baselineSchema(values, DEFAULT_UNITS).safeParse(values);
    return r.success ? {} : Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message]));
  };

  it('accepts a full input and names every missing field of an empty one', () => {
    expect(check(inputToFormValues(full))).toEqual({});
    expect(check(emptyFormValues())).toEqual({
      'rider.massKg': 'Enter your weight with riding gear',
      'riding.style': 'Pick how you ride',
      'fork.travelMm': 'Enter the fork travel',
      'fork.stanchionMm': 'Pick the stanchion size',
      'shock.strokeMm': 'Enter the shock stroke',
      'shock.wheelTravelMm': 'Enter the rear wheel travel',
    });
  });

  it('checks ranges, the end-stroke pressure only when there is one, and wheel travel against stroke', () => {
    const v = inputToFormValues(full);
    v.rider.massKg = -70;
    v.fork.endStroke.pressurePsi = Number.NaN;
    v.shock.wheelTravelMm = 60;
    expect(check(v)).toEqual({
      'rider.massKg': 'At least 20 kg',
      'fork.endStroke.pressurePsi': 'Enter the end-stroke pressure',
      'shock.wheelTravelMm': 'Wheel travel is more than the shock stroke',
    });
    v.fork.hasEndStroke = false;
    v.shock.present = false;
    v.rider.massKg = 82;
    expect(check(v)).toEqual({});
    v.fork.present = false;
    expect(check(v)).toEqual({ 'fork.present': 'A baseline needs a fork, a rear shock or both.' });
  });
});
