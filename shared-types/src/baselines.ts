import type { RidingFeel, RidingStyle, SpringType } from './enums';

/**
 * The compute contract of SPRING-MODEL.md (docs/spring-model.md): what the rider sends to
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
  /** share of the rider's weight on the front wheel, standing (default about 0.42) */
  frontShare?: number;
}

export interface RidingInput {
  style: RidingStyle;
  feel: RidingFeel;
}

export interface ConditionsInput {
  altitudeM?: number;
  temperatureC?: number;
}

export interface ForkInput {
  travelMm: number;
  stanchionMm: number;
  spring: SpringType;
  spacers: number;
  endStroke?: { pressurePsi: number };
  maxPressurePsi?: number;
  targetSagPct?: number;
  geometry?: Partial<AirSpringGeometry>;
}

export interface ShockInput {
  strokeMm: number;
  wheelTravelMm: number;
  spring: SpringType;
  spacers: number;
  maxPressurePsi?: number;
  targetSagPct?: number;
  geometry?: Partial<AirSpringGeometry>;
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
  /** the unrounded solve; screens round to 1 psi / 0.1 bar */
  psi: number;
  bar: number;
  rangePsi: [number, number];
}

export interface CoilRateResult {
  nPerMm: number;
  lbPerIn: number;
  /** nearest stocked rate */
  suggestedLbPerIn: number;
}

export interface BaselineWarning {
  /** stable code, e.g. `above-max-pressure`, `below-min-pressure`, `sag-out-of-range`, `no-full-travel` */
  code: string;
  message: string;
}

/** One overlay curve on the force–travel chart. */
export interface CurveOverlay {
  /** what differs from the baseline curve, e.g. "+2 spacers", "end-stroke 200 psi", "fast hit (n = 1.4)" */
  label: string;
  kind: 'spacers' | 'end-stroke' | 'fast-hit';
  /** spacers fitted in total (kind `spacers`) */
  spacers?: number;
  /** end-stroke pressure (kind `end-stroke`) */
  endStrokePsi?: number;
  curve: CurvePoint[];
  progression: number;
  /** travel used under the hard-landing load; equals travel when it bottoms out */
  travelUsedMm: number;
}

export interface PartResult {
  travelMm: number;
  targetSagPct: number;
  targetSagMm: number;
  /** static load on the spring at sag (for a shock: at the shock, through the leverage ratio) */
  loadN: number;
  pressure: PressureResult | null;
  coilRate: CoilRateResult | null;
  /** force–travel at the baseline pressure, n = 1 */
  curve: CurvePoint[];
  /** F at 90 % travel ÷ F at sag */
  progression: number;
  /** the hard-landing load used for `travelUsedMm` (a labelled multiple of the static load) */
  hardLandingLoadN: number;
  travelUsedMm: number;
  overlays: CurveOverlay[];
  warnings: BaselineWarning[];
}

export interface ShockResult extends PartResult {
  leverageRatio: number;
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
  targetSagMm: number;
  newPressurePsi: number;
  /** positive: add air; negative: let air out */
  changePsi: number;
}
