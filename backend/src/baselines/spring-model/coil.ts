import type { CoilRateResult } from '@loamline/shared-types';
import { nPerMmToLbPerIn } from './units';

/**
 * Steps in which coil springs are commonly stocked, in lb/in (common practice, no source): shock
 * coils every 25 lb/in, fork coils every 5 lb/in.
 */
export const STOCKED_STEP_LB_PER_IN: Record<'fork' | 'shock', number> = { fork: 5, shock: 25 };

/**
 * A coil spring sags x_sag under the static load W when its rate is W / x_sag (no preload). The
 * suggestion is the nearest stocked rate (never below one step).
 */
export function coilRate(loadN: number, sagM: number, part: 'fork' | 'shock'): CoilRateResult {
  const nPerMm = loadN / (sagM * 1000);
  const lbPerIn = nPerMmToLbPerIn(nPerMm);
  const step = STOCKED_STEP_LB_PER_IN[part];
  return { nPerMm, lbPerIn, suggestedLbPerIn: Math.max(step, Math.round(lbPerIn / step) * step) };
}
