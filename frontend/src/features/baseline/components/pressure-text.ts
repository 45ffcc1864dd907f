import { formatNumber, psiToBar, type UnitPrefs } from '@/lib/units';

/** A pressure as a pump reads it: whole psi, or bar to 0.1. */
export function formatPsi(psi: number, unit: UnitPrefs['pressure']): string {
  return unit === 'bar' ? `${formatNumber(psiToBar(psi), 1)} bar` : `${formatNumber(psi, 0)} psi`;
}

/** The other unit, for the line under a big number. */
export const otherPressure = (unit: UnitPrefs['pressure']): UnitPrefs['pressure'] =>
  unit === 'bar' ? 'psi' : 'bar';

/**
 * A range as a pump reads it. `bar` is the server's own range in bar (rounded to 0.1 bar) where it
 * gave one; otherwise the psi range is converted.
 */
export function formatPsiRange(
  [lo, hi]: readonly [number, number],
  unit: UnitPrefs['pressure'],
  bar?: readonly [number, number],
): string {
  if (unit === 'bar') {
    const [bl, bh] = bar ?? [psiToBar(lo), psiToBar(hi)];
    return `${formatNumber(bl, 1)}–${formatNumber(bh, 1)} bar`;
  }
  return `${formatNumber(lo, 0)}–${formatNumber(hi, 0)} psi`;
}
