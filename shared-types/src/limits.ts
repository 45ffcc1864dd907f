/**
 * What the baseline model accepts: one list of input ranges for the server's DTOs, the model's own
 * checks, the wizard's schema and the garage form. Units are in the names.
 */

/** An inclusive range with its unit, for messages. */
export interface Limit {
  min: number;
  max: number;
  unit: string;
}

const l = (min: number, max: number, unit = ''): Limit => ({ min, max, unit });

/** Input ranges: wide enough for every bike the product serves, narrow enough to keep the physics sane. */
export const BASELINE_LIMITS = {
  massKg: l(20, 250, 'kg'),
  frontShare: l(0.3, 0.6),
  seatedRearShare: l(0.5, 0.9),
  altitudeM: l(-500, 5000, 'm'),
  temperatureC: l(-30, 50, '°C'),
  forkTravelMm: l(40, 250, 'mm'),
  stanchionMm: l(20, 45, 'mm'),
  shockStrokeMm: l(20, 110, 'mm'),
  wheelTravelMm: l(40, 260, 'mm'),
  leverageRatioAtSag: l(1.2, 4.5),
  spacers: l(0, 12),
  endStrokePsi: l(5, 1000, 'psi'),
  maxPressurePsi: l(10, 1000, 'psi'),
  targetSagPct: l(5, 50, '%'),
  pistonDiameterMm: l(10, 80, 'mm'),
  shaftDiameterMm: l(0, 80, 'mm'),
  positiveLengthMm: l(10, 1500, 'mm'),
  negativeVolumeCm3: l(0, 2000, 'cm³'),
  spacerVolumeCm3: l(0, 200, 'cm³'),
  endStrokeVolumeCm3: l(0, 2000, 'cm³'),
  polytropicIndex: l(1, 1.4),
  measuredPressurePsi: l(1, 1000, 'psi'),
  measuredSagMm: l(0.5, 260, 'mm'),
} as const satisfies Record<string, Limit>;
