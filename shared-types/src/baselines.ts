import type { RidingFeel, RidingStyle, SpringType } from './enums';
import type { MeasuredSpring } from './reports';

/**
 * The compute contract (docs/spring-model.md): what the rider sends to
 * `POST /api/baselines/compute` and what the server answers. Units are in the field names.
 */

/** Air-spring geometry. Every field optional in a request: what is missing comes from the defaults table. */
export interface AirSpringGeometry {
  pistonDiameterMm: number;
  shaftDiameterMm: number;
  /** effective positive air column at full extension, L₀ (> travel) */
  positiveLengthMm: number;
  negativeVolumeCm3: number;
  spacerVolumeCm3: number;
  endStrokeVolumeCm3: number;
  polytropicIndex: number;
}

export interface RiderInput {
  /** the rider with riding gear */
  massKg: number;
  /**
   * share of the rider's weight on the front wheel, standing in the riding position, which is
   * where fork sag is measured (default 0.42)
   */
  frontShare?: number;
  /**
   * share of the rider's weight on the rear wheel, seated, which is where rear sag is measured
   * (default 0.72)
   */
  seatedRearShare?: number;
}

export interface RidingInput {
  style: RidingStyle;
  feel: RidingFeel;
}

export interface ConditionsInput {
  /** where you ride, m (default 0) */
  altitudeM?: number;
  /** where you pump and measure sag, m (default: where you ride) */
  pumpAltitudeM?: number;
  /** where you pump and ride, °C (default 20): the baseline is the gauge pressure at this temperature */
  temperatureC?: number;
}

/** A fork's end-stroke chamber. Without a pressure the model recommends one. */
export interface EndStrokeInput {
  /** the gauge pressure set (or to be set); leave out to get the recommended pressure */
  pressurePsi?: number;
  /** the chamber's own rated maximum (default: a labelled estimate) */
  maxPressurePsi?: number;
}

export interface ForkInput {
  travelMm: number;
  stanchionMm: number;
  spring: SpringType;
  spacers: number;
  endStroke?: EndStrokeInput;
  maxPressurePsi?: number;
  targetSagPct?: number;
  geometry?: Partial<AirSpringGeometry>;
  /**
   * the spring a shop measured on its bench dyno (air only): its positive air column, negative and
   * end-stroke volumes replace the defaults; explicit `geometry` values still win. `null` removes it
   * from a stored bike.
   */
  measured?: MeasuredSpring | null;
}

export interface ShockInput {
  strokeMm: number;
  wheelTravelMm: number;
  spring: SpringType;
  spacers: number;
  maxPressurePsi?: number;
  targetSagPct?: number;
  /** leverage ratio at sag, where the bike's leverage curve is known (default: wheel travel ÷ stroke) */
  leverageRatioAtSag?: number;
  geometry?: Partial<AirSpringGeometry>;
  /** the spring a shop measured (air only; see `ForkInput.measured`) */
  measured?: MeasuredSpring | null;
}

export interface BaselineInput {
  rider: RiderInput;
  riding: RidingInput;
  conditions?: ConditionsInput;
  fork: ForkInput | null;
  shock: ShockInput | null;
}

export interface CurvePoint {
  travelMm: number;
  forceN: number;
}

export interface PressureResult {
  /** the gauge pressure to set at the pump (its altitude and the riding temperature); unrounded, never below 0 */
  psi: number;
  bar: number;
  /** the pressures for target sag + 3 and − 3 points, rounded to 1 psi; never below 0 */
  rangePsi: [number, number];
  /** the same range in bar, rounded to 0.1 bar */
  rangeBar: [number, number];
  /** the rated maximum the warnings use: the rider's, or the labelled default */
  maxPsi: number;
  maxIsDefault: boolean;
  /** the sensible minimum (common practice) */
  minPsi: number;
  /** what the gauge reads where you ride, when that is at another altitude than the pump; else null */
  atRidePsi: number | null;
}

/** A fork's end-stroke chamber: the pressure the result uses and the one recommended. */
export interface EndStrokeResult {
  /** the pressure the curves and advice use: the rider's, or the recommended one when none was given */
  psi: number;
  bar: number;
  /** true when the rider gave the pressure */
  given: boolean;
  /**
   * the lowest pressure (5 psi steps, at least twice the main chamber's) at which a hard landing
   * keeps some travel in reserve, never above `maxPsi`
   */
  recommendedPsi: number;
  recommendedBar: number;
  /** travel used on a hard landing at the recommended pressure */
  recommendedTravelUsedMm: number;
  /** the chamber's rated maximum: the rider's, or the labelled default */
  maxPsi: number;
  maxIsDefault: boolean;
}

export interface CoilRateResult {
  nPerMm: number;
  lbPerIn: number;
  /** nearest stocked rate */
  suggestedLbPerIn: number;
}

/**
 * `error`: a value past a maximum, or impossible: blocking, shown before the number it is about;
 * `warning`: the rider should act or check; `info`: advice and notes.
 */
export const WARNING_SEVERITIES = ['error', 'warning', 'info'] as const;
export type WarningSeverity = (typeof WARNING_SEVERITIES)[number];

export interface BaselineWarning {
  /** stable code, e.g. `above-max-pressure`, `below-min-pressure`, `sag-out-of-range`, `no-full-travel` */
  code: string;
  /** missing on sheets saved before severities existed: read it as `warning` */
  severity: WarningSeverity;
  message: string;
}

/**
 * One overlay curve on the force–travel chart, at the same main pressure. Every overlay curve is a
 * hard landing (the fast-hit index): `fast-hit` is the baseline itself, `spacers` another count
 * (fewer or more than fitted, 0…N), `end-stroke` another end-stroke pressure (never above its
 * maximum).
 */
export interface CurveOverlay {
  /** what differs from the baseline, e.g. "2 spacers (1 fewer)", "end-stroke 200 psi", "hard landing" */
  label: string;
  kind: 'spacers' | 'end-stroke' | 'fast-hit';
  /** spacers fitted in total (kind `spacers`) */
  spacers?: number;
  /** end-stroke pressure (kind `end-stroke`) */
  endStrokePsi?: number;
  curve: CurvePoint[];
  progression: number;
  /** travel used under the hard-landing load (fast-hit index); equals travel when it bottoms out */
  travelUsedMm: number;
}

export interface PartResult {
  travelMm: number;
  targetSagPct: number;
  targetSagMm: number;
  /** static load on the spring at sag (for a shock: at the shock, through the leverage ratio) */
  loadN: number;
  /** null for a coil, and for an air spring no positive pressure can set (an `error` warning says why) */
  pressure: PressureResult | null;
  coilRate: CoilRateResult | null;
  /** a fork's end-stroke chamber; null without one (and for any coil) */
  endStroke: EndStrokeResult | null;
  /** force–travel at the baseline pressure, slow compression (n = 1): the curve sag is read on */
  curve: CurvePoint[];
  /** spring rate at the target sag, slow compression, N/mm */
  rateAtSagNPerMm: number;
  /** energy the spring stores from full extension to full travel, slow compression, J */
  energyToFullTravelJ: number;
  /** F at 90 % travel ÷ F at sag, slow compression */
  progression: number;
  /** the hard-landing load used for `travelUsedMm` (a labelled multiple of the static load) */
  hardLandingLoadN: number;
  /** the polytropic index of a hard landing (up to γ = 1.4; 1 for a coil, which has no gas) */
  hardLandingIndex: number;
  /** travel used on a hard landing (fast-hit index) */
  travelUsedMm: number;
  overlays: CurveOverlay[];
  warnings: BaselineWarning[];
  /**
   * with a measured spring (`measured` on the input, and used): what the default geometry would have
   * given, so the rider sees how far the default was off. `differencePct` = 100 × (default − this
   * pressure) ÷ this pressure. Missing when either has no positive pressure.
   */
  measuredSpring?: MeasuredSpringResult;
}

export interface MeasuredSpringResult {
  /** "measured on 2 December 2026 at <shop>" */
  label: string;
  /** the baseline pressure (gauge psi) the default geometry gives for the same input */
  defaultPressurePsi: number;
  differencePct: number;
}

export interface ShockResult extends PartResult {
  /** the leverage ratio the load used: at sag when given, else the average */
  leverageRatio: number;
  leverageRatioIsAverage: boolean;
  wheelSagMm: number;
}

/** A default or estimate the computation used, so the rider sees what was assumed. */
export interface Assumption {
  /** dotted path of the input it stands for, e.g. `fork.geometry.pistonDiameterMm`, `rider.frontShare` */
  key: string;
  label: string;
  value: number | string;
  unit?: string;
  /** where the value comes from: "estimate", "common practice, no source", "NIST SP 811" … */
  source: string;
}

export interface BaselineResult {
  fork: PartResult | null;
  shock: ShockResult | null;
  cautions: string[];
  assumptions: Assumption[];
}

export interface SagCheckInput extends BaselineInput {
  measured: { part: 'fork' | 'shock'; pressurePsi: number; sagMm: number };
}

export interface SagCheckResult {
  measuredSagPct: number;
  targetSagPct: number;
  targetSagMm: number;
  /**
   * the gauge pressure for the target sag; null when no positive pressure reaches it (an `error`
   * warning says why). Past a maximum it is still given, with an `error` warning before it.
   */
  newPressurePsi: number | null;
  newPressureBar: number | null;
  /** positive: add air; negative: let air out; null with newPressurePsi */
  changePsi: number | null;
  /** the main chamber's rated maximum and sensible minimum the warnings use */
  maxPsi: number;
  maxIsDefault: boolean;
  minPsi: number;
  /** the same warnings as the baseline gives for a pressure, `error` first */
  warnings: BaselineWarning[];
}
