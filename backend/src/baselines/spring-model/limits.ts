/**
 * What the model accepts: the input ranges (shared by the API's DTOs and the model's own checks)
 * and the typed error that names the input at fault.
 */

/** An inclusive range with its unit, for messages. */
export interface Limit {
  min: number;
  max: number;
  unit: string;
}

const l = (min: number, max: number, unit = ''): Limit => ({ min, max, unit });

/** Input ranges: wide enough for every bike the product serves, narrow enough to keep the physics sane. */
export const LIMITS = {
  massKg: l(20, 250, 'kg'),
  frontShare: l(0.3, 0.6),
  altitudeM: l(-500, 5000, 'm'),
  temperatureC: l(-30, 50, '°C'),
  forkTravelMm: l(40, 250, 'mm'),
  stanchionMm: l(20, 45, 'mm'),
  shockStrokeMm: l(20, 110, 'mm'),
  wheelTravelMm: l(40, 260, 'mm'),
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

/**
 * An input the model cannot compute from (a chamber closed by spacers, a sag beyond travel …).
 * `field` is the dotted path of the input at fault, as the API names it (e.g. `fork.spacers`).
 */
export class SpringModelInputError extends Error {
  override readonly name = 'SpringModelInputError';

  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
  }
}

/** Throws a SpringModelInputError unless `value` is a finite number within the limit. */
export function requireInRange(field: string, value: unknown, limit: Limit): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < limit.min || value > limit.max) {
    const unit = limit.unit ? ` ${limit.unit}` : '';
    throw new SpringModelInputError(field, `must be a number from ${limit.min} to ${limit.max}${unit}`);
  }
  return value;
}
