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
 * A fork whose end-stroke chamber is set can run more sag (common practice, no source): about
 * 30–35 %, 30 % on shorter travel. Feel still moves it, within that band.
 */
export const END_STROKE_FORK_SAG = {
  shortTravelMaxMm: 130,
  shortPct: 30,
  longPct: 33,
  minPct: 30,
  maxPct: 35,
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
  if (part === 'fork' && opts.endStroke) {
    const e = END_STROKE_FORK_SAG;
    const short = opts.travelMm <= e.shortTravelMaxMm;
    const base = short ? e.shortPct : e.longPct;
    const pct = Math.min(e.maxPct, Math.max(e.minPct, base + FEEL_SHIFT[feel]));
    return {
      pct,
      basis: `fork with an end-stroke chamber, ${short ? 'shorter' : 'longer'} travel, ${feel}`,
    };
  }
  return { pct: SAG_TABLE[part][style] + FEEL_SHIFT[feel], basis: `${style}, ${feel}` };
}
