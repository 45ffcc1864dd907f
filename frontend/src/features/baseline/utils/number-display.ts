// How a stored number reads in the rider's units; kept apart from the input components so pages that
// only show numbers (a sheet, a report) do not load the wizard's inputs.
import {
  decimalsFor,
  formatNumber,
  fromDisplay,
  round,
  toDisplay,
  unitOf,
  type Quantity,
  type UnitPrefs,
} from '@/lib/units';

/**
 * How a number is shown: in the rider's unit (`quantity`), as a percent of a fraction, or as it is
 * (`unit` is then only a label).
 */
export type NumberDisplay =
  | { quantity: Quantity; prefs: UnitPrefs }
  | { percentOfFraction: true }
  | { unit: string; decimals?: number };

export interface Shown {
  unit: string;
  decimals: number;
  toShown: (v: number) => number;
  fromShown: (v: number) => number;
}

export function shownFor(d: NumberDisplay): Shown {
  if ('quantity' in d) {
    return {
      unit: unitOf(d.quantity, d.prefs),
      decimals: decimalsFor(d.quantity, d.prefs),
      toShown: (v) => toDisplay(d.quantity, v, d.prefs),
      fromShown: (v) => fromDisplay(d.quantity, v, d.prefs),
    };
  }
  if ('percentOfFraction' in d) {
    return { unit: '%', decimals: 1, toShown: (v) => v * 100, fromShown: (v) => v / 100 };
  }
  return { unit: d.unit, decimals: d.decimals ?? 2, toShown: (v) => v, fromShown: (v) => v };
}

/** A stored number (API unit) as the rider reads it, with its unit: "1.26 in", "42 %". */
export function formatShown(value: number, display: NumberDisplay): string {
  const shown = shownFor(display);
  const n = formatNumber(shown.toShown(value), shown.decimals).replace(/\.0+$|(\.\d*?)0+$/, '$1');
  return shown.unit ? `${n} ${shown.unit}` : n;
}

/** A stored number (API unit) as the text an input shows: rounded, without trailing zeros. */
export function textOf(value: number, shown: Shown): string {
  return Number.isFinite(value) ? String(round(shown.toShown(value), shown.decimals)) : '';
}
