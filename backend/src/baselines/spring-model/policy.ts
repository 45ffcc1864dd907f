/**
 * What the model assumes beyond physics: the estimates and trade practice it works with, each
 * labelled. One place, so that the baseline, the sag check and the docs agree.
 */

/**
 * A hard landing loads the spring with this multiple of its static load, on the fast-hit curve (an
 * estimate: at the fast-hit index it lets a trail baseline use about 90 % of its travel).
 */
export const HARD_LANDING_MULTIPLE = 5;
/** The pressure range spans the target sag ± this many points (the load is uncertain). */
export const SAG_RANGE_POINTS = 3;
/** Points on each force–travel curve, from full extension to full travel. */
export const CURVE_POINTS = 51;
/** Below this share of travel used on a hard landing the spring is too progressive for the rider (an estimate). */
export const FULL_TRAVEL_SHARE = 0.75;
/** A hard landing that gets within this of full travel counts as bottoming out. */
export const BOTTOM_OUT_TOLERANCE_MM = 0.5;
/** Sag outside this band is unusual enough to warn about (common practice, no source). */
export const SAG_WARN_BAND = { minPct: 10, maxPct: 40 };
/** Rated maximum when the rider gives none (common practice, no source; the part's own rating comes first). */
export const DEFAULT_MAX_PSI: Record<'fork' | 'shock', number> = { fork: 150, shock: 350 };
/** Below this the seals and negative chamber work poorly (common practice, no source). */
export const DEFAULT_MIN_PSI: Record<'fork' | 'shock', number> = { fork: 30, shock: 50 };
/**
 * An end-stroke chamber's rated maximum when the rider gives none (an estimate; the rating printed
 * on the fork or in its manual comes first).
 */
export const DEFAULT_END_STROKE_MAX_PSI = 300;
/**
 * The recommended end-stroke pressure starts at this multiple of the main chamber's (common
 * practice, no source: about 2–3 × the main pressure) and rises in steps of 5 psi until a hard
 * landing keeps travel in reserve.
 */
export const END_STROKE_START_MULTIPLE = 2;
export const END_STROKE_STEP_PSI = 5;
/**
 * The recommended end-stroke pressure keeps this share of travel unused on a hard landing, so that a
 * gauge a few psi off does not bottom out (an estimate).
 */
export const END_STROKE_RESERVE_SHARE = 0.03;
/** An average leverage ratio outside this band is unusual (common practice, no source). */
export const LEVERAGE_RATIO_BAND = { min: 1.8, max: 3.6 };
export const DEFAULT_ALTITUDE_M = 0;
/** Pumped and ridden this far apart in altitude, the answer explains the gauge difference (about 0.2 psi per 100 m). */
export const PUMP_ALTITUDE_NOTE_M = 100;
export const DEFAULT_TEMPERATURE_C = 20;
/** Where riders usually pump (indoors), for the temperature note. */
export const INDOOR_TEMPERATURE_C = 20;
/** End-stroke overlays: the pressure in use times these factors, rounded to 5 psi. */
export const END_STROKE_OVERLAY_FACTORS = [0.8, 1.2, 1.4];
/** Spacer overlays: from none fitted up to this many more than fitted. */
export const SPACER_OVERLAYS_ABOVE = 3;
/**
 * A sag check starts from a measurement; one that no rider on a working spring could take is
 * refused rather than corrected: a sag under 5 % or over 60 % of travel (common practice, no
 * source), a pressure under half the sensible minimum or over the rated maximum.
 */
export const MEASURED_SAG_PLAUSIBLE_PCT = { min: 5, max: 60 };
export const MEASURED_MIN_SHARE_OF_MINIMUM = 0.5;

/** The six cautions of the product, in Loamline's words; shown with every baseline. */
export const CAUTIONS: readonly string[] = [
  'This is a starting point, not a finished setup: measure your sag, then ride somewhere safe and easy before you ride hard.',
  'Never go above the maximum pressure printed on your fork or shock or given in its manual. If the baseline is above that maximum or below the minimum, this spring does not suit you: ask a suspension technician.',
  'Use a shock pump with a gauge. Never open or take apart a chamber that still holds air, and remember that an end-stroke chamber can hold far more pressure than the main chamber.',
  'Air pressure drops in the cold and rises in the heat: check and set it at the temperature you ride in.',
  'If you notice a leak, a knock as the suspension tops out, or harsh bottoming, stop riding and have it inspected.',
  "Your fork or shock maker's manual and a qualified technician come first, and workshop work must follow local rules.",
];
