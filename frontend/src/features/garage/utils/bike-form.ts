import {
  BASELINE_LIMITS,
  type Bike,
  type BikeRequest,
  type ForkInput,
  type ShockInput,
} from '@loamline/shared-types';
import { z } from '@/lib/zod';
import { barToPsi, formatNumber, parseDecimal, psiToBar, type PressureUnit } from '@/lib/units';

export type PartSpring = 'none' | 'air' | 'coil';

/** What the bike dialog edits: numbers as typed (a decimal comma is fine), pressures in the rider's unit. */
export interface BikeFormValues {
  name: string;
  fork: {
    spring: PartSpring;
    travelMm: string;
    stanchionMm: string;
    spacers: string;
    endStroke: boolean;
    /** blank: the baseline recommends one */
    endStrokePressure: string;
    /** the end-stroke chamber's own maximum; blank: the labelled default */
    endStrokeMaxPressure: string;
    maxPressure: string;
  };
  shock: {
    spring: PartSpring;
    strokeMm: string;
    wheelTravelMm: string;
    spacers: string;
    maxPressure: string;
  };
}

/**
 * The same bounds as the wizard's Bike step and the server (shared-types `BASELINE_LIMITS`, the one
 * source), so a bike the garage keeps is one the wizard takes as it is. The server has the last word.
 */
export const LIMITS = {
  forkTravelMm: BASELINE_LIMITS.forkTravelMm,
  stanchionMm: BASELINE_LIMITS.stanchionMm,
  strokeMm: BASELINE_LIMITS.shockStrokeMm,
  wheelTravelMm: BASELINE_LIMITS.wheelTravelMm,
  spacers: BASELINE_LIMITS.spacers,
  endStrokePsi: BASELINE_LIMITS.endStrokePsi,
  maxPressurePsi: BASELINE_LIMITS.maxPressurePsi,
};

const toPsi = (value: number, unit: PressureUnit) => (unit === 'bar' ? barToPsi(value) : value);
const fromPsi = (psi: number, unit: PressureUnit) => (unit === 'bar' ? psiToBar(psi) : psi);
const pressureText = (psi: number | undefined, unit: PressureUnit) =>
  psi === undefined ? '' : formatNumber(fromPsi(psi, unit), unit === 'bar' ? 1 : 0).replace(/,/g, '');

type Issue = { path: (string | number)[]; message: string };

function checkNumber(
  issues: Issue[],
  path: string[],
  text: string,
  { min, max }: { min: number; max: number },
  what: string,
  unit: string,
  opts: { integer?: boolean; optional?: boolean; toApi?: (v: number) => number } = {},
) {
  if (text.trim() === '') {
    if (!opts.optional) issues.push({ path, message: `Enter the ${what}.` });
    return;
  }
  const value = parseDecimal(text);
  if (Number.isNaN(value)) {
    issues.push({ path, message: `Enter the ${what} as a number.` });
    return;
  }
  if (opts.integer && !Number.isInteger(value)) {
    issues.push({ path, message: `Enter a whole number of ${what}.` });
    return;
  }
  const v = opts.toApi ? opts.toApi(value) : value;
  if (v < min || v > max) {
    const show = (n: number) => (opts.toApi ? pressureText(n, unit as PressureUnit) : String(n));
    issues.push({ path, message: `Between ${show(min)} and ${show(max)} ${unit}.` });
  }
}

/** The dialog's schema; pressure limits are checked in psi whatever the rider types in. */
export function bikeFormSchema(unit: PressureUnit) {
  const toApi = (v: number) => toPsi(v, unit);
  const part = z.enum(['none', 'air', 'coil']);
  return z
    .object({
      name: z
        .string()
        .check(
          z.trim(),
          z.minLength(1, 'Give the bike a name.'),
          z.maxLength(100, 'Keep it under 100 characters.'),
        ),
      fork: z.object({
        spring: part,
        travelMm: z.string(),
        stanchionMm: z.string(),
        spacers: z.string(),
        endStroke: z.boolean(),
        endStrokePressure: z.string(),
        endStrokeMaxPressure: z.string(),
        maxPressure: z.string(),
      }),
      shock: z.object({
        spring: part,
        strokeMm: z.string(),
        wheelTravelMm: z.string(),
        spacers: z.string(),
        maxPressure: z.string(),
      }),
    })
    .check(
      z.superRefine(({ fork, shock }, ctx) => {
        const issues: Issue[] = [];
        if (fork.spring === 'none' && shock.spring === 'none') {
          issues.push({
            path: ['fork', 'spring'],
            message: 'A bike needs a fork or a shock for a baseline.',
          });
        }
        if (fork.spring !== 'none') {
          checkNumber(issues, ['fork', 'travelMm'], fork.travelMm, LIMITS.forkTravelMm, 'travel', 'mm');
          checkNumber(
            issues,
            ['fork', 'stanchionMm'],
            fork.stanchionMm,
            LIMITS.stanchionMm,
            'stanchion size',
            'mm',
          );
        }
        if (fork.spring === 'air') {
          checkNumber(issues, ['fork', 'spacers'], fork.spacers, LIMITS.spacers, 'spacers', 'spacers', {
            integer: true,
          });
          if (fork.endStroke) {
            checkNumber(
              issues,
              ['fork', 'endStrokePressure'],
              fork.endStrokePressure,
              LIMITS.endStrokePsi,
              'end-stroke pressure',
              unit,
              { toApi, optional: true },
            );
            checkNumber(
              issues,
              ['fork', 'endStrokeMaxPressure'],
              fork.endStrokeMaxPressure,
              LIMITS.maxPressurePsi,
              'pressure',
              unit,
              { toApi, optional: true },
            );
            // never a pressure above the chamber's own maximum
            const es = parseDecimal(fork.endStrokePressure);
            const esMax = parseDecimal(fork.endStrokeMaxPressure);
            if (Number.isFinite(es) && Number.isFinite(esMax) && es > esMax) {
              issues.push({
                path: ['fork', 'endStrokePressure'],
                message: 'Above the end-stroke maximum you entered.',
              });
            }
          }
          checkNumber(
            issues,
            ['fork', 'maxPressure'],
            fork.maxPressure,
            LIMITS.maxPressurePsi,
            'pressure',
            unit,
            {
              optional: true,
              toApi,
            },
          );
        }
        if (shock.spring !== 'none') {
          checkNumber(issues, ['shock', 'strokeMm'], shock.strokeMm, LIMITS.strokeMm, 'stroke', 'mm');
          checkNumber(
            issues,
            ['shock', 'wheelTravelMm'],
            shock.wheelTravelMm,
            LIMITS.wheelTravelMm,
            'wheel travel',
            'mm',
          );
          // The wheel moves further than the shock on every rear suspension (leverage ratio above 1).
          const stroke = parseDecimal(shock.strokeMm);
          const wheel = parseDecimal(shock.wheelTravelMm);
          if (stroke > 0 && wheel > 0 && wheel <= stroke) {
            issues.push({
              path: ['shock', 'wheelTravelMm'],
              message: 'Should be more than the shock stroke.',
            });
          }
        }
        if (shock.spring === 'air') {
          checkNumber(issues, ['shock', 'spacers'], shock.spacers, LIMITS.spacers, 'spacers', 'spacers', {
            integer: true,
          });
          checkNumber(
            issues,
            ['shock', 'maxPressure'],
            shock.maxPressure,
            LIMITS.maxPressurePsi,
            'pressure',
            unit,
            {
              optional: true,
              toApi,
            },
          );
        }
        for (const issue of issues) ctx.addIssue({ code: 'custom', ...issue });
      }),
    );
}

export const emptyBikeForm: BikeFormValues = {
  name: '',
  fork: {
    spring: 'air',
    travelMm: '',
    stanchionMm: '',
    spacers: '0',
    endStroke: false,
    endStrokePressure: '',
    endStrokeMaxPressure: '',
    maxPressure: '',
  },
  shock: { spring: 'air', strokeMm: '', wheelTravelMm: '', spacers: '0', maxPressure: '' },
};

/** A stored bike as the dialog shows it. */
export function bikeToForm(bike: Bike, unit: PressureUnit): BikeFormValues {
  const { fork, shock } = bike;
  return {
    name: bike.name,
    fork: fork
      ? {
          spring: fork.spring,
          travelMm: String(fork.travelMm),
          stanchionMm: String(fork.stanchionMm),
          spacers: String(fork.spacers),
          endStroke: !!fork.endStroke,
          endStrokePressure: pressureText(fork.endStroke?.pressurePsi, unit),
          endStrokeMaxPressure: pressureText(fork.endStroke?.maxPressurePsi, unit),
          maxPressure: pressureText(fork.maxPressurePsi, unit),
        }
      : { ...emptyBikeForm.fork, spring: 'none' },
    shock: shock
      ? {
          spring: shock.spring,
          strokeMm: String(shock.strokeMm),
          wheelTravelMm: String(shock.wheelTravelMm),
          spacers: String(shock.spacers),
          maxPressure: pressureText(shock.maxPressurePsi, unit),
        }
      : { ...emptyBikeForm.shock, spring: 'none' },
  };
}

const optionalPsi = (text: string, unit: PressureUnit) =>
  text.trim() === '' ? undefined : toPsi(parseDecimal(text), unit);

/**
 * The API body from valid dialog values. What the dialog does not show (a target sag, real
 * geometry) is kept from the stored bike.
 */
export function formToBike(values: BikeFormValues, unit: PressureUnit, stored?: Bike): BikeRequest {
  const { fork: f, shock: s } = values;
  let fork: ForkInput | null = null;
  if (f.spring !== 'none') {
    const air = f.spring === 'air';
    fork = {
      ...(stored?.fork ?? {}),
      travelMm: parseDecimal(f.travelMm),
      stanchionMm: parseDecimal(f.stanchionMm),
      spring: f.spring,
      spacers: air ? parseDecimal(f.spacers) : 0,
      endStroke:
        air && f.endStroke
          ? (dropUndefined({
              pressurePsi: optionalPsi(f.endStrokePressure, unit),
              maxPressurePsi: optionalPsi(f.endStrokeMaxPressure, unit),
            }) ?? undefined)
          : undefined,
      maxPressurePsi: air ? optionalPsi(f.maxPressure, unit) : undefined,
    };
  }
  let shock: ShockInput | null = null;
  if (s.spring !== 'none') {
    const air = s.spring === 'air';
    shock = {
      ...(stored?.shock ?? {}),
      strokeMm: parseDecimal(s.strokeMm),
      wheelTravelMm: parseDecimal(s.wheelTravelMm),
      spring: s.spring,
      spacers: air ? parseDecimal(s.spacers) : 0,
      maxPressurePsi: air ? optionalPsi(s.maxPressure, unit) : undefined,
    };
  }
  return { name: values.name.trim(), fork: dropUndefined(fork), shock: dropUndefined(shock) };
}

function dropUndefined<T extends object>(part: T | null): T | null {
  if (!part) return null;
  return Object.fromEntries(Object.entries(part).filter(([, v]) => v !== undefined)) as T;
}
