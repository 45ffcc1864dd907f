import type { AirSpringGeometry } from '@loamline/shared-types';
import { circleArea } from './units';

/**
 * Default air-spring geometry for riders who do not know their spring. All of it is an ESTIMATE
 * (Loamline's own, not measured on any product), calibrated so that the plausibility bands of
 * docs/spring-model.md hold; every value can be overridden in `geometry`.
 */
export const GEOMETRY_SOURCE = 'estimate (Loamline default geometry, see docs/spring-model.md)';

/**
 * Forks, by stanchion outer diameter: the air piston fills the stanchion bore (the stanchion less
 * about 1.5 mm of wall each side); the shaft that carries it; the volume one spacer takes. The spacer
 * volume is calibrated so that five spacers in a 120 mm fork take 1/16 of its positive chamber
 * (five spacers then leave ≈ 112 mm of 120 mm under the force that used it all: a trade fact,
 * common practice, no source).
 */
export const FORK_GEOMETRY_TABLE: readonly {
  stanchionMm: number;
  pistonDiameterMm: number;
  shaftDiameterMm: number;
  spacerVolumeCm3: number;
}[] = [
  { stanchionMm: 28, pistonDiameterMm: 25, shaftDiameterMm: 8, spacerVolumeCm3: 1.2 },
  { stanchionMm: 30, pistonDiameterMm: 27, shaftDiameterMm: 8, spacerVolumeCm3: 1.4 },
  { stanchionMm: 32, pistonDiameterMm: 29, shaftDiameterMm: 9, spacerVolumeCm3: 1.6 },
  { stanchionMm: 34, pistonDiameterMm: 31, shaftDiameterMm: 10, spacerVolumeCm3: 1.8 },
  { stanchionMm: 35, pistonDiameterMm: 32, shaftDiameterMm: 10, spacerVolumeCm3: 1.9 },
  { stanchionMm: 36, pistonDiameterMm: 33, shaftDiameterMm: 10, spacerVolumeCm3: 2.1 },
  { stanchionMm: 38, pistonDiameterMm: 35, shaftDiameterMm: 11, spacerVolumeCm3: 2.3 },
  { stanchionMm: 40, pistonDiameterMm: 37, shaftDiameterMm: 11, spacerVolumeCm3: 2.6 },
];

/** Fork rules that scale with travel T (estimates). */
export const FORK_RULES = {
  /** positive air column L₀ = 1.6·T */
  positiveLengthPerTravel: 1.6,
  /** with an end-stroke chamber the main chamber is smaller: L₀ = 1.4·T */
  positiveLengthPerTravelWithEndStroke: 1.4,
  /** negative chamber V₋₀ = A₋ · 0.4·T */
  negativeLengthPerTravel: 0.4,
  /** end-stroke chamber V_e = 0.35 · A·L₀ */
  endStrokeVolumePerPositive: 0.35,
};

/**
 * Shocks, by stroke (the row with the smallest `upToStrokeMm` ≥ the stroke): air piston and shaft,
 * the volume one spacer takes (1/40 of the positive chamber at the row's reference stroke).
 */
export const SHOCK_GEOMETRY_TABLE: readonly {
  upToStrokeMm: number;
  referenceStrokeMm: number;
  pistonDiameterMm: number;
  shaftDiameterMm: number;
  spacerVolumeCm3: number;
}[] = [
  {
    upToStrokeMm: 47.5,
    referenceStrokeMm: 45,
    pistonDiameterMm: 42,
    shaftDiameterMm: 10,
    spacerVolumeCm3: 2.5,
  },
  {
    upToStrokeMm: 67.5,
    referenceStrokeMm: 60,
    pistonDiameterMm: 44,
    shaftDiameterMm: 10,
    spacerVolumeCm3: 3.6,
  },
  {
    upToStrokeMm: Infinity,
    referenceStrokeMm: 75,
    pistonDiameterMm: 46,
    shaftDiameterMm: 12,
    spacerVolumeCm3: 5,
  },
];

/** Shock rules that scale with stroke S (estimates). */
export const SHOCK_RULES = {
  /** positive air column L₀ = 1.6·S */
  positiveLengthPerStroke: 1.6,
  /** negative chamber V₋₀ = A₋ · 0.5·S */
  negativeLengthPerStroke: 0.5,
};

/** Polytropic index of a fast hit, the heat capacity ratio of air γ (NBS Circular 564). */
export const FAST_HIT_INDEX = 1.4;

export type GeometryKey = keyof AirSpringGeometry;

export interface ResolvedGeometry {
  geometry: AirSpringGeometry;
  /** the keys that came from the defaults, not from the rider */
  defaulted: GeometryKey[];
  /** which table row they came from, for the assumptions list */
  row: string;
}

/** Rounds to a number of decimals (as the defaults are shown to the rider). */
const round = (v: number, decimals: number): number => Math.round(v * 10 ** decimals) / 10 ** decimals;
const mm2ToCm2 = (mm2: number): number => mm2 / 100;

/** Fills the rider's partial geometry from the defaults, in dependency order (bore → volumes). */
function resolve(
  given: Partial<AirSpringGeometry> | undefined,
  defaults: {
    pistonDiameterMm: number;
    shaftDiameterMm: number;
    spacerVolumeCm3: number;
    positiveLength: (piston: number) => number;
    negativeVolume: (piston: number, shaft: number) => number;
    endStrokeVolume: (piston: number, positiveLength: number) => number;
  },
  row: string,
): ResolvedGeometry {
  const g = given ?? {};
  const defaulted: GeometryKey[] = [];
  const pick = <K extends GeometryKey>(key: K, fallback: () => number): number => {
    const v = g[key];
    if (typeof v === 'number') return v;
    defaulted.push(key);
    return fallback();
  };
  const pistonDiameterMm = pick('pistonDiameterMm', () => defaults.pistonDiameterMm);
  const shaftDiameterMm = pick('shaftDiameterMm', () => defaults.shaftDiameterMm);
  const positiveLengthMm = pick('positiveLengthMm', () => defaults.positiveLength(pistonDiameterMm));
  const negativeVolumeCm3 = pick('negativeVolumeCm3', () =>
    defaults.negativeVolume(pistonDiameterMm, shaftDiameterMm),
  );
  const spacerVolumeCm3 = pick('spacerVolumeCm3', () => defaults.spacerVolumeCm3);
  const endStrokeVolumeCm3 = pick('endStrokeVolumeCm3', () =>
    defaults.endStrokeVolume(pistonDiameterMm, positiveLengthMm),
  );
  const polytropicIndex = pick('polytropicIndex', () => FAST_HIT_INDEX);
  return {
    geometry: {
      pistonDiameterMm,
      shaftDiameterMm,
      positiveLengthMm,
      negativeVolumeCm3,
      spacerVolumeCm3,
      endStrokeVolumeCm3,
      polytropicIndex,
    },
    defaulted,
    row,
  };
}

/** The fork row whose stanchion is nearest the given one. */
export function forkRow(stanchionMm: number): (typeof FORK_GEOMETRY_TABLE)[number] {
  return FORK_GEOMETRY_TABLE.reduce((best, r) =>
    Math.abs(r.stanchionMm - stanchionMm) < Math.abs(best.stanchionMm - stanchionMm) ? r : best,
  );
}

/** The shock row for a stroke. */
export function shockRow(strokeMm: number): (typeof SHOCK_GEOMETRY_TABLE)[number] {
  return SHOCK_GEOMETRY_TABLE.find((r) => strokeMm <= r.upToStrokeMm) ?? SHOCK_GEOMETRY_TABLE[0];
}

/** Fork geometry: the rider's values where given, the defaults for the rest (rounded as shown). */
export function forkGeometry(
  stanchionMm: number,
  travelMm: number,
  withEndStroke: boolean,
  given?: Partial<AirSpringGeometry>,
): ResolvedGeometry {
  const r = forkRow(stanchionMm);
  const perTravel = withEndStroke
    ? FORK_RULES.positiveLengthPerTravelWithEndStroke
    : FORK_RULES.positiveLengthPerTravel;
  return resolve(
    given,
    {
      pistonDiameterMm: r.pistonDiameterMm,
      shaftDiameterMm: r.shaftDiameterMm,
      spacerVolumeCm3: r.spacerVolumeCm3,
      positiveLength: () => round(perTravel * travelMm, 0),
      negativeVolume: (D, d) =>
        round(
          (mm2ToCm2(circleArea(D) - circleArea(Math.min(d, D))) *
            FORK_RULES.negativeLengthPerTravel *
            travelMm) /
            10,
          1,
        ),
      endStrokeVolume: (D, L0) =>
        round((mm2ToCm2(circleArea(D)) * L0 * FORK_RULES.endStrokeVolumePerPositive) / 10, 1),
    },
    `${r.stanchionMm} mm stanchions`,
  );
}

/** Shock geometry: the rider's values where given, the defaults for the rest. */
export function shockGeometry(strokeMm: number, given?: Partial<AirSpringGeometry>): ResolvedGeometry {
  const r = shockRow(strokeMm);
  return resolve(
    given,
    {
      pistonDiameterMm: r.pistonDiameterMm,
      shaftDiameterMm: r.shaftDiameterMm,
      spacerVolumeCm3: r.spacerVolumeCm3,
      positiveLength: () => round(SHOCK_RULES.positiveLengthPerStroke * strokeMm, 1),
      negativeVolume: (D, d) =>
        round(
          (mm2ToCm2(circleArea(D) - circleArea(Math.min(d, D))) *
            SHOCK_RULES.negativeLengthPerStroke *
            strokeMm) /
            10,
          1,
        ),
      endStrokeVolume: () => 0,
    },
    r.upToStrokeMm === Infinity
      ? `strokes over ${SHOCK_GEOMETRY_TABLE[SHOCK_GEOMETRY_TABLE.length - 2].upToStrokeMm} mm`
      : `strokes up to ${r.upToStrokeMm} mm`,
  );
}
