import { BASELINE_LIMITS, type BaselineInput } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import { DEFAULT_UNITS } from '@/lib/units';
import { LIMITS, baselineSchema, emptyFormValues, formValuesToInput, inputToFormValues } from './form';

// An input in the contract's shape (docs/spring-model.md and docs/api/openapi.json), every optional field given.
const full: BaselineInput = {
  rider: { massKg: 82, frontShare: 0.42, seatedRearShare: 0.7 },
  riding: { style: 'enduro', feel: 'firm' },
  conditions: { altitudeM: 1200, pumpAltitudeM: 150, temperatureC: 8 },
  fork: {
    travelMm: 160,
    stanchionMm: 36,
    spring: 'air',
    spacers: 2,
    endStroke: { pressurePsi: 180, maxPressurePsi: 300 },
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
    leverageRatioAtSag: 2.7,
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

  it('carries a garage bike’s measured spring to the request (issue 11), not for a coil', () => {
    const measured = {
      positiveLengthMm: 195,
      negativeVolumeCm3: 30,
      endStrokeVolumeCm3: null,
      frictionN: 22,
      label: 'measured on 2 December 2026 at Lichenrock Spring Bench',
      measuredAt: '2026-12-02T09:00:00.000Z',
      shopName: 'Lichenrock Spring Bench',
      appointmentId: '4f1b1f3e-3b7e-4d0c-9a53-2d1f3c9b7a10',
    };
    const bike: BaselineInput = { ...full, fork: { ...full.fork!, measured } };
    expect(formValuesToInput(inputToFormValues(bike))).toEqual(bike);
    const v = inputToFormValues(bike);
    v.fork.spring = 'coil';
    expect(formValuesToInput(v).fork).not.toHaveProperty('measured');
  });

  it('leaves out blanks and a coil spring’s air settings', () => {
    const v = inputToFormValues(full);
    v.fork.spring = 'coil';
    v.rider.frontShare = Number.NaN;
    v.conditions = { altitudeM: Number.NaN, pumpAltitudeM: Number.NaN, temperatureC: Number.NaN };
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

  it('checks ranges, the end-stroke chamber only when there is one, and wheel travel against stroke', () => {
    const v = inputToFormValues(full);
    v.rider.massKg = -70;
    v.fork.endStroke.pressurePsi = 1001;
    v.fork.endStroke.maxPressurePsi = 5;
    v.shock.wheelTravelMm = 60;
    expect(check(v)).toEqual({
      'rider.massKg': 'At least 20 kg',
      'fork.endStroke.pressurePsi': 'At most 1000 psi',
      'fork.endStroke.maxPressurePsi': 'At least 10 psi',
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

describe('the second-pass inputs', () => {
  const check = (values: ReturnType<typeof emptyFormValues>) => {
    const r = baselineSchema(values, DEFAULT_UNITS).safeParse(values);
    return r.success ? {} : Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message]));
  };

  it('leaves the end-stroke pressure optional: an empty chamber input asks for a recommended one', () => {
    const v = inputToFormValues(full);
    v.fork.endStroke = { pressurePsi: Number.NaN, maxPressurePsi: Number.NaN };
    expect(check(v)).toEqual({});
    // contract (shared-types EndStrokeInput): without a pressure the model recommends one
    expect(formValuesToInput(v).fork?.endStroke).toEqual({});
    v.fork.endStroke.maxPressurePsi = 250;
    expect(formValuesToInput(v).fork?.endStroke).toEqual({ maxPressurePsi: 250 });
  });

  it('sends where you pump apart from where you ride, and leaves the pump altitude out when blank', () => {
    const v = inputToFormValues(full);
    expect(formValuesToInput(v).conditions).toEqual({ altitudeM: 1200, pumpAltitudeM: 150, temperatureC: 8 });
    v.conditions.pumpAltitudeM = Number.NaN;
    expect(formValuesToInput(v).conditions).toEqual({ altitudeM: 1200, temperatureC: 8 });
    v.conditions.pumpAltitudeM = 6000;
    expect(check(v)).toEqual({ 'conditions.pumpAltitudeM': 'At most 5000 m' });
  });

  it('bounds the seated rear share (in percent) and the leverage ratio at sag; a hardtail sends neither', () => {
    const v = inputToFormValues(full);
    v.rider.seatedRearShare = 0.95;
    v.shock.leverageRatioAtSag = 5;
    expect(check(v)).toEqual({
      'rider.seatedRearShare': 'At most 90 %',
      'shock.leverageRatioAtSag': 'At most 4.5',
    });
    v.shock.present = false;
    expect(check(v)).toEqual({});
    const input = formValuesToInput(v);
    expect(input.rider).toEqual({ massKg: 82, frontShare: 0.42 });
    expect(input.shock).toBeNull();
  });

  it('takes its ranges from shared-types BASELINE_LIMITS, the one source the server uses too', () => {
    expect(LIMITS.massKg).toMatchObject({ min: BASELINE_LIMITS.massKg.min, max: BASELINE_LIMITS.massKg.max });
    expect(LIMITS.strokeMm).toMatchObject({
      min: BASELINE_LIMITS.shockStrokeMm.min,
      max: BASELINE_LIMITS.shockStrokeMm.max,
    });
    expect(LIMITS.endStrokePsi).toMatchObject({
      min: BASELINE_LIMITS.endStrokePsi.min,
      max: BASELINE_LIMITS.endStrokePsi.max,
    });
    // fractions shown as percent
    expect(LIMITS.frontSharePct).toEqual({ min: 30, max: 60, unit: '%' });
    const v = inputToFormValues(full);
    v.rider.massKg = BASELINE_LIMITS.massKg.max + 1;
    expect(check(v)).toEqual({ 'rider.massKg': `At most ${BASELINE_LIMITS.massKg.max} kg` });
  });
});
