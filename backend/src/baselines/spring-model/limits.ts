/**
 * What the model accepts: the input ranges (shared by the API's DTOs and the model's own checks)
 * and the typed error that names the input at fault.
 */

import { BASELINE_LIMITS, type Limit } from '@loamline/shared-types';

export type { Limit };

/** The input ranges, shared with the DTOs and the wizard (shared-types `BASELINE_LIMITS`). */
export const LIMITS = BASELINE_LIMITS;

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
