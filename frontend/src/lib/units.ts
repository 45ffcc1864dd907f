/**
 * Unit conversion at the edge: the browser shows and reads kg/lb, psi/bar and mm/in; the API speaks
 * kg, psi and mm (SPRING-MODEL.md). No spring model lives here, only the conversion factors.
 *
 * Factors (all exact by definition):
 *   1 lb  = 0.45359237 kg            NIST SP 811, App. B.8
 *   1 psi = 6894.757293168361 Pa     NIST SP 811, App. B.8 (lbf/in²)
 *   1 bar = 100 000 Pa               NIST SP 811, App. B.8
 *   1 in  = 25.4 mm                  NIST SP 811, App. B.8
 *   1 lbf = 4.4482216152605 N        NIST SP 811, App. B.8
 */
export const KG_PER_LB = 0.45359237;
export const PA_PER_PSI = 6894.757293168361;
export const PA_PER_BAR = 100_000;
export const MM_PER_IN = 25.4;
export const N_PER_LBF = 4.4482216152605;

export type MassUnit = 'kg' | 'lb';
export type PressureUnit = 'psi' | 'bar';
export type LengthUnit = 'mm' | 'in';

export interface UnitPrefs {
  mass: MassUnit;
  pressure: PressureUnit;
  length: LengthUnit;
}

export const DEFAULT_UNITS: UnitPrefs = { mass: 'kg', pressure: 'psi', length: 'mm' };

export const kgToLb = (kg: number): number => kg / KG_PER_LB;
export const lbToKg = (lb: number): number => lb * KG_PER_LB;
export const psiToBar = (psi: number): number => (psi * PA_PER_PSI) / PA_PER_BAR;
export const barToPsi = (bar: number): number => (bar * PA_PER_BAR) / PA_PER_PSI;
export const mmToIn = (mm: number): number => mm / MM_PER_IN;
export const inToMm = (inch: number): number => inch * MM_PER_IN;
/** A spring rate in N/mm as lb/in (lbf per inch). */
export const nPerMmToLbPerIn = (nPerMm: number): number => (nPerMm * MM_PER_IN) / N_PER_LBF;

/** A quantity the screen shows in the rider's unit; the API always gets the first unit of each pair. */
export type Quantity = 'mass' | 'pressure' | 'length';

export const apiUnit: Record<Quantity, string> = { mass: 'kg', pressure: 'psi', length: 'mm' };

export function unitOf(quantity: Quantity, prefs: UnitPrefs): MassUnit | PressureUnit | LengthUnit {
  return prefs[quantity];
}

/** From the API's unit (kg, psi, mm) to the rider's. */
export function toDisplay(quantity: Quantity, value: number, prefs: UnitPrefs): number {
  switch (quantity) {
    case 'mass':
      return prefs.mass === 'lb' ? kgToLb(value) : value;
    case 'pressure':
      return prefs.pressure === 'bar' ? psiToBar(value) : value;
    case 'length':
      return prefs.length === 'in' ? mmToIn(value) : value;
  }
}

/** From the rider's unit to the API's (kg, psi, mm). */
export function fromDisplay(quantity: Quantity, value: number, prefs: UnitPrefs): number {
  switch (quantity) {
    case 'mass':
      return prefs.mass === 'lb' ? lbToKg(value) : value;
    case 'pressure':
      return prefs.pressure === 'bar' ? barToPsi(value) : value;
    case 'length':
      return prefs.length === 'in' ? inToMm(value) : value;
  }
}

/** Decimals a screen shows: what a pump, a scale or a tape reads (1 psi, 0.1 bar, 1 mm, 0.05 in…). */
export function decimalsFor(quantity: Quantity, prefs: UnitPrefs): number {
  switch (quantity) {
    case 'mass':
      return 1;
    case 'pressure':
      return prefs.pressure === 'bar' ? 1 : 0;
    case 'length':
      return prefs.length === 'in' ? 2 : 0;
  }
}

/** Rounds for a screen; `-0` becomes `0`. */
export function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  const r = Math.round(value * f) / f;
  return Object.is(r, -0) ? 0 : r;
}

const formatters = new Map<number, Intl.NumberFormat>();
/** A number with a fixed count of decimals, in the page's language. */
export function formatNumber(value: number, decimals: number): string {
  let f = formatters.get(decimals);
  if (!f) {
    f = new Intl.NumberFormat('en', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
    formatters.set(decimals, f);
  }
  return f.format(round(value, decimals));
}

/** A value in the API's unit, shown in the rider's unit with the unit name: "5.8 bar", "1.57 in". */
export function formatQuantity(
  quantity: Quantity,
  value: number,
  prefs: UnitPrefs,
  decimals = decimalsFor(quantity, prefs),
): string {
  return `${formatNumber(toDisplay(quantity, value, prefs), decimals)} ${unitOf(quantity, prefs)}`;
}

/** Reads what a rider typed: accepts a decimal comma, ignores spaces; blank or junk is NaN. */
export function parseDecimal(text: string): number {
  const t = text.trim().replace(/\s/g, '').replace(',', '.');
  if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)$/.test(t)) return Number.NaN;
  return Number(t);
}
