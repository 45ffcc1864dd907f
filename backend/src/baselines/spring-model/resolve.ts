import {
  RIDING_FEELS,
  RIDING_STYLES,
  SPRING_TYPES,
  type AirSpringGeometry,
  type Assumption,
  type BaselineInput,
  type ForkInput,
  type MeasuredSpring,
  type RidingFeel,
  type RidingStyle,
  type ShockInput,
  type SpringType,
} from '@loamline/shared-types';
import { type AirSpring, makeAirSpring } from './air-spring';
import { ambientPressure } from './atmosphere';
import { STOCKED_STEP_LB_PER_IN } from './coil';
import {
  FAST_HIT_INDEX,
  forkGeometry,
  GEOMETRY_SOURCE,
  type GeometryKey,
  type ResolvedGeometry,
  shockGeometry,
} from './defaults';
import { type Limit, LIMITS, requireInRange, SpringModelInputError } from './limits';
import {
  DEFAULT_ALTITUDE_M,
  DEFAULT_END_STROKE_MAX_PSI,
  DEFAULT_MAX_PSI,
  DEFAULT_MIN_PSI,
  DEFAULT_TEMPERATURE_C,
  HARD_LANDING_MULTIPLE,
} from './policy';
import {
  DEFAULT_FRONT_SHARE,
  DEFAULT_SEATED_REAR_SHARE,
  leverageRatio,
  riderLoads,
  shockLoad,
} from './rider-load';
import { targetSag } from './sag-targets';
import { cm3ToM3, G0, mmToM } from './units';

/**
 * Input resolution: every input checked (a `SpringModelInputError` names the field), every default
 * filled in and listed as an assumption with its source.
 */

export type Part = 'fork' | 'shock';

export interface Context {
  /** ambient pressure where the rider rides, Pa: the forces work against it */
  pAmbRide: number;
  /** ambient pressure where the rider pumps and measures sag, Pa: the gauge reads above it */
  pAmbPump: number;
  altitudeM: number;
  pumpAltitudeM: number;
  temperatureC: number;
  style: RidingStyle;
  feel: RidingFeel;
  frontN: number;
  rearN: number;
  assumptions: Assumption[];
}

/** A fork's end-stroke chamber as given: the pressure may be left to the model. */
export interface ResolvedEndStroke {
  /** gauge pressure the rider gave, or null: the model recommends one */
  givenPsi: number | null;
  maxPsi: number;
  maxIsDefault: boolean;
}

/** One part, checked and with every default filled in. */
export interface ResolvedPart {
  part: Part;
  spring: SpringType;
  /** travel of the spring itself (a shock: its stroke), mm */
  travelMm: number;
  loadN: number;
  targetPct: number;
  spacers: number;
  /** null without an end-stroke chamber, and for any coil */
  endStroke: ResolvedEndStroke | null;
  maxPsi: number;
  maxIsDefault: boolean;
  minPsi: number;
  geometry: ResolvedGeometry | null;
  air: AirSpring | null;
  /** a shock: the leverage ratio the load used, and whether it is the average */
  leverageRatio: number | null;
  leverageRatioIsAverage: boolean;
  averageLeverageRatio: number | null;
  wheelTravelMm: number | null;
  /** what the rider sent that a coil has no use for */
  ignoredAirFields: string[];
  /** the measured spring's label when some of its geometry is in use (air only), else null */
  measuredLabel: string | null;
}

/** What a measured spring supplies: the geometry a bench fit finds. */
export const MEASURED_GEOMETRY_KEYS = [
  'positiveLengthMm',
  'negativeVolumeCm3',
  'endStrokeVolumeCm3',
] as const;
export type MeasuredGeometryKey = (typeof MEASURED_GEOMETRY_KEYS)[number];

/** Checks a part's measured spring (the fields the model reads, and its label); null when absent. */
export function checkMeasured(part: Part, value: unknown): MeasuredSpring | null {
  if (value === undefined || value === null) return null;
  const field = `${part}.measured`;
  requireObject(field, value);
  const m = value as MeasuredSpring;
  requireInRange(`${field}.positiveLengthMm`, m.positiveLengthMm, LIMITS.positiveLengthMm);
  requireInRange(`${field}.negativeVolumeCm3`, m.negativeVolumeCm3, LIMITS.negativeVolumeCm3);
  optionalInRange(`${field}.endStrokeVolumeCm3`, m.endStrokeVolumeCm3, LIMITS.endStrokeVolumeCm3);
  if (typeof m.frictionN !== 'number' || !Number.isFinite(m.frictionN) || m.frictionN < 0) {
    throw new SpringModelInputError(`${field}.frictionN`, 'must be a number from 0 N');
  }
  if (typeof m.label !== 'string' || m.label.trim() === '') {
    throw new SpringModelInputError(`${field}.label`, 'must be a non-empty string');
  }
  return m;
}

/**
 * The geometry the model starts from: the rider's explicit values, then the measured spring's
 * (its end-stroke volume only for a fork, and only when measured), then the defaults.
 */
function withMeasured(
  part: Part,
  given: Partial<AirSpringGeometry> | undefined,
  measured: MeasuredSpring | null,
): { geometry: Partial<AirSpringGeometry> | undefined; fromMeasured: MeasuredGeometryKey[] } {
  if (!measured) return { geometry: given, fromMeasured: [] };
  const merged: Partial<AirSpringGeometry> = { ...(given ?? {}) };
  const fromMeasured: MeasuredGeometryKey[] = [];
  for (const key of MEASURED_GEOMETRY_KEYS) {
    if (typeof given?.[key] === 'number') continue;
    if (key === 'endStrokeVolumeCm3' && part === 'shock') continue;
    const v = measured[key];
    if (typeof v !== 'number') continue;
    merged[key] = v;
    fromMeasured.push(key);
  }
  return { geometry: merged, fromMeasured };
}

export const round = (v: number, decimals: number): number => Math.round(v * 10 ** decimals) / 10 ** decimals;

export function assume(
  list: Assumption[],
  key: string,
  label: string,
  value: number | string,
  unit: string | undefined,
  source: string,
): void {
  list.push(unit === undefined ? { key, label, value, source } : { key, label, value, unit, source });
}

export function requireOneOf<T extends string>(field: string, value: unknown, options: readonly T[]): T {
  if (typeof value !== 'string' || !(options as readonly string[]).includes(value)) {
    throw new SpringModelInputError(field, `must be one of: ${options.join(', ')}`);
  }
  return value as T;
}

export function requireObject(field: string, value: unknown): void {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new SpringModelInputError(field, 'must be an object');
  }
}

function optionalInRange(field: string, value: unknown, limit: Limit): number | undefined {
  return value === undefined || value === null ? undefined : requireInRange(field, value, limit);
}

export function resolveContext(input: BaselineInput): Context {
  requireObject('rider', input.rider);
  requireObject('riding', input.riding);
  if (input.conditions !== undefined && input.conditions !== null)
    requireObject('conditions', input.conditions);
  const a: Assumption[] = [];
  const massKg = requireInRange('rider.massKg', input.rider.massKg, LIMITS.massKg);
  const givenFront = optionalInRange('rider.frontShare', input.rider.frontShare, LIMITS.frontShare);
  const givenRear = optionalInRange(
    'rider.seatedRearShare',
    input.rider.seatedRearShare,
    LIMITS.seatedRearShare,
  );
  const style = requireOneOf('riding.style', input.riding.style, RIDING_STYLES);
  const feel = requireOneOf('riding.feel', input.riding.feel, RIDING_FEELS);
  const altitudeM = optionalInRange('conditions.altitudeM', input.conditions?.altitudeM, LIMITS.altitudeM);
  const pumpAltitudeM = optionalInRange(
    'conditions.pumpAltitudeM',
    input.conditions?.pumpAltitudeM,
    LIMITS.altitudeM,
  );
  const temperatureC = optionalInRange(
    'conditions.temperatureC',
    input.conditions?.temperatureC,
    LIMITS.temperatureC,
  );
  if ((input.fork ?? null) === null && (input.shock ?? null) === null) {
    throw new SpringModelInputError('fork', 'give a fork, a shock or both');
  }

  const frontShare = givenFront ?? DEFAULT_FRONT_SHARE;
  if (givenFront === undefined && input.fork) {
    assume(
      a,
      'rider.frontShare',
      'Share of your weight on the front wheel, standing in the riding position (where fork sag is measured)',
      DEFAULT_FRONT_SHARE,
      undefined,
      'estimate (about 0.40–0.45; no published study found)',
    );
  }
  const rearShare = givenRear ?? DEFAULT_SEATED_REAR_SHARE;
  if (givenRear === undefined && input.shock) {
    assume(
      a,
      'rider.seatedRearShare',
      'Share of your weight on the rear wheel, seated (where rear sag is measured)',
      DEFAULT_SEATED_REAR_SHARE,
      undefined,
      'estimate, from memory (about 0.70–0.75 seated)',
    );
  }
  const ride = altitudeM ?? DEFAULT_ALTITUDE_M;
  if (altitudeM === undefined) {
    assume(a, 'conditions.altitudeM', 'Altitude where you ride', ride, 'm', 'assumed sea level');
  }
  const pump = pumpAltitudeM ?? ride;
  if (pumpAltitudeM === undefined) {
    assume(
      a,
      'conditions.pumpAltitudeM',
      'Altitude where you pump and measure sag',
      pump,
      'm',
      'assumed the same as where you ride',
    );
  }
  const pAmbRide = ambientPressure(ride);
  const pAmbPump = ambientPressure(pump);
  assume(
    a,
    'conditions.ambientPressure',
    'Air pressure around you where you ride (a gauge reads the pressure above it)',
    round(pAmbRide, 0),
    'Pa',
    'U.S. Standard Atmosphere 1976',
  );
  const temp = temperatureC ?? DEFAULT_TEMPERATURE_C;
  assume(
    a,
    'conditions.temperatureC',
    'Temperature where you pump and ride: the baseline is the gauge pressure to set at this temperature',
    temp,
    '°C',
    temperatureC === undefined ? 'assumed room temperature' : 'your input; ideal gas law for the correction',
  );
  assume(a, 'constants.g0', 'Standard gravity', G0, 'm/s²', 'NIST SP 330 (3rd CGPM, 1901), exact');
  assume(
    a,
    'model.staticPolytropicIndex',
    'Sag is a slow squeeze: the air keeps its temperature (polytropic index 1)',
    1,
    undefined,
    'ideal gas law, isothermal compression',
  );
  assume(
    a,
    'model.hardLandingMultiple',
    'A hard landing pushes with this multiple of your static load (for travel used)',
    HARD_LANDING_MULTIPLE,
    '×',
    'estimate',
  );

  const loads = riderLoads(massKg, frontShare, rearShare);
  return {
    pAmbRide,
    pAmbPump,
    altitudeM: ride,
    pumpAltitudeM: pump,
    temperatureC: temp,
    style,
    feel,
    frontN: loads.frontN,
    rearN: loads.rearN,
    assumptions: a,
  };
}

const LIMITS_BY_GEOMETRY_KEY: Record<GeometryKey, Limit> = {
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
  polytropicIndex:
    'A hard landing is too fast for the air to shed heat: it stiffens (polytropic index, at most that of air)',
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

/** The air spring of a resolved part with another spacer count; null when they close the chamber. */
export function airSpringWith(rp: ResolvedPart, spacers: number): AirSpring | null {
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
        endStrokeVolume: rp.endStroke === null ? 0 : cm3ToM3(g.endStrokeVolumeCm3),
        travel: mmToM(rp.travelMm),
      },
      rp.part,
    );
  } catch (e) {
    if (e instanceof SpringModelInputError && spacers !== rp.spacers) return null;
    throw e;
  }
}

export function resolvePart(part: Part, input: ForkInput | ShockInput, ctx: Context): ResolvedPart {
  requireObject(part, input);
  const a = ctx.assumptions;
  const spring = requireOneOf(`${part}.spring`, input.spring, SPRING_TYPES);
  const air = spring === 'air';
  const spacers = requireInRange(`${part}.spacers`, input.spacers, LIMITS.spacers);
  if (!Number.isInteger(spacers))
    throw new SpringModelInputError(`${part}.spacers`, 'must be a whole number');
  const givenTarget = optionalInRange(`${part}.targetSagPct`, input.targetSagPct, LIMITS.targetSagPct);
  const givenMax = optionalInRange(`${part}.maxPressurePsi`, input.maxPressurePsi, LIMITS.maxPressurePsi);
  if (input.geometry !== undefined && input.geometry !== null)
    requireObject(`${part}.geometry`, input.geometry);
  const given = input.geometry ?? undefined;
  if (given) {
    for (const key of Object.keys(LIMITS_BY_GEOMETRY_KEY) as GeometryKey[]) {
      optionalInRange(`${part}.geometry.${key}`, given[key], LIMITS_BY_GEOMETRY_KEY[key]);
    }
  }
  const measured = checkMeasured(part, input.measured);
  const ignoredAirFields: string[] = [];
  if (!air) {
    if (spacers > 0) ignoredAirFields.push('spacers');
    if (givenMax !== undefined) ignoredAirFields.push('maxPressurePsi');
    if (given && Object.keys(given).length > 0) ignoredAirFields.push('geometry');
    if (measured) ignoredAirFields.push('measured');
  }
  const start = withMeasured(part, given, air ? measured : null);

  let travelMm: number;
  let loadN: number;
  let lr: number | null = null;
  let lrAverage: number | null = null;
  let lrIsAverage = true;
  let wheelTravelMm: number | null = null;
  let endStroke: ResolvedEndStroke | null = null;
  let geometry: ResolvedGeometry | null = null;

  if (part === 'fork') {
    const fork = input as ForkInput;
    travelMm = requireInRange('fork.travelMm', fork.travelMm, LIMITS.forkTravelMm);
    const stanchionMm = requireInRange('fork.stanchionMm', fork.stanchionMm, LIMITS.stanchionMm);
    if (fork.endStroke !== undefined && fork.endStroke !== null) {
      requireObject('fork.endStroke', fork.endStroke);
      const givenPsi = optionalInRange(
        'fork.endStroke.pressurePsi',
        fork.endStroke.pressurePsi,
        LIMITS.endStrokePsi,
      );
      const givenEndMax = optionalInRange(
        'fork.endStroke.maxPressurePsi',
        fork.endStroke.maxPressurePsi,
        LIMITS.maxPressurePsi,
      );
      // A coil has no air: the end-stroke chamber is ignored everywhere, the sag target included.
      if (air) {
        endStroke = {
          givenPsi: givenPsi ?? null,
          maxPsi: givenEndMax ?? DEFAULT_END_STROKE_MAX_PSI,
          maxIsDefault: givenEndMax === undefined,
        };
      } else ignoredAirFields.push('endStroke');
    }
    loadN = ctx.frontN;
    if (air) geometry = forkGeometry(stanchionMm, travelMm, endStroke !== null, start.geometry);
  } else {
    const shock = input as ShockInput;
    travelMm = requireInRange('shock.strokeMm', shock.strokeMm, LIMITS.shockStrokeMm);
    wheelTravelMm = requireInRange('shock.wheelTravelMm', shock.wheelTravelMm, LIMITS.wheelTravelMm);
    const lrAtSag = optionalInRange(
      'shock.leverageRatioAtSag',
      shock.leverageRatioAtSag,
      LIMITS.leverageRatioAtSag,
    );
    lrAverage = leverageRatio(wheelTravelMm, travelMm);
    lr = lrAtSag ?? lrAverage;
    lrIsAverage = lrAtSag === undefined;
    loadN = shockLoad(ctx.rearN, lr);
    if (lrIsAverage) {
      assume(
        a,
        'shock.leverageRatioAtSag',
        'Leverage ratio at sag: the average, wheel travel ÷ stroke (the real ratio varies through the travel; give yours if you know the curve)',
        round(lr, 3),
        undefined,
        'wheel travel ÷ stroke',
      );
    }
    if (air) geometry = shockGeometry(travelMm, start.geometry);
  }

  const target = targetSag(part, ctx.style, ctx.feel, { endStroke: endStroke !== null, travelMm });
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

  const maxPsi = givenMax ?? DEFAULT_MAX_PSI[part];
  const minPsi = DEFAULT_MIN_PSI[part];
  let airSpring: AirSpring | null = null;
  let measuredLabel: string | null = null;
  if (air && geometry) {
    const g = geometry.geometry;
    airSpring = makeAirSpring(
      {
        pistonDiameter: mmToM(g.pistonDiameterMm),
        shaftDiameter: mmToM(g.shaftDiameterMm),
        positiveLength: mmToM(g.positiveLengthMm),
        negativeVolume: cm3ToM3(g.negativeVolumeCm3),
        spacerVolume: cm3ToM3(g.spacerVolumeCm3),
        spacers,
        endStrokeVolume: endStroke === null ? 0 : cm3ToM3(g.endStrokeVolumeCm3),
        travel: mmToM(travelMm),
      },
      part,
    );
    for (const key of geometry.defaulted) {
      if (key === 'endStrokeVolumeCm3' && endStroke === null) continue;
      assume(
        a,
        `${part}.geometry.${key}`,
        key === 'polytropicIndex' ? GEOMETRY_LABELS[key] : `${GEOMETRY_LABELS[key]} (${geometry.row})`,
        key === 'polytropicIndex' ? FAST_HIT_INDEX : g[key],
        GEOMETRY_UNITS[key],
        key === 'polytropicIndex' ? 'heat capacity ratio of air, NBS Circular 564 (1955)' : GEOMETRY_SOURCE,
      );
    }
    for (const key of start.fromMeasured) {
      if (key === 'endStrokeVolumeCm3' && endStroke === null) continue;
      assume(
        a,
        `${part}.measured.${key}`,
        `${GEOMETRY_LABELS[key]} (your ${part}'s measured spring)`,
        g[key],
        GEOMETRY_UNITS[key],
        measured!.label,
      );
      measuredLabel = measured!.label;
    }
    if (givenMax === undefined) {
      assume(
        a,
        `${part}.maxPressurePsi`,
        `Rated maximum pressure of the ${part === 'fork' ? "fork's main chamber" : 'shock'} (use the one printed on your part)`,
        maxPsi,
        'psi',
        'common practice, no source',
      );
    }
    if (endStroke?.maxIsDefault) {
      assume(
        a,
        'fork.endStroke.maxPressurePsi',
        "Rated maximum pressure of the fork's end-stroke chamber (use the one printed on your fork)",
        endStroke.maxPsi,
        'psi',
        'estimate',
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
    endStroke,
    maxPsi,
    maxIsDefault: givenMax === undefined,
    minPsi,
    geometry,
    air: airSpring,
    leverageRatio: lr,
    leverageRatioIsAverage: lrIsAverage,
    averageLeverageRatio: lrAverage,
    wheelTravelMm,
    ignoredAirFields,
    measuredLabel,
  };
}
