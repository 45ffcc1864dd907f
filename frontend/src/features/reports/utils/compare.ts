import type { BaselineSheet, PartSettings } from '@loamline/shared-types';
import { formatNumber, psiToBar, toDisplay, type UnitPrefs } from '@/lib/units';
import type { Part } from '../types';
import {
  formatLength,
  formatPct,
  formatPressure,
  formatRate,
  lbPerInToNPerMm,
  rateUnit,
} from './settings-units';

/** One line of "your baseline beside what the shop set". */
export interface CompareRow {
  key: string;
  label: string;
  /** the sheet's value, in words and units; null when the sheet has none */
  baseline: string | null;
  shop: string | null;
  /** "+6 psi (+7.1 %)"; null when either side is missing */
  difference: string | null;
}

function signed(n: number, decimals: number, unit: string): string {
  const r = formatNumber(Math.abs(n), decimals);
  if (Number(r.replace(/,/g, '')) === 0) return `no change`;
  return `${n > 0 ? '+' : '−'}${r} ${unit}`;
}

function diff(
  base: number | null,
  shop: number | null,
  shown: (v: number) => number,
  decimals: number,
  unit: string,
) {
  if (base === null || shop === null) return null;
  const d = shown(shop) - shown(base);
  const words = signed(d, decimals, unit);
  if (words === 'no change' || base === 0) return words;
  return `${words} (${formatPct(((shop - base) / base) * 100)})`;
}

/**
 * The rider's own baseline (a saved sheet) beside the settings the shop left, part by part, with the
 * difference (shop − baseline) in the rider's units and in %. Only what both could say is compared;
 * a line either side lacks shows "—".
 */
export function compareWithSheet(
  part: Part,
  sheet: BaselineSheet,
  shop: PartSettings | null,
  prefs: UnitPrefs,
): CompareRow[] {
  const r = sheet.result[part];
  const input = sheet.input[part];
  if (!r) return [];
  const rows: CompareRow[] = [];
  const pDec = prefs.pressure === 'bar' ? 1 : 0;
  const p = (v: number) => (prefs.pressure === 'bar' ? psiToBar(v) : v);
  if (r.pressure) {
    const base = r.pressure.psi;
    const set = shop?.mainPsi ?? null;
    rows.push({
      key: 'main',
      label: 'Main chamber',
      baseline: formatPressure(base, prefs),
      shop: set === null ? null : formatPressure(set, prefs),
      difference: diff(base, set, p, pDec, prefs.pressure),
    });
  }
  if (r.endStroke) {
    const base = r.endStroke.psi;
    const set = shop?.endStrokePsi ?? null;
    rows.push({
      key: 'end-stroke',
      label: 'End-stroke chamber',
      baseline: formatPressure(base, prefs),
      shop: set === null ? null : formatPressure(set, prefs),
      difference: diff(base, set, p, pDec, prefs.pressure),
    });
  }
  if (r.coilRate) {
    const base = r.coilRate.suggestedLbPerIn;
    const set = shop?.springRateLbPerIn ?? null;
    const metric = rateUnit(prefs) === 'N/mm';
    rows.push({
      key: 'rate',
      label: 'Spring rate',
      baseline: `${formatRate(base, prefs)} (nearest stocked)`,
      shop: set === null ? null : formatRate(set, prefs),
      difference: diff(base, set, (v) => (metric ? lbPerInToNPerMm(v) : v), metric ? 1 : 0, rateUnit(prefs)),
    });
  }
  if (input && !r.coilRate) {
    const base = input.spacers;
    const set = shop?.spacers ?? null;
    rows.push({
      key: 'spacers',
      label: 'Volume spacers',
      baseline: String(base),
      shop: set === null ? null : String(set),
      difference:
        set === null ? null : set === base ? 'no change' : `${set > base ? '+' : '−'}${Math.abs(set - base)}`,
    });
  }
  {
    const base = r.targetSagMm;
    const set = shop?.sagMm ?? null;
    const lDec = prefs.length === 'in' ? 2 : 0;
    rows.push({
      key: 'sag',
      label: part === 'shock' ? 'Sag (at the shock)' : 'Sag',
      baseline: `${formatLength(base, prefs)} target`,
      shop: set === null ? null : `${formatLength(set, prefs)} measured`,
      difference: diff(base, set, (v) => toDisplay('length', v, prefs), lDec, prefs.length),
    });
  }
  return rows;
}
