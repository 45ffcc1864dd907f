import { formatPsi } from '@/features/baseline/components/pressure-text';
import { formatNumber, formatQuantity, MM_PER_IN, N_PER_LBF, type UnitPrefs } from '@/lib/units';

/*
 * How a report's numbers read in the user's units. The wire is psi, mm, N and lb/in (a coil's rate,
 * as springs are sold); metric shows N/mm. Factors from lib/units (NIST SP 811).
 */

export type RateUnit = 'N/mm' | 'lb/in';
export const rateUnit = (prefs: UnitPrefs): RateUnit => (prefs.system === 'imperial' ? 'lb/in' : 'N/mm');
export const lbPerInToNPerMm = (lbPerIn: number): number => (lbPerIn * N_PER_LBF) / MM_PER_IN;
export const nPerMmToLbPerIn = (nPerMm: number): number => (nPerMm * MM_PER_IN) / N_PER_LBF;

export const formatPressure = (psi: number, prefs: UnitPrefs): string => formatPsi(psi, prefs.pressure);
export const formatLength = (mm: number, prefs: UnitPrefs): string =>
  formatQuantity('length', mm, prefs, prefs.length === 'in' ? 2 : 0);
export function formatRate(lbPerIn: number, prefs: UnitPrefs): string {
  return rateUnit(prefs) === 'lb/in'
    ? `${formatNumber(lbPerIn, 0)} lb/in`
    : `${formatNumber(lbPerInToNPerMm(lbPerIn), 1)} N/mm`;
}

/** Force in the user's system: N with metric, lbf with imperial. */
export const forceUnitOf = (prefs: UnitPrefs): 'N' | 'lbf' => (prefs.system === 'imperial' ? 'lbf' : 'N');
export const forceIn = (n: number, prefs: UnitPrefs): number =>
  prefs.system === 'imperial' ? n / N_PER_LBF : n;
export const formatForceN = (n: number, prefs: UnitPrefs): string =>
  `${formatNumber(forceIn(n, prefs), 0)} ${forceUnitOf(prefs)}`;

/** A signed difference in %, e.g. "+4.2 %", "−3.0 %". */
export function formatPct(pct: number, decimals = 1): string {
  const r = formatNumber(Math.abs(pct), decimals);
  if (Number(r) === 0) return `${formatNumber(0, decimals)} %`;
  return `${pct > 0 ? '+' : '−'}${r} %`;
}
