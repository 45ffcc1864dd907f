import type { AirSpringGeometry } from '@loamline/shared-types';
import { circleArea } from './units';

/**
 * Default air-spring geometry for riders who do not know their spring. All of it is an ESTIMATE
 * (Loamline's own, not measured on any product), calibrated so that the plausibility bands of
 * docs/spring-model.md hold; every value can be overridden in `geometry`.
 */
export const GEOMETRY_SOURCE = "estimate (Loamline's default geometry)";

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
 * Shocks, by stroke: air piston and shaft, and the volume one spacer takes, at three reference
 * strokes. Strokes between them are interpolated; outside them, extrapolated (and labelled so).
 * One spacer is about 1/40 of the positive chamber at its reference stroke.
 */
export const SHOCK_GEOMETRY_TABLE: readonly {
  strokeMm: number;
  pistonDiameterMm: number;
  shaftDiameterMm: number;
  spacerVolumeCm3: number;
}[] = [
  { strokeMm: 45, pistonDiameterMm: 47, shaftDiameterMm: 10, spacerVolumeCm3: 2.8 },
  { strokeMm: 60, pistonDiameterMm: 49, shaftDiameterMm: 10, spacerVolumeCm3: 4.5 },
  { strokeMm: 75, pistonDiameterMm: 51, shaftDiameterMm: 12, spacerVolumeCm3: 6.1 },
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
  /** true when a default was taken from past the table's end (the input lies outside it) */
  extrapolated: boolean;
}

/** Extrapolating a table down never makes a spacer smaller than this, cm³ (an estimate). */
export const MIN_SPACER_CM3 = 0.5;

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
  extrapolated: boolean,
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
    // only a default read from the table is extrapolated; the rider's own values are not
    extrapolated:
      extrapolated &&
      (['pistonDiameterMm', 'shaftDiameterMm', 'spacerVolumeCm3'] as GeometryKey[]).some((k) =>
        defaulted.includes(k),
      ),
  };
}

type Row = Record<string, number>;

/** Where a default came from: a table row, between two rows, or past the table's end. */
export interface TableLookup<R extends Row> {
  values: R;
  /** for the assumptions list, e.g. "36 mm stanchions", "between 34 and 35 mm stanchions" */
  row: string;
  extrapolated: boolean;
}

/**
 * Linear interpolation in a table sorted by `key`; past either end, the end segment is extended
 * (extrapolated). No value jumps at a row boundary.
 */
export function interpolateTable<R extends Row>(
  table: readonly R[],
  key: keyof R & string,
  at: number,
  unitLabel: (v: number) => string,
): TableLookup<R> {
  const n = table.length;
  const k = (r: R) => r[key];
  let i = table.findIndex((r) => k(r) >= at);
  if (i >= 0 && k(table[i]) === at) {
    return { values: { ...table[i] }, row: unitLabel(k(table[i])), extrapolated: false };
  }
  const extrapolated = i <= 0;
  if (i === -1) i = n - 1;
  if (i === 0) i = 1;
  const a = table[i - 1];
  const b = table[i];
  const t = (at - k(a)) / (k(b) - k(a));
  const values: Row = {};
  for (const field of Object.keys(a)) values[field] = a[field] + t * (b[field] - a[field]);
  values[key] = at;
  const below = at < k(table[0]);
  const row = extrapolated
    ? `extrapolated past the table, whose ${below ? 'smallest' : 'largest'} row is ${unitLabel(k(below ? table[0] : table[n - 1]))}`
    : `interpolated between ${unitLabel(k(a))} and ${unitLabel(k(b))}`;
  return { values: values as R, row, extrapolated };
}

const stanchionLabel = (v: number) => `${v} mm stanchions`;
const strokeLabel = (v: number) => `a ${v} mm stroke`;

/** The fork table at a stanchion diameter (interpolated, or extrapolated outside 28–40 mm). */
export function forkRow(stanchionMm: number): TableLookup<(typeof FORK_GEOMETRY_TABLE)[number]> {
  return interpolateTable(FORK_GEOMETRY_TABLE, 'stanchionMm', stanchionMm, stanchionLabel);
}

/** The shock table at a stroke (interpolated, or extrapolated outside 45–75 mm). */
export function shockRow(strokeMm: number): TableLookup<(typeof SHOCK_GEOMETRY_TABLE)[number]> {
  return interpolateTable(SHOCK_GEOMETRY_TABLE, 'strokeMm', strokeMm, strokeLabel);
}

/** Defaults are kept to a thousandth: fine enough that no step in an input shows as a jump. */
const fine = (v: number) => round(v, 3);

/** Fork geometry: the rider's values where given, the defaults for the rest. */
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
      pistonDiameterMm: fine(r.values.pistonDiameterMm),
      shaftDiameterMm: fine(r.values.shaftDiameterMm),
      spacerVolumeCm3: fine(Math.max(MIN_SPACER_CM3, r.values.spacerVolumeCm3)),
      positiveLength: () => fine(perTravel * travelMm),
      negativeVolume: (D, d) =>
        fine(
          (mm2ToCm2(circleArea(D) - circleArea(Math.min(d, D))) *
            FORK_RULES.negativeLengthPerTravel *
            travelMm) /
            10,
        ),
      endStrokeVolume: (D, L0) =>
        fine((mm2ToCm2(circleArea(D)) * L0 * FORK_RULES.endStrokeVolumePerPositive) / 10),
    },
    r.row,
    r.extrapolated,
  );
}

/** Shock geometry: the rider's values where given, the defaults for the rest. */
export function shockGeometry(strokeMm: number, given?: Partial<AirSpringGeometry>): ResolvedGeometry {
  const r = shockRow(strokeMm);
  return resolve(
    given,
    {
      pistonDiameterMm: fine(r.values.pistonDiameterMm),
      shaftDiameterMm: fine(r.values.shaftDiameterMm),
      spacerVolumeCm3: fine(Math.max(MIN_SPACER_CM3, r.values.spacerVolumeCm3)),
      positiveLength: () => fine(SHOCK_RULES.positiveLengthPerStroke * strokeMm),
      negativeVolume: (D, d) =>
        fine(
          (mm2ToCm2(circleArea(D) - circleArea(Math.min(d, D))) *
            SHOCK_RULES.negativeLengthPerStroke *
            strokeMm) /
            10,
        ),
      endStrokeVolume: () => 0,
    },
    r.row,
    r.extrapolated,
  );
}
