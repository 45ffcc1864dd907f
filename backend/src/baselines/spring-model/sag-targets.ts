import type { RidingFeel, RidingStyle } from '@loamline/shared-types';

/**
 * Target sag by riding style and feel, in one place. Common practice, no source: fork about
 * 15–20 % cross-country, 20–25 % trail, 25–30 % enduro and downhill; rear about 20–25 %, 25–30 %,
 * 28–33 %, 30–35 %; park and jump riding a little firmer than trail. The rear figure is a share of
 * the stroke, equal to the share of wheel travel at a constant leverage ratio.
 */
export const SAG_TABLE: Record<'fork' | 'shock', Record<RidingStyle, number>> = {
  fork: { 'cross-country': 18, trail: 23, enduro: 27, downhill: 28, park: 22 },
  shock: { 'cross-country': 23, trail: 28, enduro: 30, downhill: 32, park: 26 },
};

/** How the feel moves the target, in points of sag (common practice, no source). */
export const FEEL_SHIFT: Record<RidingFeel, number> = { supple: 2, balanced: 0, firm: -2 };

/**
 * A fork whose end-stroke chamber is set correctly can run a few points more sag than without it,
 * by style like every other target (common practice, no source): about 30–35 % on long travel for
 * the gravity styles, about 30 % at most on shorter travel; cross-country and park gain little.
 */
export const END_STROKE_EXTRA_POINTS: Record<RidingStyle, number> = {
  'cross-country': 2,
  trail: 4,
  enduro: 5,
  downhill: 6,
  park: 3,
};

/** The ceiling of the end-stroke target (common practice, no source). */
export const END_STROKE_FORK_SAG = {
  /** travel at or below this is "shorter travel", mm */
  shortTravelMaxMm: 130,
  shortMaxPct: 30,
  longMaxPct: 35,
};

export interface SagTarget {
  pct: number;
  /** what the number comes from, for the assumptions list */
  basis: string;
}

export function targetSag(
  part: 'fork' | 'shock',
  style: RidingStyle,
  feel: RidingFeel,
  opts: { endStroke: boolean; travelMm: number },
): SagTarget {
  const plain = SAG_TABLE[part][style] + FEEL_SHIFT[feel];
  if (part === 'fork' && opts.endStroke) {
    const e = END_STROKE_FORK_SAG;
    const short = opts.travelMm <= e.shortTravelMaxMm;
    const ceiling = short ? e.shortMaxPct : e.longMaxPct;
    const pct = Math.max(plain, Math.min(ceiling, plain + END_STROKE_EXTRA_POINTS[style]));
    return {
      pct,
      basis: `${style}, ${feel}, with an end-stroke chamber on ${short ? 'shorter' : 'longer'} travel`,
    };
  }
  return { pct: plain, basis: `${style}, ${feel}` };
}
