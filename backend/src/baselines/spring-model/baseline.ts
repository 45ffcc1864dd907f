import {
  RIDING_FEELS,
  RIDING_STYLES,
  SPRING_TYPES,
  type Assumption,
  type BaselineInput,
  type BaselineResult,
  type BaselineWarning,
  type CurveOverlay,
  type CurvePoint,
  type ForkInput,
  type PartResult,
  type RidingFeel,
  type RidingStyle,
  type SagCheckInput,
  type SagCheckResult,
  type ShockInput,
  type ShockResult,
  type SpringType,
} from '@loamline/shared-types';
import { type AirCharge, type AirSpring, makeAirSpring, springForce } from './air-spring';
import { ambientPressure, gaugeAtTemperature } from './atmosphere';
import { coilRate, STOCKED_STEP_LB_PER_IN } from './coil';
import {
  forkGeometry,
  GEOMETRY_SOURCE,
  type GeometryKey,
  type ResolvedGeometry,
  shockGeometry,
} from './defaults';
import { LIMITS, requireInRange, SpringModelInputError } from './limits';
import { DEFAULT_FRONT_SHARE, leverageRatio, riderLoads, shockLoad } from './rider-load';
import { targetSag } from './sag-targets';
import { solveChargePressure, travelUnderLoad } from './solve';
import { cm3ToM3, G0, mmToM, paToPsi, psiToBar, psiToPa } from './units';

/** A hard landing loads the spring with this multiple of its static load (an estimate). */
export const HARD_LANDING_MULTIPLE = 3.5;
/** The pressure range spans the target sag ± this many points (the load is uncertain). */
export const SAG_RANGE_POINTS = 3;
/** Points on each force–travel curve, from full extension to full travel. */
export const CURVE_POINTS = 51;
/** Below this share of travel used under a hard landing the spring is too progressive for the rider. */
export const FULL_TRAVEL_SHARE = 0.8;
/** A hard landing that gets within this of full travel counts as bottoming out. */
export const BOTTOM_OUT_TOLERANCE_MM = 0.5;
/** Sag outside this band is unusual enough to warn about (SPRING-MODEL.md). */
export const SAG_WARN_BAND = { minPct: 10, maxPct: 40 };
/** Rated maximum when the rider gives none (common practice, no source; the part's own rating comes first). */
export const DEFAULT_MAX_PSI: Record<'fork' | 'shock', number> = { fork: 150, shock: 350 };
/** Below this the seals and negative chamber work poorly (common practice, no source). */
export const DEFAULT_MIN_PSI: Record<'fork' | 'shock', number> = { fork: 30, shock: 50 };
/** An average leverage ratio outside this band is unusual (common practice, no source). */
export const LEVERAGE_RATIO_BAND = { min: 1.8, max: 3.6 };
export const DEFAULT_ALTITUDE_M = 0;
export const DEFAULT_TEMPERATURE_C = 20;
/** Where riders usually pump (indoors), for the temperature note. */
export const INDOOR_TEMPERATURE_C = 20;
/** End-stroke overlays: the set pressure times these factors, rounded to 5 psi. */
export const END_STROKE_OVERLAY_FACTORS = [0.8, 1.2, 1.4];

/** The six cautions of PRODUCT.md, in Loamline's words; shown with every baseline. */
export const CAUTIONS: readonly string[] = [
  'This is a starting point, not a finished setup: measure your sag, then ride somewhere safe and easy before you ride hard.',
  'Never go above the maximum pressure printed on your fork or shock or given in its manual. If the baseline is above that maximum or below the minimum, this spring does not suit you: ask a suspension technician.',
  'Use a shock pump with a gauge. Never open or take apart a chamber that still holds air, and remember that an end-stroke chamber can hold far more pressure than the main chamber.',
  'Air pressure drops in the cold and rises in the heat: check and set it at the temperature you ride in.',
  'If you notice a leak, a knock as the suspension tops out, or harsh bottoming, stop riding and have it inspected.',
  "Your fork or shock maker's manual and a qualified technician come first, and workshop work must follow local rules.",
];

type Part = 'fork' | 'shock';

interface Context {
  pAmb: number;
  temperatureC: number;
  style: RidingStyle;
  feel: RidingFeel;
  frontN: number;
  rearN: number;
  assumptions: Assumption[];
}

/** One part, checked and with every default filled in. */
interface ResolvedPart {
  part: Part;
  spring: SpringType;
  /** travel of the spring itself (a shock: its stroke), mm */
  travelMm: number;
  loadN: number;
  targetPct: number;
  spacers: number;
  endStrokePsi: number | null;
  maxPsi: number;
  minPsi: number;
  geometry: ResolvedGeometry | null;
  air: AirSpring | null;
  leverageRatio: number | null;
  wheelTravelMm: number | null;
}

const round = (v: number, decimals: number): number => Math.round(v * 10 ** decimals) / 10 ** decimals;

function assume(
  list: Assumption[],
  key: string,
  label: string,
  value: number | string,
  unit: string | undefined,
  source: string,
): void {
  list.push(unit === undefined ? { key, label, value, source } : { key, label, value, unit, source });
}

function requireOneOf<T extends string>(field: string, value: unknown, options: readonly T[]): T {
  if (typeof value !== 'string' || !(options as readonly string[]).includes(value)) {
    throw new SpringModelInputError(field, `must be one of: ${options.join(', ')}`);
  }
  return value as T;
}

function requireObject(field: string, value: unknown): void {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new SpringModelInputError(field, 'must be an object');
  }
}

function optionalInRange(field: string, value: unknown, limit: (typeof LIMITS)[keyof typeof LIMITS]) {
  return value === undefined || value === null ? undefined : requireInRange(field, value, limit);
}

function resolveContext(input: BaselineInput): Context {
  requireObject('rider', input.rider);
  requireObject('riding', input.riding);
  if (input.conditions !== undefined && input.conditions !== null)
    requireObject('conditions', input.conditions);
  const assumptions: Assumption[] = [];
  const massKg = requireInRange('rider.massKg', input.rider.massKg, LIMITS.massKg);
  const givenShare = optionalInRange('rider.frontShare', input.rider.frontShare, LIMITS.frontShare);
  const style = requireOneOf('riding.style', input.riding.style, RIDING_STYLES);
  const feel = requireOneOf('riding.feel', input.riding.feel, RIDING_FEELS);
  const altitudeM = optionalInRange('conditions.altitudeM', input.conditions?.altitudeM, LIMITS.altitudeM);
  const temperatureC = optionalInRange(
    'conditions.temperatureC',
    input.conditions?.temperatureC,
    LIMITS.temperatureC,
  );
  if ((input.fork ?? null) === null && (input.shock ?? null) === null) {
    throw new SpringModelInputError('fork', 'give a fork, a shock or both');
  }

  const frontShare = givenShare ?? DEFAULT_FRONT_SHARE;
  if (givenShare === undefined) {
    assume(
      assumptions,
      'rider.frontShare',
      "Share of the rider's weight on the front wheel, standing",
      DEFAULT_FRONT_SHARE,
      undefined,
      'estimate (about 0.40–0.45 standing; no published study found)',
    );
  }
  const alt = altitudeM ?? DEFAULT_ALTITUDE_M;
  if (altitudeM === undefined) {
    assume(
      assumptions,
      'conditions.altitudeM',
      'Altitude where you set and ride',
      alt,
      'm',
      'assumed sea level',
    );
  }
  const pAmb = ambientPressure(alt);
  assume(
    assumptions,
    'conditions.ambientPressure',
    'Ambient air pressure at that altitude (gauges read above it)',
    round(pAmb, 0),
    'Pa',
    'U.S. Standard Atmosphere 1976',
  );
  const temp = temperatureC ?? DEFAULT_TEMPERATURE_C;
  assume(
    assumptions,
    'conditions.temperatureC',
    'Temperature where you pump and ride: the baseline is the gauge pressure to set at this temperature (the force follows the pressure, so set it where you ride)',
    temp,
    '°C',
    temperatureC === undefined ? 'assumed room temperature' : 'your input; ideal gas law for the correction',
  );
  assume(assumptions, 'constants.g0', 'Standard gravity', G0, 'm/s²', 'NIST SP 330 (3rd CGPM, 1901), exact');
  assume(
    assumptions,
    'model.staticPolytropicIndex',
    'Polytropic index for the baseline, sag and hard-landing travel (slow compression, isothermal)',
    1,
    undefined,
    'SPRING-MODEL.md',
  );
  assume(
    assumptions,
    'model.hardLandingMultiple',
    'Hard-landing load as a multiple of the static load (for travel used)',
    HARD_LANDING_MULTIPLE,
    '×',
    'estimate',
  );

  const loads = riderLoads(massKg, frontShare);
  return { pAmb, temperatureC: temp, style, feel, frontN: loads.frontN, rearN: loads.rearN, assumptions };
}

function resolvePart(part: Part, input: ForkInput | ShockInput, ctx: Context): ResolvedPart {
  requireObject(part, input);
  const a = ctx.assumptions;
  const spring = requireOneOf(`${part}.spring`, input.spring, SPRING_TYPES);
  const spacers = requireInRange(`${part}.spacers`, input.spacers, LIMITS.spacers);
  if (!Number.isInteger(spacers))
    throw new SpringModelInputError(`${part}.spacers`, 'must be a whole number');
  const givenTarget = optionalInRange(`${part}.targetSagPct`, input.targetSagPct, LIMITS.targetSagPct);
  const givenMax = optionalInRange(`${part}.maxPressurePsi`, input.maxPressurePsi, LIMITS.maxPressurePsi);
  if (input.geometry !== undefined && input.geometry !== null)
    requireObject(`${part}.geometry`, input.geometry);

  let travelMm: number;
  let loadN: number;
  let lr: number | null = null;
  let wheelTravelMm: number | null = null;
  let endStrokePsi: number | null = null;
  let geometry: ResolvedGeometry | null = null;
  const given = input.geometry ?? undefined;
  if (given) {
    for (const key of Object.keys(LIMITS_BY_GEOMETRY_KEY) as GeometryKey[]) {
      optionalInRange(`${part}.geometry.${key}`, given[key], LIMITS_BY_GEOMETRY_KEY[key]);
    }
  }

  if (part === 'fork') {
    const fork = input as ForkInput;
    travelMm = requireInRange('fork.travelMm', fork.travelMm, LIMITS.forkTravelMm);
    const stanchionMm = requireInRange('fork.stanchionMm', fork.stanchionMm, LIMITS.stanchionMm);
    if (fork.endStroke !== undefined && fork.endStroke !== null) {
      requireObject('fork.endStroke', fork.endStroke);
      endStrokePsi = requireInRange(
        'fork.endStroke.pressurePsi',
        fork.endStroke.pressurePsi,
        LIMITS.endStrokePsi,
      );
    }
    loadN = ctx.frontN;
    if (spring === 'air') geometry = forkGeometry(stanchionMm, travelMm, endStrokePsi !== null, given);
  } else {
    const shock = input as ShockInput;
    travelMm = requireInRange('shock.strokeMm', shock.strokeMm, LIMITS.shockStrokeMm);
    wheelTravelMm = requireInRange('shock.wheelTravelMm', shock.wheelTravelMm, LIMITS.wheelTravelMm);
    lr = leverageRatio(wheelTravelMm, travelMm);
    loadN = shockLoad(ctx.rearN, lr);
    assume(
      a,
      'shock.leverageRatio',
      'Average leverage ratio (wheel travel ÷ stroke; the real ratio varies through the travel)',
      round(lr, 3),
      undefined,
      'SPRING-MODEL.md: LR = wheel travel / stroke',
    );
    if (spring === 'air') geometry = shockGeometry(travelMm, given);
  }

  const target = targetSag(part, ctx.style, ctx.feel, { endStroke: endStrokePsi !== null, travelMm });
  const targetPct = givenTarget ?? target.pct;
  if (givenTarget === undefined) {
    assume(
      a,
      `${part}.targetSagPct`,
      `Target sag (${target.basis})`,
      target.pct,
      '%',
      'common practice, no source',
    );
  }

  let air: AirSpring | null = null;
  const maxPsi = givenMax ?? DEFAULT_MAX_PSI[part];
  const minPsi = DEFAULT_MIN_PSI[part];
  if (spring === 'air' && geometry) {
    const g = geometry.geometry;
    air = makeAirSpring(
      {
        pistonDiameter: mmToM(g.pistonDiameterMm),
        shaftDiameter: mmToM(g.shaftDiameterMm),
        positiveLength: mmToM(g.positiveLengthMm),
        negativeVolume: cm3ToM3(g.negativeVolumeCm3),
        spacerVolume: cm3ToM3(g.spacerVolumeCm3),
        spacers,
        endStrokeVolume: endStrokePsi === null ? 0 : cm3ToM3(g.endStrokeVolumeCm3),
        travel: mmToM(travelMm),
      },
      part,
    );
    for (const key of geometry.defaulted) {
      if (key === 'endStrokeVolumeCm3' && endStrokePsi === null) continue;
      assume(
        a,
        `${part}.geometry.${key}`,
        `${GEOMETRY_LABELS[key]} (${geometry.row})`,
        g[key],
        GEOMETRY_UNITS[key],
        GEOMETRY_SOURCE,
      );
    }
    if (givenMax === undefined) {
      assume(
        a,
        `${part}.maxPressurePsi`,
        'Rated maximum pressure (use the one printed on your part)',
        maxPsi,
        'psi',
        'common practice, no source',
      );
    }
    assume(
      a,
      `${part}.minPressurePsi`,
      'Sensible minimum pressure',
      minPsi,
      'psi',
      'common practice, no source',
    );
  } else {
    assume(
      a,
      `${part}.stockedStepLbPerIn`,
      'Coil springs are stocked in steps of',
      STOCKED_STEP_LB_PER_IN[part],
      'lb/in',
      'common practice, no source',
    );
  }

  return {
    part,
    spring,
    travelMm,
    loadN,
    targetPct,
    spacers,
    endStrokePsi,
    maxPsi,
    minPsi,
    geometry,
    air,
    leverageRatio: lr,
    wheelTravelMm,
  };
}

const LIMITS_BY_GEOMETRY_KEY: Record<GeometryKey, (typeof LIMITS)[keyof typeof LIMITS]> = {
  pistonDiameterMm: LIMITS.pistonDiameterMm,
  shaftDiameterMm: LIMITS.shaftDiameterMm,
  positiveLengthMm: LIMITS.positiveLengthMm,
  negativeVolumeCm3: LIMITS.negativeVolumeCm3,
  spacerVolumeCm3: LIMITS.spacerVolumeCm3,
  endStrokeVolumeCm3: LIMITS.endStrokeVolumeCm3,
  polytropicIndex: LIMITS.polytropicIndex,
};

const GEOMETRY_LABELS: Record<GeometryKey, string> = {
  pistonDiameterMm: 'Air piston diameter',
  shaftDiameterMm: 'Air shaft diameter',
  positiveLengthMm: 'Positive air column at full extension',
  negativeVolumeCm3: 'Negative chamber volume at full extension',
  spacerVolumeCm3: 'Volume one spacer takes',
  endStrokeVolumeCm3: 'End-stroke chamber volume',
  polytropicIndex: 'Polytropic index of a fast hit',
};

const GEOMETRY_UNITS: Record<GeometryKey, string | undefined> = {
  pistonDiameterMm: 'mm',
  shaftDiameterMm: 'mm',
  positiveLengthMm: 'mm',
  negativeVolumeCm3: 'cm³',
  spacerVolumeCm3: 'cm³',
  endStrokeVolumeCm3: 'cm³',
  polytropicIndex: undefined,
};

function curve(force: (x: number) => number, travel: number): CurvePoint[] {
  const out: CurvePoint[] = [];
  for (let i = 0; i < CURVE_POINTS; i++) {
    const x = (travel * i) / (CURVE_POINTS - 1);
    out.push({ travelMm: round(x * 1000, 2), forceN: round(force(x), 1) });
  }
  return out;
}

/** The same spring with another spacer count, or null when that many would close the chamber. */
function withSpacers(rp: ResolvedPart, spacers: number): AirSpring | null {
  const g = rp.geometry!.geometry;
  try {
    return makeAirSpring(
      {
        pistonDiameter: mmToM(g.pistonDiameterMm),
        shaftDiameter: mmToM(g.shaftDiameterMm),
        positiveLength: mmToM(g.positiveLengthMm),
        negativeVolume: cm3ToM3(g.negativeVolumeCm3),
        spacerVolume: cm3ToM3(g.spacerVolumeCm3),
        spacers,
        endStrokeVolume: rp.endStrokePsi === null ? 0 : cm3ToM3(g.endStrokeVolumeCm3),
        travel: mmToM(rp.travelMm),
      },
      rp.part,
    );
  } catch (e) {
    if (e instanceof SpringModelInputError) return null;
    throw e;
  }
}

/**
 * What to change when the baseline uses all travel on a hard landing: the gentlest overlay that
 * does not (more end-stroke pressure first where there is a chamber, else one spacer more). A
 * starting point: the rider changes one thing at a time and only if bottom-outs feel harsh.
 */
function bottomOutAdvice(rp: ResolvedPart, overlays: CurveOverlay[]): string {
  const head = `A hard landing (${HARD_LANDING_MULTIPLE} × your static load) would use all ${rp.travelMm} mm of travel.`;
  const fits = (o: CurveOverlay) => o.travelUsedMm < rp.travelMm - BOTTOM_OUT_TOLERANCE_MM;
  const endStroke = overlays.find((o) => o.kind === 'end-stroke' && fits(o));
  const spacers = overlays.find((o) => o.kind === 'spacers' && fits(o));
  const pick = endStroke ?? spacers;
  if (!pick) {
    return `${head} Using all of it now and then is normal; if bottom-outs feel harsh, have a technician look at the spring.`;
  }
  const change =
    pick.kind === 'end-stroke'
      ? `raise the end-stroke pressure to ${pick.endStrokePsi} psi`
      : `fit ${pick.spacers} volume spacer${pick.spacers === 1 ? '' : 's'}`;
  return `${head} Using all of it now and then is normal; if bottom-outs feel harsh, ${change} (that uses about ${Math.round(pick.travelUsedMm)} mm on the same landing), one change at a time and never past the maximum pressure.`;
}

function sagWarnings(rp: ResolvedPart, warnings: BaselineWarning[]): void {
  if (rp.targetPct < SAG_WARN_BAND.minPct || rp.targetPct > SAG_WARN_BAND.maxPct) {
    warnings.push({
      code: 'sag-out-of-range',
      message: `A sag of ${rp.targetPct} % is outside the usual ${SAG_WARN_BAND.minPct}–${SAG_WARN_BAND.maxPct} %: the ${rp.part} will ride ${rp.targetPct < SAG_WARN_BAND.minPct ? 'harsh and use little travel' : 'low in its travel and bottom out easily'}.`,
    });
  }
  if (
    rp.leverageRatio !== null &&
    (rp.leverageRatio < LEVERAGE_RATIO_BAND.min || rp.leverageRatio > LEVERAGE_RATIO_BAND.max)
  ) {
    warnings.push({
      code: 'leverage-ratio-unusual',
      message: `Wheel travel ÷ stroke gives a leverage ratio of ${rp.leverageRatio.toFixed(2)}, outside the usual ${LEVERAGE_RATIO_BAND.min}–${LEVERAGE_RATIO_BAND.max}: check the wheel travel and the stroke.`,
    });
  }
}

function computeAir(rp: ResolvedPart, ctx: Context): PartResult {
  const s = rp.air!;
  const g = rp.geometry!.geometry;
  const T = s.travel;
  const xSag = (T * rp.targetPct) / 100;
  const pEnd = rp.endStrokePsi === null ? null : psiToPa(rp.endStrokePsi) + ctx.pAmb;
  const solvePsi = (pct: number) =>
    paToPsi(solveChargePressure(s, (T * pct) / 100, rp.loadN, ctx.pAmb, pEnd, 1) - ctx.pAmb);
  const psi = solvePsi(rp.targetPct);
  const rangePsi: [number, number] = [
    Math.round(solvePsi(rp.targetPct + SAG_RANGE_POINTS)),
    Math.round(solvePsi(rp.targetPct - SAG_RANGE_POINTS)),
  ];
  const p0 = psiToPa(psi) + ctx.pAmb;
  const charge: AirCharge = { p0, pEnd, pAmb: ctx.pAmb, n: 1 };
  const hardLandingLoadN = HARD_LANDING_MULTIPLE * rp.loadN;
  const describe = (spring: AirSpring, c: AirCharge) => {
    const f = (x: number) => springForce(spring, c, x);
    return {
      curve: curve(f, T),
      progression: f(0.9 * T) / f(xSag),
      travelUsedMm: travelUnderLoad(spring, c, hardLandingLoadN) * 1000,
    };
  };
  const base = describe(s, charge);

  const overlays: CurveOverlay[] = [];
  for (let add = 1; add <= 3; add++) {
    const total = rp.spacers + add;
    if (total > LIMITS.spacers.max) break;
    const sp = withSpacers(rp, total);
    if (!sp) break;
    overlays.push({
      label: `+${add} spacer${add > 1 ? 's' : ''} (${total} fitted)`,
      kind: 'spacers',
      spacers: total,
      ...describe(sp, charge),
    });
  }
  if (rp.endStrokePsi !== null) {
    const set = rp.endStrokePsi;
    const seen = new Set<number>([set]);
    for (const factor of END_STROKE_OVERLAY_FACTORS) {
      const e = Math.round((set * factor) / 5) * 5;
      if (seen.has(e) || e <= psi || e < LIMITS.endStrokePsi.min || e > LIMITS.endStrokePsi.max) continue;
      seen.add(e);
      overlays.push({
        label: `end-stroke ${e} psi`,
        kind: 'end-stroke',
        endStrokePsi: e,
        ...describe(s, { ...charge, pEnd: psiToPa(e) + ctx.pAmb }),
      });
    }
  }
  overlays.push({
    label: `fast hit (n = ${g.polytropicIndex})`,
    kind: 'fast-hit',
    ...describe(s, { ...charge, n: g.polytropicIndex }),
  });

  const warnings: BaselineWarning[] = [];
  if (psi > rp.maxPsi) {
    warnings.push({
      code: 'above-max-pressure',
      message: `The baseline (${Math.round(psi)} psi) is above the ${rp.maxPsi} psi maximum: never pump past the maximum; this spring does not suit your weight, see a technician.`,
    });
  } else if (rangePsi[1] > rp.maxPsi) {
    warnings.push({
      code: 'range-above-max-pressure',
      message: `The top of the range (${rangePsi[1]} psi) is above the ${rp.maxPsi} psi maximum: stay at or below ${rp.maxPsi} psi.`,
    });
  }
  if (psi < rp.minPsi) {
    warnings.push({
      code: 'below-min-pressure',
      message: `The baseline (${Math.round(psi)} psi) is below a sensible minimum of about ${rp.minPsi} psi: the spring is too firm for your weight, see a technician.`,
    });
  }
  sagWarnings(rp, warnings);
  if (base.travelUsedMm < FULL_TRAVEL_SHARE * rp.travelMm) {
    warnings.push({
      code: 'no-full-travel',
      message: `Even a hard landing (${HARD_LANDING_MULTIPLE} × your static load) would use only ${Math.round(base.travelUsedMm)} of ${rp.travelMm} mm: the spring is too progressive for you. Remove spacers${rp.endStrokePsi === null ? '' : ' or lower the end-stroke pressure'}.`,
    });
  }
  if (base.travelUsedMm >= rp.travelMm - BOTTOM_OUT_TOLERANCE_MM) {
    warnings.push({ code: 'bottoms-out-on-hard-landing', message: bottomOutAdvice(rp, overlays) });
  }
  if (rp.endStrokePsi !== null && rp.endStrokePsi < psi) {
    warnings.push({
      code: 'end-stroke-below-main',
      message: `The end-stroke pressure (${rp.endStrokePsi} psi) is below the main chamber's (${Math.round(psi)} psi): the two chambers act as one and the end-stroke chamber does nothing. Set it higher than the main chamber.`,
    });
  }
  if (Math.abs(ctx.temperatureC - INDOOR_TEMPERATURE_C) >= 5) {
    const indoor = paToPsi(
      gaugeAtTemperature(psiToPa(psi), ctx.temperatureC, INDOOR_TEMPERATURE_C, ctx.pAmb),
    );
    warnings.push({
      code: 'temperature-offset',
      message: `${Math.round(psi)} psi is what the gauge should read at ${ctx.temperatureC} °C. Pumped indoors at ${INDOOR_TEMPERATURE_C} °C, set about ${Math.round(indoor)} psi so that it reads ${Math.round(psi)} psi outside (ideal gas law).`,
    });
  }

  return {
    travelMm: rp.travelMm,
    targetSagPct: rp.targetPct,
    targetSagMm: (rp.travelMm * rp.targetPct) / 100,
    loadN: rp.loadN,
    pressure: { psi, bar: psiToBar(psi), rangePsi },
    coilRate: null,
    curve: base.curve,
    progression: base.progression,
    hardLandingLoadN,
    travelUsedMm: base.travelUsedMm,
    overlays,
    warnings,
  };
}

function computeCoil(rp: ResolvedPart, input: ForkInput | ShockInput): PartResult {
  const T = mmToM(rp.travelMm);
  const xSag = (T * rp.targetPct) / 100;
  const rate = coilRate(rp.loadN, xSag, rp.part);
  const k = rp.loadN / xSag; // N/m
  const hardLandingLoadN = HARD_LANDING_MULTIPLE * rp.loadN;
  const warnings: BaselineWarning[] = [];
  sagWarnings(rp, warnings);
  if (rp.spacers > 0) {
    warnings.push({
      code: 'spacers-ignored',
      message: 'Volume spacers only work in an air spring; they are ignored for a coil.',
    });
  }
  if (rp.part === 'fork' && (input as ForkInput).endStroke) {
    warnings.push({
      code: 'end-stroke-ignored',
      message: 'An end-stroke chamber belongs to an air spring; it is ignored for a coil.',
    });
  }
  return {
    travelMm: rp.travelMm,
    targetSagPct: rp.targetPct,
    targetSagMm: (rp.travelMm * rp.targetPct) / 100,
    loadN: rp.loadN,
    pressure: null,
    coilRate: rate,
    curve: curve((x) => k * x, T),
    progression: (0.9 * T) / xSag,
    hardLandingLoadN,
    travelUsedMm: Math.min(T, hardLandingLoadN / k) * 1000,
    overlays: [],
    warnings,
  };
}

function computePart(part: Part, input: ForkInput | ShockInput, ctx: Context): PartResult {
  const rp = resolvePart(part, input, ctx);
  return rp.spring === 'air' ? computeAir(rp, ctx) : computeCoil(rp, input);
}

/** The baseline for a rider, a bike and the conditions (SPRING-MODEL.md, "From a rider to a baseline"). */
export function computeBaseline(input: BaselineInput): BaselineResult {
  requireObject('body', input);
  const ctx = resolveContext(input);
  const fork = input.fork ? computePart('fork', input.fork, ctx) : null;
  let shock: ShockResult | null = null;
  if (input.shock) {
    const result = computePart('shock', input.shock, ctx);
    const lr = leverageRatio(input.shock.wheelTravelMm, input.shock.strokeMm);
    shock = {
      ...result,
      leverageRatio: lr,
      wheelSagMm: (input.shock.wheelTravelMm * result.targetSagPct) / 100,
    };
  }
  const anyAir = input.fork?.spring === 'air' || input.shock?.spring === 'air';
  const assumptions = anyAir
    ? ctx.assumptions
    : ctx.assumptions.filter((a) => !AIR_ONLY_ASSUMPTIONS.has(a.key));
  return { fork, shock, cautions: [...CAUTIONS], assumptions };
}

/** What only an air spring depends on: left out of "what we assumed" when every spring is a coil. */
const AIR_ONLY_ASSUMPTIONS = new Set([
  'conditions.altitudeM',
  'conditions.ambientPressure',
  'conditions.temperatureC',
  'model.staticPolytropicIndex',
]);

/**
 * From a sag measured at a known pressure, the pressure that gives the target sag. The load the
 * spring really carries is W' = F(s_m; P_m) (it absorbs friction and the real weight split); then
 * F(x_target; P') = W' is solved for P'. For a shock, the sag is measured at the shock.
 */
export function sagCheck(input: SagCheckInput): SagCheckResult {
  requireObject('body', input);
  requireObject('measured', input.measured);
  const part = requireOneOf('measured.part', input.measured.part, ['fork', 'shock'] as const);
  const ctx = resolveContext(input);
  const partInput = input[part];
  if (!partInput) throw new SpringModelInputError('measured.part', `there is no ${part} in this baseline`);
  const rp = resolvePart(part, partInput, ctx);
  if (rp.spring !== 'air' || !rp.air) {
    throw new SpringModelInputError(
      'measured.part',
      `the ${part} has a coil spring: the sag check corrects air pressure (change the coil's rate instead)`,
    );
  }
  const measuredPsi = requireInRange(
    'measured.pressurePsi',
    input.measured.pressurePsi,
    LIMITS.measuredPressurePsi,
  );
  const sagMm = requireInRange('measured.sagMm', input.measured.sagMm, LIMITS.measuredSagMm);
  if (sagMm >= rp.travelMm) {
    throw new SpringModelInputError(
      'measured.sagMm',
      `must be less than the ${part}'s travel (${rp.travelMm} mm)`,
    );
  }
  const s = rp.air;
  const pEnd = rp.endStrokePsi === null ? null : psiToPa(rp.endStrokePsi) + ctx.pAmb;
  const measured: AirCharge = { p0: psiToPa(measuredPsi) + ctx.pAmb, pEnd, pAmb: ctx.pAmb, n: 1 };
  const carried = springForce(s, measured, mmToM(sagMm));
  const targetSagMm = (rp.travelMm * rp.targetPct) / 100;
  const p0 = solveChargePressure(s, mmToM(targetSagMm), carried, ctx.pAmb, pEnd, 1);
  const newPressurePsi = paToPsi(p0 - ctx.pAmb);
  return {
    measuredSagPct: (sagMm / rp.travelMm) * 100,
    targetSagMm,
    newPressurePsi,
    changePsi: newPressurePsi - measuredPsi,
  };
}
