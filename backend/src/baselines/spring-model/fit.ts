import type { AirSpringGeometry } from '@loamline/shared-types';
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { type AirCharge, type AirSpring, joinTravel, makeAirSpring, springForce } from './air-spring';
import { ambientPressure } from './atmosphere';
import { forkGeometry, type ResolvedGeometry, shockGeometry } from './defaults';
import { interpolate, leastSquaresCovariance, runsTest, sortedCurve } from './fit-math';
import { type Limit, LIMITS, requireInRange, SpringModelInputError } from './limits';
import { requireObject } from './resolve';
import { SAG_TABLE } from './sag-targets';
import { circleArea, cm3ToM3, mmToM, P_STD_PA, psiToPa } from './units';

/**
 * Fitting a measured spring (docs/spring-model.md, "Measured spring"): from force–travel runs taken
 * on a bench dyno at known pump settings, the geometry the model cannot know (the positive air
 * column L₀, the negative chamber V₋₀, the end-stroke chamber V_e) and a friction offset, with the
 * known geometry (bores, spacer volume, travel) held fixed. Pure functions; no I/O.
 */

export type FitPart = 'fork' | 'shock';
export type BenchStroke = 'compression' | 'rebound';
const STROKES: readonly BenchStroke[] = ['compression', 'rebound'];
const PARTS: readonly FitPart[] = ['fork', 'shock'];

/** One measured point: force against travel on one stroke direction. */
export interface BenchPoint {
  travelMm: number;
  forceN: number;
  stroke: BenchStroke;
}

/** One bench run of the part at one pump setting. */
export interface BenchRun {
  label: string;
  /** main-chamber gauge pressure at full extension, psi */
  mainPsi: number;
  /** end-stroke chamber gauge pressure, psi; null when none was set (or the part has none) */
  endStrokePsi: number | null;
  spacers: number;
  /** ambient absolute pressure where the run was pumped and measured, Pa (default: sea level, 101 325 Pa) */
  ambientPa?: number;
  points: BenchPoint[];
}

/**
 * The geometry the shop knows. Missing bores and spacer volume come from the default table
 * (defaults.ts): for a fork from `stanchionMm`, for a shock from its stroke (`travelMm`).
 */
export interface BenchKnownGeometry {
  /** travel (for a shock: its stroke), mm */
  travelMm: number;
  /** a fork's stanchion, mm: only used to look up the defaults of what is missing */
  stanchionMm?: number;
  pistonDiameterMm?: number;
  shaftDiameterMm?: number;
  spacerVolumeCm3?: number;
}

/** The known geometry with every default filled in. */
export interface ResolvedBenchGeometry {
  travelMm: number;
  pistonDiameterMm: number;
  shaftDiameterMm: number;
  spacerVolumeCm3: number;
  /** the `known.*` fields taken from the default table */
  defaulted: string[];
}

/** The geometry the fit finds. */
export interface FittedGeometry {
  positiveLengthMm: number;
  negativeVolumeCm3: number;
  /** null: no end-stroke chamber, or no run reached the travel where it joins */
  endStrokeVolumeCm3: number | null;
}

export type FittedKey = 'positiveLengthMm' | 'negativeVolumeCm3' | 'endStrokeVolumeCm3' | 'frictionN';
const FITTED_KEYS: readonly FittedKey[] = [
  'positiveLengthMm',
  'negativeVolumeCm3',
  'endStrokeVolumeCm3',
  'frictionN',
];

export interface SpringFitInput {
  part: FitPart;
  known: BenchKnownGeometry;
  runs: BenchRun[];
  /** a starting point for the search, tried first (the defaults and a spread around them follow) */
  start?: Partial<FittedGeometry> & { frictionN?: number };
  /** polytropic index of the bench strokes (default 1: a slow stroke is isothermal) */
  polytropicIndex?: number;
}

export interface SpringFitResult {
  part: FitPart;
  known: ResolvedBenchGeometry;
  polytropicIndex: number;
  geometry: FittedGeometry;
  frictionN: number;
  /** root mean square of measured − model over every point, N */
  rmsN: number;
  /** rmsN ÷ the range of the measured forces */
  relativeRms: number;
  forceRangeN: number;
  perRun: {
    label: string;
    rmsN: number;
    points: number;
    /** whether the run reached the travel where its end-stroke chamber joins; null without one */
    reachesEndStroke: boolean | null;
  }[];
  identified: Record<FittedKey, boolean>;
  /** one standard error of each fitted value, from σ²(JᵀJ)⁻¹; null where it cannot be computed */
  standardErrors: Record<FittedKey, number | null>;
  /** the runs test on the residual signs (z below `FIT_THRESHOLDS.systematicRunsZ`: systematic) */
  residualRuns: { runs: number; expected: number; z: number };
  quality: 'good' | 'poor';
  /** why the quality is poor (empty when good) */
  reasons: string[];
  /** what the data could not pin down, and other notes that do not make the fit poor */
  notes: string[];
}

/** Polytropic index of a slow bench stroke: isothermal (see the doc). */
export const BENCH_POLYTROPIC_INDEX = 1;

/** The fit's thresholds, each explained in docs/spring-model.md. */
export const FIT_THRESHOLDS = {
  /** fewest points a run may have */
  minPointsPerRun: 10,
  /** a fitted value counts as identified when one standard error is below this share of it */
  identifiedRelativeSe: 0.1,
  /** friction also counts as identified when its standard error is below this share of the force range */
  frictionSeShareOfRange: 0.005,
  /** a run reaches the end-stroke chamber when at least this many of its points lie past the join */
  minPointsBeyondJoin: 3,
  /** quality is poor above this relative RMS (load-cell accuracy plus friction scatter; common practice, no source) */
  poorRelativeRms: 0.03,
  /** residuals are systematic when the runs test's z is below this (one-sided p ≈ 0.13 %) … */
  systematicRunsZ: -3,
  /** … and the relative RMS is at least this (a pattern below load-cell accuracy does not matter) */
  systematicRelativeRmsFloor: 0.005,
};

/** What compareRun reads, as shares of travel. */
export const COMPARE_SETTINGS = {
  /** force near the end of travel is read here */
  nearEndShare: 0.9,
  /** the friction band is averaged over mid-travel, from … to … */
  midTravelFrom: 0.2,
  midTravelTo: 0.8,
  /** a bump stop is only looked for past this share of travel */
  bumpStopFromShare: 0.5,
  /** bump-stop margin: the larger of this many standard deviations of (measured − model) at mid-travel … */
  bumpStopSigmas: 3,
  /** … and this share of the run's peak compression force */
  bumpStopShareOfPeak: 0.02,
  /** fewest points that must stay above the margin (one point could be noise) */
  bumpStopMinPoints: 2,
};

/* ------------------------------------------------------------------------------ input checks */

/** Ambient pressure a run may give: the standard atmosphere from 5000 m to −500 m (the altitude limits). */
const AMBIENT_LIMIT: Limit = {
  min: Math.floor(ambientPressure(LIMITS.altitudeM.max)),
  max: Math.ceil(ambientPressure(LIMITS.altitudeM.min)),
  unit: 'Pa',
};

function requireFinite(field: string, value: unknown): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new SpringModelInputError(field, 'must be a finite number');
  }
  return value;
}

function optionalInRange(field: string, value: unknown, limit: Limit): number | undefined {
  return value === undefined || value === null ? undefined : requireInRange(field, value, limit);
}

/** The known geometry, checked, with the defaults filled in for what is missing. */
export function resolveKnownGeometry(
  part: FitPart,
  known: BenchKnownGeometry,
  withEndStroke: boolean,
): { resolved: ResolvedBenchGeometry; defaults: ResolvedGeometry } {
  requireObject('known', known);
  const travelMm = requireInRange(
    'known.travelMm',
    known.travelMm,
    part === 'fork' ? LIMITS.forkTravelMm : LIMITS.shockStrokeMm,
  );
  const given: Partial<AirSpringGeometry> = {};
  const piston = optionalInRange('known.pistonDiameterMm', known.pistonDiameterMm, LIMITS.pistonDiameterMm);
  const shaft = optionalInRange('known.shaftDiameterMm', known.shaftDiameterMm, LIMITS.shaftDiameterMm);
  const spacer = optionalInRange('known.spacerVolumeCm3', known.spacerVolumeCm3, LIMITS.spacerVolumeCm3);
  if (piston !== undefined) given.pistonDiameterMm = piston;
  if (shaft !== undefined) given.shaftDiameterMm = shaft;
  if (spacer !== undefined) given.spacerVolumeCm3 = spacer;
  const missing = [piston, shaft, spacer].some((v) => v === undefined);
  let defaults: ResolvedGeometry;
  if (part === 'fork') {
    const stanchion = optionalInRange('known.stanchionMm', known.stanchionMm, LIMITS.stanchionMm);
    if (missing && stanchion === undefined) {
      throw new SpringModelInputError(
        'known.stanchionMm',
        'give the stanchion diameter, or the piston and shaft diameters and the spacer volume',
      );
    }
    // with every bore given the stanchion only labels the (unused) table row
    defaults = forkGeometry(stanchion ?? 36, travelMm, withEndStroke, given);
  } else {
    defaults = shockGeometry(travelMm, given);
  }
  const g = defaults.geometry;
  if (g.shaftDiameterMm > g.pistonDiameterMm) {
    throw new SpringModelInputError('known.shaftDiameterMm', 'the shaft cannot be wider than the air piston');
  }
  const knownKeys = ['pistonDiameterMm', 'shaftDiameterMm', 'spacerVolumeCm3'] as const;
  return {
    resolved: {
      travelMm,
      pistonDiameterMm: g.pistonDiameterMm,
      shaftDiameterMm: g.shaftDiameterMm,
      spacerVolumeCm3: g.spacerVolumeCm3,
      defaulted: knownKeys.filter((k) => defaults.defaulted.includes(k)).map((k) => `known.${k}`),
    },
    defaults,
  };
}

function requirePart(value: unknown): FitPart {
  if (typeof value !== 'string' || !(PARTS as readonly string[]).includes(value)) {
    throw new SpringModelInputError('part', `must be one of: ${PARTS.join(', ')}`);
  }
  return value as FitPart;
}

function requireIndex(field: string, value: unknown): number {
  if (value === undefined || value === null) return BENCH_POLYTROPIC_INDEX;
  return requireInRange(field, value, LIMITS.polytropicIndex);
}

/** Checks one run against the part and its travel. */
function checkRun(part: FitPart, run: BenchRun, field: string, travelMm: number, minPoints: number): void {
  requireObject(field, run);
  if (typeof run.label !== 'string') throw new SpringModelInputError(`${field}.label`, 'must be a string');
  requireInRange(`${field}.mainPsi`, run.mainPsi, LIMITS.measuredPressurePsi);
  if (run.endStrokePsi !== null && run.endStrokePsi !== undefined) {
    if (part === 'shock') {
      throw new SpringModelInputError(
        `${field}.endStrokePsi`,
        'a shock has no end-stroke chamber in the model',
      );
    }
    requireInRange(`${field}.endStrokePsi`, run.endStrokePsi, LIMITS.endStrokePsi);
  }
  const spacers = requireInRange(`${field}.spacers`, run.spacers, LIMITS.spacers);
  if (!Number.isInteger(spacers))
    throw new SpringModelInputError(`${field}.spacers`, 'must be a whole number');
  optionalInRange(`${field}.ambientPa`, run.ambientPa, AMBIENT_LIMIT);
  if (!Array.isArray(run.points)) throw new SpringModelInputError(`${field}.points`, 'must be a list');
  if (run.points.length < minPoints) {
    throw new SpringModelInputError(`${field}.points`, `needs at least ${minPoints} points`);
  }
  run.points.forEach((p, j) => {
    const pf = `${field}.points[${j}]`;
    requireObject(pf, p);
    const t = requireFinite(`${pf}.travelMm`, p.travelMm);
    if (t < 0 || t > travelMm) {
      throw new SpringModelInputError(`${pf}.travelMm`, `must be from 0 to the travel, ${travelMm} mm`);
    }
    requireFinite(`${pf}.forceN`, p.forceN);
    if (!(STROKES as readonly unknown[]).includes(p.stroke)) {
      throw new SpringModelInputError(`${pf}.stroke`, `must be one of: ${STROKES.join(', ')}`);
    }
  });
}

/** Checks a geometry given to modelCurve or compareRun. */
function checkGeometry(geometry: FittedGeometry): void {
  requireObject('geometry', geometry);
  requireInRange('geometry.positiveLengthMm', geometry.positiveLengthMm, LIMITS.positiveLengthMm);
  requireInRange('geometry.negativeVolumeCm3', geometry.negativeVolumeCm3, LIMITS.negativeVolumeCm3);
  optionalInRange('geometry.endStrokeVolumeCm3', geometry.endStrokeVolumeCm3, LIMITS.endStrokeVolumeCm3);
}

/* ---------------------------------------------------------------------------- the model side */

/** The air spring of the known + fitted geometry with a run's spacers, in SI. */
function springOf(
  part: FitPart,
  known: ResolvedBenchGeometry,
  geometry: FittedGeometry,
  spacers: number,
): AirSpring {
  return makeAirSpring(
    {
      pistonDiameter: mmToM(known.pistonDiameterMm),
      shaftDiameter: mmToM(known.shaftDiameterMm),
      positiveLength: mmToM(geometry.positiveLengthMm),
      negativeVolume: cm3ToM3(geometry.negativeVolumeCm3),
      spacerVolume: cm3ToM3(known.spacerVolumeCm3),
      spacers,
      endStrokeVolume: cm3ToM3(geometry.endStrokeVolumeCm3 ?? 0),
      travel: mmToM(known.travelMm),
    },
    part,
  );
}

/** The gas charge of a run: gauge pressures read against the run's ambient pressure. */
function chargeOf(run: Pick<BenchRun, 'mainPsi' | 'endStrokePsi' | 'ambientPa'>, n: number): AirCharge {
  const pAmb = run.ambientPa ?? P_STD_PA;
  return {
    p0: psiToPa(run.mainPsi) + pAmb,
    pEnd:
      run.endStrokePsi === null || run.endStrokePsi === undefined ? null : psiToPa(run.endStrokePsi) + pAmb,
    pAmb,
    n,
  };
}

const strokeSign = (s: BenchStroke) => (s === 'compression' ? 1 : -1);

export interface ModelCurveInput {
  part: FitPart;
  known: BenchKnownGeometry;
  geometry: FittedGeometry;
  frictionN: number;
  mainPsi: number;
  endStrokePsi: number | null;
  spacers: number;
  /** Pa, default sea level */
  ambientPa?: number;
  /** default 1 (a slow stroke) */
  polytropicIndex?: number;
  travelsMm: number[];
}

export interface ModelCurvePoint {
  travelMm: number;
  /** the spring alone */
  springN: number;
  /** spring + friction: what a compression stroke measures */
  compressionN: number;
  /** spring − friction: what a rebound stroke measures */
  reboundN: number;
}

/** The model's force at the given travels, for a geometry, a pump setting and a friction offset. */
export function modelCurve(input: ModelCurveInput): ModelCurvePoint[] {
  requireObject('input', input);
  const part = requirePart(input.part);
  checkGeometry(input.geometry);
  const frictionN = requireFinite('frictionN', input.frictionN);
  const n = requireIndex('polytropicIndex', input.polytropicIndex);
  const { resolved } = resolveKnownGeometry(part, input.known, input.endStrokePsi !== null);
  requireInRange('mainPsi', input.mainPsi, LIMITS.measuredPressurePsi);
  if (input.endStrokePsi !== null) requireInRange('endStrokePsi', input.endStrokePsi, LIMITS.endStrokePsi);
  const spacers = requireInRange('spacers', input.spacers, LIMITS.spacers);
  optionalInRange('ambientPa', input.ambientPa, AMBIENT_LIMIT);
  if (!Array.isArray(input.travelsMm)) throw new SpringModelInputError('travelsMm', 'must be a list');
  const s = springOf(part, resolved, input.geometry, spacers);
  const c = chargeOf(input, n);
  return input.travelsMm.map((t, i) => {
    requireFinite(`travelsMm[${i}]`, t);
    if (t < 0 || t > resolved.travelMm) {
      throw new SpringModelInputError(
        `travelsMm[${i}]`,
        `must be from 0 to the travel, ${resolved.travelMm} mm`,
      );
    }
    const springN = springForce(s, c, mmToM(t));
    return { travelMm: t, springN, compressionN: springN + frictionN, reboundN: springN - frictionN };
  });
}

/* ----------------------------------------------------------------------------------- the fit */

/** One fitted parameter in its scaled form θ: L₀ in mm, ln(V/cm³) for a volume, friction in N. */
interface Param {
  key: FittedKey;
  min: number;
  max: number;
  /** finite-difference step in θ (none for friction, which enters linearly) */
  step: number | null;
}

interface Problem {
  part: FitPart;
  known: ResolvedBenchGeometry;
  n: number;
  params: Param[];
  runs: { run: BenchRun; charge: AirCharge }[];
  /** per point: run index, travel in m, measured force, ±1 for the stroke */
  runOf: number[];
  x: number[];
  y: number[];
  sign: number[];
  forceRange: number;
}

const index = (pr: Problem, key: FittedKey) => pr.params.findIndex((p) => p.key === key);

function geometryOf(pr: Problem, theta: readonly number[]): { geometry: FittedGeometry; frictionN: number } {
  const iN = index(pr, 'negativeVolumeCm3');
  const iE = index(pr, 'endStrokeVolumeCm3');
  return {
    geometry: {
      positiveLengthMm: theta[index(pr, 'positiveLengthMm')],
      negativeVolumeCm3: iN < 0 ? 0 : Math.exp(theta[iN]),
      endStrokeVolumeCm3: iE < 0 ? null : Math.exp(theta[iE]),
    },
    frictionN: theta[index(pr, 'frictionN')],
  };
}

/** The model at every point for a parameter vector θ, N. */
function evaluate(pr: Problem, theta: readonly number[]): number[] {
  const { geometry, frictionN } = geometryOf(pr, theta);
  const springs = new Map<number, AirSpring>();
  const springFor = (spacers: number) => {
    let s = springs.get(spacers);
    if (!s) {
      s = springOf(pr.part, pr.known, geometry, spacers);
      springs.set(spacers, s);
    }
    return s;
  };
  return pr.x.map((x, i) => {
    const r = pr.runs[pr.runOf[i]];
    return springForce(springFor(r.run.spacers), r.charge, x) + pr.sign[i] * frictionN;
  });
}

/** ∂model/∂θ at every point (N rows × p columns): central differences, friction exact. */
function jacobian(pr: Problem, theta: readonly number[]): number[][] {
  const rows = pr.x.map(() => new Array<number>(pr.params.length).fill(0));
  pr.params.forEach((p, k) => {
    if (p.step === null) {
      rows.forEach((row, i) => (row[k] = pr.sign[i]));
      return;
    }
    const up = [...theta];
    const down = [...theta];
    up[k] += p.step;
    down[k] -= p.step;
    const fUp = evaluate(pr, up);
    const fDown = evaluate(pr, down);
    rows.forEach((row, i) => (row[k] = (fUp[i] - fDown[i]) / (2 * p.step!)));
  });
  return rows;
}

/** Half the gap between compression and rebound over mid-travel, N; null without both strokes. */
function halfGap(points: readonly BenchPoint[], travelMm: number): number | null {
  const curve = (stroke: BenchStroke) =>
    sortedCurve(points.filter((p) => p.stroke === stroke).map((p) => ({ x: p.travelMm, y: p.forceN })));
  const comp = curve('compression');
  const reb = curve('rebound');
  if (comp.xs.length < 2 || reb.xs.length < 2) return null;
  const from = COMPARE_SETTINGS.midTravelFrom * travelMm;
  const to = COMPARE_SETTINGS.midTravelTo * travelMm;
  const gaps: number[] = [];
  comp.xs.forEach((x, i) => {
    if (x < from || x > to) return;
    const r = interpolate(reb.xs, reb.ys, x);
    if (r !== null) gaps.push((comp.ys[i] - r) / 2);
  });
  return gaps.length === 0 ? null : gaps.reduce((a, b) => a + b, 0) / gaps.length;
}

function setUp(input: SpringFitInput): {
  pr: Problem;
  defaults: ResolvedGeometry;
  hasBothStrokes: boolean;
  frictionGuess: number;
} {
  requireObject('input', input);
  const part = requirePart(input.part);
  const n = requireIndex('polytropicIndex', input.polytropicIndex);
  if (!Array.isArray(input.runs) || input.runs.length === 0) {
    throw new SpringModelInputError('runs', 'give at least one measured run');
  }
  const withEndStroke = input.runs.some((r) => r?.endStrokePsi !== null && r?.endStrokePsi !== undefined);
  const { resolved, defaults } = resolveKnownGeometry(part, input.known, withEndStroke);
  input.runs.forEach((run, i) =>
    checkRun(part, run, `runs[${i}]`, resolved.travelMm, FIT_THRESHOLDS.minPointsPerRun),
  );
  if (input.start !== undefined && input.start !== null) {
    requireObject('start', input.start);
    optionalInRange('start.positiveLengthMm', input.start.positiveLengthMm, LIMITS.positiveLengthMm);
    optionalInRange('start.negativeVolumeCm3', input.start.negativeVolumeCm3, LIMITS.negativeVolumeCm3);
    optionalInRange('start.endStrokeVolumeCm3', input.start.endStrokeVolumeCm3, LIMITS.endStrokeVolumeCm3);
    if (input.start.frictionN !== undefined) requireFinite('start.frictionN', input.start.frictionN);
  }

  const runOf: number[] = [];
  const x: number[] = [];
  const y: number[] = [];
  const sign: number[] = [];
  input.runs.forEach((run, i) =>
    run.points.forEach((p) => {
      runOf.push(i);
      x.push(mmToM(p.travelMm));
      y.push(p.forceN);
      sign.push(strokeSign(p.stroke));
    }),
  );
  const forceRange = Math.max(...y) - Math.min(...y);
  if (!(forceRange > 0)) throw new SpringModelInputError('runs', 'the measured forces do not vary');

  // Bounds: the chamber must stay open at full travel with the most spacers any run has
  // (L₀ > T + k·V_sp/A); the volumes stay within the model's input limits.
  const areaMm2 = circleArea(resolved.pistonDiameterMm);
  const annulusMm2 = areaMm2 - circleArea(resolved.shaftDiameterMm);
  const maxSpacers = Math.max(...input.runs.map((r) => r.spacers));
  const closingMm = resolved.travelMm + (maxSpacers * resolved.spacerVolumeCm3 * 1000) / areaMm2;
  const travelCm = resolved.travelMm / 10;
  const params: Param[] = [
    {
      key: 'positiveLengthMm',
      min: closingMm + Math.max(0.5, 0.01 * resolved.travelMm),
      max: Math.max(closingMm + 1, Math.min(LIMITS.positiveLengthMm.max, 8 * resolved.travelMm)),
      step: 1e-4 * resolved.travelMm,
    },
  ];
  if (annulusMm2 > 0) {
    params.push({
      key: 'negativeVolumeCm3',
      min: Math.log(0.1),
      max: Math.log(Math.min(LIMITS.negativeVolumeCm3.max, (20 * annulusMm2 * travelCm) / 100)),
      step: 1e-4,
    });
  }
  params.push({ key: 'frictionN', min: 0, max: forceRange, step: null });
  if (withEndStroke) {
    params.push({
      key: 'endStrokeVolumeCm3',
      min: Math.log(0.1),
      max: Math.log(Math.min(LIMITS.endStrokeVolumeCm3.max, (20 * areaMm2 * travelCm) / 100)),
      step: 1e-4,
    });
  }
  const pr: Problem = {
    part,
    known: resolved,
    n,
    params,
    runs: input.runs.map((run) => ({ run, charge: chargeOf(run, n) })),
    runOf,
    x,
    y,
    sign,
    forceRange,
  };
  const gaps = input.runs.map((r) => halfGap(r.points, resolved.travelMm)).filter((g) => g !== null);
  return {
    pr,
    defaults,
    hasBothStrokes: gaps.length > 0,
    frictionGuess: gaps.length > 0 ? Math.max(0, gaps.reduce((a, b) => a + b, 0) / gaps.length) : 0,
  };
}

/** Starting points: the caller's, the defaults, and a spread around the defaults (factors on L₀, V₋₀, V_e). */
const START_FACTORS: readonly [number, number, number][] = [
  [1, 1, 1],
  [0.8, 1, 1],
  [1.3, 1, 1],
  [1.8, 1, 1],
  [1, 0.4, 1],
  [1, 2.5, 1],
  [1.3, 0.4, 1],
  [0.8, 2.5, 1],
  [1, 1, 0.4],
  [1, 1, 2.5],
];

function startingPoints(
  pr: Problem,
  defaults: ResolvedGeometry,
  frictionGuess: number,
  start: SpringFitInput['start'],
): number[][] {
  const g = defaults.geometry;
  const clamp = (v: number, p: Param) => Math.min(p.max, Math.max(p.min, v));
  const theta = (l0: number, vNeg: number, vEnd: number, f: number) =>
    pr.params.map((p) => {
      switch (p.key) {
        case 'positiveLengthMm':
          return clamp(l0, p);
        case 'negativeVolumeCm3':
          return clamp(Math.log(Math.max(vNeg, 0.1)), p);
        case 'endStrokeVolumeCm3':
          return clamp(Math.log(Math.max(vEnd, 0.1)), p);
        default:
          return clamp(f, p);
      }
    });
  const out: number[][] = [];
  if (start) {
    out.push(
      theta(
        start.positiveLengthMm ?? g.positiveLengthMm,
        start.negativeVolumeCm3 ?? g.negativeVolumeCm3,
        start.endStrokeVolumeCm3 ?? g.endStrokeVolumeCm3,
        start.frictionN ?? frictionGuess,
      ),
    );
  }
  for (const [a, b, c] of START_FACTORS) {
    out.push(theta(a * g.positiveLengthMm, b * g.negativeVolumeCm3, c * g.endStrokeVolumeCm3, frictionGuess));
  }
  return out;
}

/** One damped least-squares search (ml-levenberg-marquardt) from θ₀, on residuals scaled by the force range. */
function search(pr: Problem, theta0: number[]): { theta: number[]; sse: number } {
  const scale = pr.forceRange;
  const indices = pr.x.map((_, i) => i);
  const result = levenbergMarquardt(
    { x: indices, y: pr.y.map((v) => v / scale) },
    (theta) => {
      const m = evaluate(pr, theta);
      return (i) => m[i] / scale;
    },
    {
      initialValues: theta0,
      minValues: pr.params.map((p) => p.min),
      maxValues: pr.params.map((p) => p.max),
      damping: 1e-2,
      maxIterations: 60,
      errorTolerance: 1e-14,
      jacobianFunction: (theta) => {
        const j = jacobian(pr, theta);
        return (i) => j[i].map((v) => v / scale);
      },
    },
  );
  return { theta: result.parameterValues, sse: result.parameterError };
}

const fitsEndStroke = (pr: Problem) => index(pr, 'endStrokeVolumeCm3') >= 0;

const LABELS: Record<FittedKey, string> = {
  positiveLengthMm: 'positive air column (mm)',
  negativeVolumeCm3: 'negative chamber volume (cm³)',
  endStrokeVolumeCm3: 'end-stroke chamber volume (cm³)',
  frictionN: 'friction (N)',
};

const pct = (v: number, digits = 1) => `${(v * 100).toFixed(digits)} %`;

/** Fits the unknown geometry and a friction offset to the measured runs. */
export function fitSpring(input: SpringFitInput): SpringFitResult {
  const { pr, defaults, hasBothStrokes, frictionGuess } = setUp(input);
  let best: { theta: number[]; sse: number } | null = null;
  for (const theta0 of startingPoints(pr, defaults, frictionGuess, input.start)) {
    const r = search(pr, theta0);
    if (Number.isFinite(r.sse) && (best === null || r.sse < best.sse)) best = r;
  }
  if (best === null) throw new SpringModelInputError('runs', 'no geometry fits these runs');
  const theta = best.theta;
  const model = evaluate(pr, theta);
  const residuals = pr.y.map((v, i) => v - model[i]);
  const { geometry, frictionN } = geometryOf(pr, theta);
  const reasons: string[] = [];
  const notes: string[] = [];
  const T = FIT_THRESHOLDS;

  // Which end-stroke runs reached the join (with the fitted geometry)?
  const reaches = pr.runs.map((r, i) => {
    if (r.charge.pEnd === null || geometry.endStrokeVolumeCm3 === null) return null;
    const s = springOf(pr.part, pr.known, geometry, r.run.spacers);
    const xj = joinTravel(s, r.charge)!;
    const beyond = pr.x.filter((x, k) => pr.runOf[k] === i && x > xj).length;
    return beyond >= T.minPointsBeyondJoin;
  });
  const endStrokeReached = reaches.some((r) => r === true);

  // Standard errors from the Jacobian at the solution (without V_e when it never acted).
  const used = pr.params
    .map((p, k) => ({ p, k }))
    .filter(({ p }) => p.key !== 'endStrokeVolumeCm3' || endStrokeReached);
  const jFull = jacobian(pr, theta);
  const cov = leastSquaresCovariance(
    jFull.map((row) => used.map(({ k }) => row[k])),
    residuals,
  );
  const seTheta = new Map<FittedKey, number | null>();
  used.forEach(({ p }, u) => {
    const v = cov?.[u][u];
    seTheta.set(p.key, v !== undefined && v >= 0 && Number.isFinite(v) ? Math.sqrt(v) : null);
  });
  const atBound = (key: FittedKey) => {
    const k = index(pr, key);
    if (k < 0) return false;
    const p = pr.params[k];
    const tol = 1e-6 * (p.max - p.min);
    return theta[k] <= p.min + tol || theta[k] >= p.max - tol;
  };

  const standardErrors: Record<FittedKey, number | null> = {
    positiveLengthMm: seTheta.get('positiveLengthMm') ?? null,
    negativeVolumeCm3: null,
    endStrokeVolumeCm3: null,
    frictionN: seTheta.get('frictionN') ?? null,
  };
  const seLnNeg = seTheta.get('negativeVolumeCm3') ?? null;
  if (seLnNeg !== null) standardErrors.negativeVolumeCm3 = geometry.negativeVolumeCm3 * seLnNeg;
  const seLnEnd = seTheta.get('endStrokeVolumeCm3') ?? null;
  if (seLnEnd !== null && geometry.endStrokeVolumeCm3 !== null) {
    standardErrors.endStrokeVolumeCm3 = geometry.endStrokeVolumeCm3 * seLnEnd;
  }

  const relSe: Record<FittedKey, number | null> = {
    positiveLengthMm:
      standardErrors.positiveLengthMm === null
        ? null
        : standardErrors.positiveLengthMm / geometry.positiveLengthMm,
    negativeVolumeCm3: seLnNeg,
    endStrokeVolumeCm3: seLnEnd,
    frictionN: null,
  };
  const precise = (key: FittedKey) => {
    const r = relSe[key];
    return r !== null && r < T.identifiedRelativeSe && !atBound(key);
  };
  const frictionSe = standardErrors.frictionN;
  const identified: Record<FittedKey, boolean> = {
    positiveLengthMm: precise('positiveLengthMm'),
    negativeVolumeCm3: index(pr, 'negativeVolumeCm3') >= 0 && precise('negativeVolumeCm3'),
    endStrokeVolumeCm3: endStrokeReached && precise('endStrokeVolumeCm3'),
    frictionN:
      hasBothStrokes &&
      frictionSe !== null &&
      frictionSe < Math.max(T.identifiedRelativeSe * frictionN, T.frictionSeShareOfRange * pr.forceRange),
  };

  // Quality
  const sse = residuals.reduce((s, r) => s + r * r, 0);
  const rmsN = Math.sqrt(sse / residuals.length);
  const relativeRms = rmsN / pr.forceRange;
  if (relativeRms > T.poorRelativeRms) {
    reasons.push(
      `the model misses the measured forces by ${pct(relativeRms)} of their range (RMS ${rmsN.toFixed(1)} N), more than ${pct(T.poorRelativeRms, 0)}: this does not behave like this air spring`,
    );
  }
  // Residual signs in order: run by run, compression then rebound, each by travel.
  const ordered: number[] = [];
  pr.runs.forEach((_, i) =>
    STROKES.forEach((stroke) => {
      const idx = pr.x
        .map((_x, k) => k)
        .filter((k) => pr.runOf[k] === i && pr.sign[k] === strokeSign(stroke))
        .sort((a, b) => pr.x[a] - pr.x[b]);
      idx.forEach((k) => ordered.push(residuals[k]));
    }),
  );
  const rt = runsTest(ordered);
  if (rt.z < T.systematicRunsZ && relativeRms >= T.systematicRelativeRmsFloor) {
    reasons.push(
      `the residuals are systematic: ${rt.runs} runs of one sign where about ${Math.round(rt.expected)} are expected by chance (runs test z = ${rt.z.toFixed(1)}); the curve's shape is not an air spring's (a coil, a bump stop or a leak?)`,
    );
  }
  for (const key of ['positiveLengthMm', 'negativeVolumeCm3', 'endStrokeVolumeCm3'] as const) {
    if (key === 'endStrokeVolumeCm3' && !endStrokeReached) continue;
    if (atBound(key)) {
      reasons.push(
        `the fitted ${LABELS[key]} ran to the edge of its allowed range: no plausible air spring fits`,
      );
    }
  }
  for (const key of FITTED_KEYS) {
    if (identified[key]) continue;
    if (key === 'endStrokeVolumeCm3') {
      if (!fitsEndStroke(pr)) continue;
      if (!endStrokeReached) {
        notes.push(
          `the end-stroke chamber volume is not identified: no run reached the travel where the chamber joins (${T.minPointsBeyondJoin} points past it are needed); measure with a lower end-stroke pressure or a higher main pressure`,
        );
        continue;
      }
    }
    if (key === 'frictionN' && !hasBothStrokes) {
      notes.push('friction is not identified: no run has both a compression and a rebound stroke');
      continue;
    }
    if (key === 'negativeVolumeCm3' && index(pr, key) < 0) {
      notes.push('there is no negative chamber: the shaft fills the bore');
      continue;
    }
    const se = standardErrors[key];
    notes.push(
      se === null
        ? `the ${LABELS[key]} is not identified: the runs do not move it`
        : `the ${LABELS[key]} is not identified: its standard error (${se.toPrecision(2)}) is too large for ${pct(T.identifiedRelativeSe, 0)} precision`,
    );
  }

  return {
    part: pr.part,
    known: pr.known,
    polytropicIndex: pr.n,
    geometry: {
      positiveLengthMm: geometry.positiveLengthMm,
      negativeVolumeCm3: geometry.negativeVolumeCm3,
      endStrokeVolumeCm3: endStrokeReached ? geometry.endStrokeVolumeCm3 : null,
    },
    frictionN,
    rmsN,
    relativeRms,
    forceRangeN: pr.forceRange,
    perRun: pr.runs.map((r, i) => {
      const res = residuals.filter((_, k) => pr.runOf[k] === i);
      return {
        label: r.run.label,
        rmsN: Math.sqrt(res.reduce((s, v) => s + v * v, 0) / res.length),
        points: res.length,
        reachesEndStroke: reaches[i],
      };
    }),
    identified,
    standardErrors,
    residualRuns: { runs: rt.runs, expected: rt.expected, z: rt.z },
    quality: reasons.length === 0 ? 'good' : 'poor',
    reasons,
    notes,
  };
}

/* ------------------------------------------------------------------------- comparing one run */

export interface CompareRunInput {
  part: FitPart;
  known: BenchKnownGeometry;
  geometry: FittedGeometry;
  frictionN: number;
  run: BenchRun;
  /** sag at which to compare, % of travel (default: the trail target of the sag table, balanced feel) */
  sagPct?: number;
  polytropicIndex?: number;
}

/** Measured against model on the compression stroke at one travel. */
export interface ForceComparison {
  travelMm: number;
  measuredN: number;
  /** spring + friction */
  modelN: number;
  differenceN: number;
}

export interface RunComparison {
  label: string;
  /** null when the compression stroke does not span the travel */
  atSag: ForceComparison | null;
  /** at `COMPARE_SETTINGS.nearEndShare` of travel */
  nearEnd: ForceComparison | null;
  /** half the gap between compression and rebound, averaged over mid-travel; null without both strokes */
  frictionBandN: number | null;
  /** the margin measured − model must exceed for a bump stop, N */
  marginN: number | null;
  /**
   * where the measured compression curve leaves the model near the end of travel: the travel past
   * which measured − model exceeds the margin (interpolated) and keeps growing; null when it does not
   */
  bumpStop: { travelMm: number; excessAtEndN: number } | null;
}

/** Compares one measured run with the model of a geometry: sag, near the end, friction and a bump stop. */
export function compareRun(input: CompareRunInput): RunComparison {
  requireObject('input', input);
  const part = requirePart(input.part);
  checkGeometry(input.geometry);
  const frictionN = requireFinite('frictionN', input.frictionN);
  const n = requireIndex('polytropicIndex', input.polytropicIndex);
  const withEnd = input.run?.endStrokePsi !== null && input.run?.endStrokePsi !== undefined;
  const { resolved } = resolveKnownGeometry(part, input.known, withEnd);
  const T = resolved.travelMm;
  checkRun(part, input.run, 'run', T, FIT_THRESHOLDS.minPointsPerRun);
  const sagPct = optionalInRange('sagPct', input.sagPct, LIMITS.targetSagPct) ?? SAG_TABLE[part].trail;
  const s = springOf(part, resolved, input.geometry, input.run.spacers);
  const c = chargeOf(input.run, n);
  const model = (t: number) => springForce(s, c, mmToM(t)) + frictionN;
  const comp = sortedCurve(
    input.run.points.filter((p) => p.stroke === 'compression').map((p) => ({ x: p.travelMm, y: p.forceN })),
  );
  const at = (t: number): ForceComparison | null => {
    const m = interpolate(comp.xs, comp.ys, t);
    if (m === null) return null;
    const modelN = model(t);
    return { travelMm: t, measuredN: m, modelN, differenceN: m - modelN };
  };

  const cs = COMPARE_SETTINGS;
  // measured − model on compression; its level and scatter at mid-travel, where no bump stop acts
  const d = comp.xs.map((x, i) => comp.ys[i] - model(x));
  const mid = d.filter((_, i) => comp.xs[i] >= cs.midTravelFrom * T && comp.xs[i] <= cs.midTravelTo * T);
  let bumpStop: RunComparison['bumpStop'] = null;
  let marginN: number | null = null;
  if (mid.length >= 2) {
    const level = mid.reduce((a, b) => a + b, 0) / mid.length;
    const sd = Math.sqrt(mid.reduce((a, v) => a + (v - level) ** 2, 0) / (mid.length - 1));
    const peak = Math.max(...comp.ys);
    marginN = Math.max(cs.bumpStopSigmas * sd, cs.bumpStopShareOfPeak * Math.abs(peak));
    const e = d.map((v) => v - level);
    // the longest tail (from the end) that stays above the margin
    let first = e.length;
    while (first > 0 && e[first - 1] > marginN && comp.xs[first - 1] >= cs.bumpStopFromShare * T) first--;
    const tail = e.slice(first);
    // keeps growing: never drops by more than the margin, and ends higher than it starts
    const growing =
      tail.length >= cs.bumpStopMinPoints &&
      tail.every((v, i) => i === 0 || v >= tail[i - 1] - marginN!) &&
      tail[tail.length - 1] > tail[0];
    if (growing) {
      let travelMm = comp.xs[first];
      if (first > 0) {
        // where the excess crosses the margin, between the last point below and the first above
        const x0 = comp.xs[first - 1];
        const e0 = e[first - 1];
        travelMm = x0 + ((marginN - e0) / (e[first] - e0)) * (comp.xs[first] - x0);
      }
      bumpStop = { travelMm, excessAtEndN: tail[tail.length - 1] };
    }
  }

  return {
    label: input.run.label,
    atSag: at((sagPct / 100) * T),
    nearEnd: at(cs.nearEndShare * T),
    frictionBandN: halfGap(input.run.points, T),
    marginN,
    bumpStop,
  };
}
