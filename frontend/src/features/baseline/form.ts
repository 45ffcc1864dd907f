import {
  BASELINE_LIMITS,
  RIDING_FEELS,
  RIDING_STYLES,
  SPRING_TYPES,
  type AirSpringGeometry,
  type BaselineInput,
  type ForkInput,
  type MeasuredSpring,
  type RidingFeel,
  type RidingStyle,
  type ShockInput,
  type SpringType,
} from '@loamline/shared-types';
import type { Path } from 'react-hook-form';
import { z } from '@/lib/zod';
import {
  decimalsFor,
  formatNumber,
  round,
  toDisplay,
  unitOf,
  type Quantity,
  type UnitPrefs,
} from '@/lib/units';

/*
 * The wizard's form state. Numbers are held in the API's units (kg, psi, mm; front share as a
 * fraction) whatever the rider reads on screen; the inputs convert at the edge (lib/units.ts).
 * A blank number is NaN: "not given", so the server's default applies where the field is optional.
 * Field paths follow the contract (`fork.geometry.pistonDiameterMm`, `rider.frontShare` …), so the
 * server's 400 `fields` and the result's `assumptions` keys name form fields directly.
 */

export type GeometryKey = keyof AirSpringGeometry;
export type GeometryValues = Record<GeometryKey, number>;

export const FORK_GEOMETRY_KEYS: readonly GeometryKey[] = [
  'pistonDiameterMm',
  'shaftDiameterMm',
  'positiveLengthMm',
  'negativeVolumeCm3',
  'spacerVolumeCm3',
  'endStrokeVolumeCm3',
  'polytropicIndex',
];
/** A shock has no end-stroke chamber in the contract. */
export const SHOCK_GEOMETRY_KEYS: readonly GeometryKey[] = FORK_GEOMETRY_KEYS.filter(
  (k) => k !== 'endStrokeVolumeCm3',
);

export interface ForkValues {
  present: boolean;
  travelMm: number;
  stanchionMm: number;
  spring: SpringType;
  spacers: number;
  hasEndStroke: boolean;
  /** blank pressure: the model recommends one; blank maximum: its labelled default */
  endStroke: { pressurePsi: number; maxPressurePsi: number };
  maxPressurePsi: number;
  targetSagPct: number;
  geometry: GeometryValues;
  /**
   * a garage bike's spring as a shop measured it (issue 11): no field of its own, carried from the
   * bike to the request so the baseline starts from it ("measured on … at …")
   */
  measured?: MeasuredSpring | null;
}

export interface ShockValues {
  present: boolean;
  strokeMm: number;
  wheelTravelMm: number;
  spring: SpringType;
  spacers: number;
  maxPressurePsi: number;
  targetSagPct: number;
  /** where the bike's leverage curve is known; blank: wheel travel ÷ stroke */
  leverageRatioAtSag: number;
  geometry: GeometryValues;
  /** see `ForkValues.measured` */
  measured?: MeasuredSpring | null;
}

export interface BaselineFormValues {
  rider: { massKg: number; frontShare: number; seatedRearShare: number };
  riding: { style: RidingStyle | ''; feel: RidingFeel };
  /** `altitudeM` is where you ride; `pumpAltitudeM` where you pump and measure sag (blank: the same) */
  conditions: { altitudeM: number; pumpAltitudeM: number; temperatureC: number };
  fork: ForkValues;
  shock: ShockValues;
}

export type BaselineField = Path<BaselineFormValues>;

/** Stanchion sizes offered as choices (common practice, no source: the sizes sold for trail bikes). */
export const STANCHION_SIZES_MM = [30, 32, 34, 35, 36, 38, 40] as const;

const blankGeometry = (): GeometryValues => ({
  pistonDiameterMm: Number.NaN,
  shaftDiameterMm: Number.NaN,
  positiveLengthMm: Number.NaN,
  negativeVolumeCm3: Number.NaN,
  spacerVolumeCm3: Number.NaN,
  endStrokeVolumeCm3: Number.NaN,
  polytropicIndex: Number.NaN,
});

/** A fresh wizard: nothing about the rider yet, a full-suspension bike with air springs. */
export function emptyFormValues(): BaselineFormValues {
  return {
    rider: { massKg: Number.NaN, frontShare: Number.NaN, seatedRearShare: Number.NaN },
    riding: { style: '', feel: 'balanced' },
    conditions: { altitudeM: Number.NaN, pumpAltitudeM: Number.NaN, temperatureC: Number.NaN },
    fork: {
      present: true,
      travelMm: Number.NaN,
      stanchionMm: Number.NaN,
      spring: 'air',
      spacers: 0,
      hasEndStroke: false,
      endStroke: { pressurePsi: Number.NaN, maxPressurePsi: Number.NaN },
      maxPressurePsi: Number.NaN,
      targetSagPct: Number.NaN,
      geometry: blankGeometry(),
    },
    shock: {
      present: true,
      strokeMm: Number.NaN,
      wheelTravelMm: Number.NaN,
      spring: 'air',
      spacers: 0,
      maxPressurePsi: Number.NaN,
      targetSagPct: Number.NaN,
      leverageRatioAtSag: Number.NaN,
      geometry: blankGeometry(),
    },
  };
}

const given = (v: number | undefined | null): number => (typeof v === 'number' ? v : Number.NaN);

function geometryValues(g: Partial<AirSpringGeometry> | undefined): GeometryValues {
  const out = blankGeometry();
  for (const k of FORK_GEOMETRY_KEYS) out[k] = given(g?.[k]);
  return out;
}

/** Every field of the wizard from a stored input (a baseline sheet, a garage bike). */
export function inputToFormValues(input: BaselineInput): BaselineFormValues {
  const empty = emptyFormValues();
  const { fork, shock } = input;
  return {
    rider: {
      massKg: input.rider.massKg,
      frontShare: given(input.rider.frontShare),
      seatedRearShare: given(input.rider.seatedRearShare),
    },
    riding: { style: input.riding.style, feel: input.riding.feel },
    conditions: {
      altitudeM: given(input.conditions?.altitudeM),
      pumpAltitudeM: given(input.conditions?.pumpAltitudeM),
      temperatureC: given(input.conditions?.temperatureC),
    },
    fork: fork
      ? {
          present: true,
          travelMm: fork.travelMm,
          stanchionMm: fork.stanchionMm,
          spring: fork.spring,
          spacers: fork.spacers,
          hasEndStroke: !!fork.endStroke,
          endStroke: {
            pressurePsi: given(fork.endStroke?.pressurePsi),
            maxPressurePsi: given(fork.endStroke?.maxPressurePsi),
          },
          maxPressurePsi: given(fork.maxPressurePsi),
          targetSagPct: given(fork.targetSagPct),
          geometry: geometryValues(fork.geometry),
          measured: fork.measured ?? null,
        }
      : { ...empty.fork, present: false },
    shock: shock
      ? {
          present: true,
          strokeMm: shock.strokeMm,
          wheelTravelMm: shock.wheelTravelMm,
          spring: shock.spring,
          spacers: shock.spacers,
          maxPressurePsi: given(shock.maxPressurePsi),
          targetSagPct: given(shock.targetSagPct),
          leverageRatioAtSag: given(shock.leverageRatioAtSag),
          geometry: geometryValues(shock.geometry),
          measured: shock.measured ?? null,
        }
      : { ...empty.shock, present: false },
  };
}

const isGiven = (v: number): boolean => Number.isFinite(v);

function geometryInput(
  g: GeometryValues,
  keys: readonly GeometryKey[],
): Partial<AirSpringGeometry> | undefined {
  const out: Partial<AirSpringGeometry> = {};
  for (const k of keys) if (isGiven(g[k])) out[k] = g[k];
  return Object.keys(out).length ? out : undefined;
}

/**
 * The request body for `POST /api/baselines/compute` from (validated) form values: only what the
 * rider gave; blanks are left out so the server's labelled defaults apply. Air-only settings are
 * not sent for a coil spring.
 */
export function formValuesToInput(v: BaselineFormValues): BaselineInput {
  const input: BaselineInput = {
    rider: { massKg: v.rider.massKg },
    riding: { style: v.riding.style as RidingStyle, feel: v.riding.feel },
    fork: null,
    shock: null,
  };
  if (isGiven(v.rider.frontShare)) input.rider.frontShare = v.rider.frontShare;
  if (isGiven(v.rider.seatedRearShare) && v.shock.present)
    input.rider.seatedRearShare = v.rider.seatedRearShare;
  const conditions: NonNullable<BaselineInput['conditions']> = {};
  if (isGiven(v.conditions.altitudeM)) conditions.altitudeM = v.conditions.altitudeM;
  if (isGiven(v.conditions.pumpAltitudeM)) conditions.pumpAltitudeM = v.conditions.pumpAltitudeM;
  if (isGiven(v.conditions.temperatureC)) conditions.temperatureC = v.conditions.temperatureC;
  if (Object.keys(conditions).length) input.conditions = conditions;

  if (v.fork.present) {
    const f = v.fork;
    const air = f.spring === 'air';
    const fork: ForkInput = {
      travelMm: f.travelMm,
      stanchionMm: f.stanchionMm,
      spring: f.spring,
      spacers: air ? f.spacers : 0,
    };
    if (air && f.hasEndStroke) {
      // an empty object still says "there is a chamber": the model recommends its pressure
      const endStroke: NonNullable<ForkInput['endStroke']> = {};
      if (isGiven(f.endStroke.pressurePsi)) endStroke.pressurePsi = f.endStroke.pressurePsi;
      if (isGiven(f.endStroke.maxPressurePsi)) endStroke.maxPressurePsi = f.endStroke.maxPressurePsi;
      fork.endStroke = endStroke;
    }
    if (air && isGiven(f.maxPressurePsi)) fork.maxPressurePsi = f.maxPressurePsi;
    if (isGiven(f.targetSagPct)) fork.targetSagPct = f.targetSagPct;
    const geometry = air ? geometryInput(f.geometry, FORK_GEOMETRY_KEYS) : undefined;
    if (geometry) fork.geometry = geometry;
    if (air && f.measured) fork.measured = f.measured;
    input.fork = fork;
  }
  if (v.shock.present) {
    const s = v.shock;
    const air = s.spring === 'air';
    const shock: ShockInput = {
      strokeMm: s.strokeMm,
      wheelTravelMm: s.wheelTravelMm,
      spring: s.spring,
      spacers: air ? s.spacers : 0,
    };
    if (air && isGiven(s.maxPressurePsi)) shock.maxPressurePsi = s.maxPressurePsi;
    if (isGiven(s.targetSagPct)) shock.targetSagPct = s.targetSagPct;
    if (isGiven(s.leverageRatioAtSag)) shock.leverageRatioAtSag = s.leverageRatioAtSag;
    const geometry = air ? geometryInput(s.geometry, SHOCK_GEOMETRY_KEYS) : undefined;
    if (geometry) shock.geometry = geometry;
    if (air && s.measured) shock.measured = s.measured;
    input.shock = shock;
  }
  return input;
}

/* ------------------------------------------------------------------ the schema */

interface Limit {
  min: number;
  max: number;
  /** shown in the rider's unit when set; otherwise `unit` as written */
  quantity?: Quantity;
  unit?: string;
  integer?: boolean;
  /** the message for a blank field; a field without one may stay blank (the server's default) */
  required?: string;
}

const B = BASELINE_LIMITS;

/**
 * The input ranges come from shared-types (`BASELINE_LIMITS`, the one list the server's DTOs and the
 * model check too), so a typo is caught before a round trip; the server checks again and its 400 is
 * shown where it names a field. Only how a bound reads and what a blank says are added here.
 */
export const LIMITS = {
  massKg: { ...B.massKg, quantity: 'mass', required: 'Enter your weight with riding gear' },
  // held as fractions, bounded (and shown) in percent
  frontSharePct: { min: B.frontShare.min * 100, max: B.frontShare.max * 100, unit: '%' },
  seatedRearSharePct: { min: B.seatedRearShare.min * 100, max: B.seatedRearShare.max * 100, unit: '%' },
  altitudeM: { ...B.altitudeM, quantity: 'altitude' },
  temperatureC: { ...B.temperatureC, quantity: 'temperature' },
  forkTravelMm: { ...B.forkTravelMm, quantity: 'length', required: 'Enter the fork travel' },
  stanchionMm: { ...B.stanchionMm, required: 'Pick the stanchion size' },
  spacers: { ...B.spacers, integer: true, unit: 'spacers', required: 'How many spacers are fitted?' },
  endStrokePsi: { ...B.endStrokePsi, quantity: 'pressure' },
  maxPressurePsi: { ...B.maxPressurePsi, quantity: 'pressure' },
  targetSagPct: B.targetSagPct,
  strokeMm: { ...B.shockStrokeMm, quantity: 'length', required: 'Enter the shock stroke' },
  wheelTravelMm: { ...B.wheelTravelMm, quantity: 'length', required: 'Enter the rear wheel travel' },
  leverageRatioAtSag: B.leverageRatioAtSag,
} satisfies Record<string, Limit>;

const GEOMETRY_LIMITS: Record<GeometryKey, Limit> = {
  pistonDiameterMm: { ...B.pistonDiameterMm, quantity: 'length' },
  shaftDiameterMm: { ...B.shaftDiameterMm, quantity: 'length' },
  positiveLengthMm: { ...B.positiveLengthMm, quantity: 'length' },
  negativeVolumeCm3: { ...B.negativeVolumeCm3, quantity: 'volume' },
  spacerVolumeCm3: { ...B.spacerVolumeCm3, quantity: 'volume' },
  endStrokeVolumeCm3: { ...B.endStrokeVolumeCm3, quantity: 'volume' },
  polytropicIndex: B.polytropicIndex,
};

type NumberSchema = z.ZodMiniType<number, number>;
/** Any number, or NaN for a blank; every rule is added by `limited`. */
const anyNumber: NumberSchema = z.union([z.number(), z.nan()]);

/** A bound as the rider reads it: "44.1 lb", "1.57 in", "20 %". */
function bound(value: number, limit: Limit, prefs: UnitPrefs): string {
  if (limit.quantity) {
    const d = decimalsFor(limit.quantity, prefs);
    return `${String(round(toDisplay(limit.quantity, value, prefs), d))} ${unitOf(limit.quantity, prefs)}`;
  }
  const d = Number.isInteger(value) ? 0 : Number.isInteger(value * 10) ? 1 : 2;
  return `${formatNumber(value, d)}${limit.unit ? ` ${limit.unit}` : ''}`;
}

function limited(limit: Limit, prefs: UnitPrefs, scale = 1): NumberSchema {
  return anyNumber.check(
    z.superRefine((raw, ctx) => {
      if (!Number.isFinite(raw)) {
        if (limit.required) ctx.addIssue({ code: 'custom', message: limit.required });
        return;
      }
      const v = raw * scale;
      if (limit.integer && !Number.isInteger(v)) ctx.addIssue({ code: 'custom', message: 'A whole number' });
      else if (v < limit.min)
        ctx.addIssue({ code: 'custom', message: `At least ${bound(limit.min, limit, prefs)}` });
      else if (v > limit.max)
        ctx.addIssue({ code: 'custom', message: `At most ${bound(limit.max, limit, prefs)}` });
    }),
  );
}

const springSchema = z.enum(SPRING_TYPES);

function geometrySchema(active: boolean, prefs: UnitPrefs): z.ZodMiniType<GeometryValues, GeometryValues> {
  const shape = {} as Record<GeometryKey, NumberSchema>;
  for (const k of FORK_GEOMETRY_KEYS) shape[k] = active ? limited(GEOMETRY_LIMITS[k], prefs) : anyNumber;
  return z.object(shape);
}

/**
 * The wizard's schema for the values it is given: a part that is not there, or a coil spring's
 * air settings, are not checked. Messages name bounds in the rider's units.
 */
export function baselineSchema(
  values: BaselineFormValues,
  prefs: UnitPrefs,
): z.ZodMiniType<BaselineFormValues, BaselineFormValues> {
  const fork = values.fork;
  const forkOn = fork.present;
  const forkAir = forkOn && fork.spring === 'air';
  const shock = values.shock;
  const shockOn = shock.present;
  const shockAir = shockOn && shock.spring === 'air';
  const check = (on: boolean, limit: Limit, scale = 1): NumberSchema =>
    on ? limited(limit, prefs, scale) : anyNumber;

  return z
    .object({
      rider: z.object({
        massKg: limited(LIMITS.massKg, prefs),
        // held as a fraction, bounded in percent
        frontShare: limited(LIMITS.frontSharePct, prefs, 100),
        seatedRearShare: check(shockOn, LIMITS.seatedRearSharePct, 100),
      }),
      riding: z.object({
        style: z
          .union([z.enum(RIDING_STYLES), z.literal('')])
          .check(z.refine((s) => s !== '', { message: 'Pick how you ride' })),
        feel: z.enum(RIDING_FEELS, { error: 'Pick a feel' }),
      }),
      conditions: z.object({
        altitudeM: limited(LIMITS.altitudeM, prefs),
        pumpAltitudeM: limited(LIMITS.altitudeM, prefs),
        temperatureC: limited(LIMITS.temperatureC, prefs),
      }),
      fork: z.object({
        present: z.boolean(),
        travelMm: check(forkOn, LIMITS.forkTravelMm),
        stanchionMm: check(forkOn, LIMITS.stanchionMm),
        spring: springSchema,
        spacers: check(forkAir, LIMITS.spacers),
        hasEndStroke: z.boolean(),
        endStroke: z.object({
          // optional: blank asks the model for a recommended pressure
          pressurePsi: check(forkAir && fork.hasEndStroke, LIMITS.endStrokePsi),
          maxPressurePsi: check(forkAir && fork.hasEndStroke, LIMITS.maxPressurePsi),
        }),
        maxPressurePsi: check(forkAir, LIMITS.maxPressurePsi),
        targetSagPct: check(forkOn, LIMITS.targetSagPct),
        geometry: geometrySchema(forkAir, prefs),
      }),
      shock: z
        .object({
          present: z.boolean(),
          strokeMm: check(shockOn, LIMITS.strokeMm),
          wheelTravelMm: check(shockOn, LIMITS.wheelTravelMm),
          spring: springSchema,
          spacers: check(shockAir, LIMITS.spacers),
          maxPressurePsi: check(shockAir, LIMITS.maxPressurePsi),
          targetSagPct: check(shockOn, LIMITS.targetSagPct),
          leverageRatioAtSag: check(shockOn, LIMITS.leverageRatioAtSag),
          geometry: geometrySchema(shockAir, prefs),
        })
        .check(
          z.superRefine((s, ctx) => {
            // The wheel moves further than the shock on every rear suspension (leverage ratio above 1).
            if (s.present && s.strokeMm > 0 && s.wheelTravelMm > 0 && s.wheelTravelMm <= s.strokeMm) {
              ctx.addIssue({
                code: 'custom',
                path: ['wheelTravelMm'],
                message: 'Wheel travel is more than the shock stroke',
              });
            }
          }),
        ),
    })
    .check(
      z.superRefine((v, ctx) => {
        if (!v.fork.present && !v.shock.present) {
          ctx.addIssue({
            code: 'custom',
            path: ['fork', 'present'],
            message: 'A baseline needs a fork, a rear shock or both.',
          });
        }
      }),
    );
}

/* ------------------------------------------------------------------ steps */

export const STEPS = [
  { id: 'rider', label: 'Rider' },
  { id: 'riding', label: 'Riding' },
  { id: 'bike', label: 'Bike' },
  { id: 'baseline', label: 'Baseline' },
  { id: 'sag-check', label: 'Sag check' },
] as const;
export type StepId = (typeof STEPS)[number]['id'];

/** What each input step checks before Next. */
export const STEP_FIELDS: Record<'rider' | 'riding' | 'bike', BaselineField[]> = {
  rider: ['rider.massKg'],
  riding: ['riding.style', 'riding.feel'],
  bike: ['fork', 'shock', 'rider.frontShare', 'rider.seatedRearShare', 'conditions'],
};

/** The input step where a field (a form path or a server `fields` name) is entered. */
export function stepOfField(name: string): 'rider' | 'riding' | 'bike' {
  if (name === 'rider' || name === 'rider.massKg') return 'rider';
  if (name.startsWith('riding')) return 'riding';
  return 'bike';
}

/** Fields that live in the collapsed advanced panel of the Bike step. */
export function isAdvancedField(name: string): boolean {
  return (
    name === 'rider.frontShare' ||
    name === 'rider.seatedRearShare' ||
    name === 'shock.leverageRatioAtSag' ||
    name.startsWith('conditions') ||
    name.endsWith('targetSagPct') ||
    name.includes('.geometry')
  );
}
