/**
 * Unit conversion at the edge: the browser shows and reads the rider's units; the API speaks kg, psi,
 * mm, cm³, m and °C (docs/spring-model.md). No spring model lives here, only the conversion factors.
 *
 * Factors (all exact by definition):
 *   1 lb  = 0.45359237 kg            NIST SP 811, App. B.8
 *   1 psi = 6894.757293168361 Pa     NIST SP 811, App. B.8 (lbf/in²)
 *   1 bar = 100 000 Pa               NIST SP 811, App. B.8
 *   1 in  = 25.4 mm                  NIST SP 811, App. B.8
 *   1 in³ = 16.387064 cm³            NIST SP 811, App. B.8 (1.638 706 4 E−05 m³; 2.54³ cm³)
 *   1 ft  = 0.3048 m                 NIST SP 811, App. B.8
 *   1 lbf = 4.4482216152605 N        NIST SP 811, App. B.8
 *   t/°F  = 1.8 · t/°C + 32          NIST SP 811, App. B.8 (degree Fahrenheit; sec. 4.2.1.1)
 *
 * The factors themselves come from shared-types (the same constants the server's model uses).
 */
import { BAR_PA, FOOT_M, IN3_CM3, INCH_M, LB_KG, LBF_N, PSI_PA } from '@loamline/shared-types';

export const KG_PER_LB = LB_KG;
export const PA_PER_PSI = PSI_PA;
export const PA_PER_BAR = BAR_PA;
export const MM_PER_IN = INCH_M * 1000;
export const CM3_PER_IN3 = IN3_CM3;
export const M_PER_FT = FOOT_M;
export const N_PER_LBF = LBF_N;

/** Lengths, weights, volumes, altitudes and temperatures go together: metric or imperial. */
export type UnitSystem = 'metric' | 'imperial';
export type MassUnit = 'kg' | 'lb';
/** Pressure is chosen on its own: pumps and gauges read psi or bar whatever else the rider uses. */
export type PressureUnit = 'psi' | 'bar';
export type LengthUnit = 'mm' | 'in';
export type VolumeUnit = 'cm³' | 'in³';
export type AltitudeUnit = 'm' | 'ft';
export type TemperatureUnit = '°C' | '°F';

/** The unit the rider reads for each quantity; build one with `unitPrefs(system, pressure)`. */
export interface UnitPrefs {
  system: UnitSystem;
  mass: MassUnit;
  pressure: PressureUnit;
  length: LengthUnit;
  volume: VolumeUnit;
  altitude: AltitudeUnit;
  temperature: TemperatureUnit;
}

export function unitPrefs(system: UnitSystem, pressure: PressureUnit): UnitPrefs {
  return system === 'imperial'
    ? { system, pressure, mass: 'lb', length: 'in', volume: 'in³', altitude: 'ft', temperature: '°F' }
    : { system, pressure, mass: 'kg', length: 'mm', volume: 'cm³', altitude: 'm', temperature: '°C' };
}

export const DEFAULT_UNITS: UnitPrefs = unitPrefs('metric', 'psi');

export const kgToLb = (kg: number): number => kg / KG_PER_LB;
export const lbToKg = (lb: number): number => lb * KG_PER_LB;
export const psiToBar = (psi: number): number => (psi * PA_PER_PSI) / PA_PER_BAR;
export const barToPsi = (bar: number): number => (bar * PA_PER_BAR) / PA_PER_PSI;
export const mmToIn = (mm: number): number => mm / MM_PER_IN;
export const inToMm = (inch: number): number => inch * MM_PER_IN;
export const cm3ToIn3 = (cm3: number): number => cm3 / CM3_PER_IN3;
export const in3ToCm3 = (in3: number): number => in3 * CM3_PER_IN3;
export const mToFt = (m: number): number => m / M_PER_FT;
export const ftToM = (ft: number): number => ft * M_PER_FT;
export const cToF = (c: number): number => c * 1.8 + 32;
export const fToC = (f: number): number => (f - 32) / 1.8;
/** A spring rate in N/mm as lb/in (lbf per inch). */
export const nPerMmToLbPerIn = (nPerMm: number): number => (nPerMm * MM_PER_IN) / N_PER_LBF;

/** A quantity the screen shows in the rider's unit; the API always gets its own unit (`apiUnit`). */
export type Quantity = 'mass' | 'pressure' | 'length' | 'volume' | 'altitude' | 'temperature';

export const apiUnit: Record<Quantity, string> = {
  mass: 'kg',
  pressure: 'psi',
  length: 'mm',
  volume: 'cm³',
  altitude: 'm',
  temperature: '°C',
};

/** The quantity an API unit stands for ('cm³' → volume), or undefined for any other unit. */
export function quantityOfApiUnit(unit: string | undefined): Quantity | undefined {
  return (Object.keys(apiUnit) as Quantity[]).find((q) => apiUnit[q] === unit);
}

export function unitOf(quantity: Quantity, prefs: UnitPrefs): UnitPrefs[Quantity] {
  return prefs[quantity];
}

/** From the API's unit (kg, psi, mm, cm³, m, °C) to the rider's. */
export function toDisplay(quantity: Quantity, value: number, prefs: UnitPrefs): number {
  switch (quantity) {
    case 'mass':
      return prefs.mass === 'lb' ? kgToLb(value) : value;
    case 'pressure':
      return prefs.pressure === 'bar' ? psiToBar(value) : value;
    case 'length':
      return prefs.length === 'in' ? mmToIn(value) : value;
    case 'volume':
      return prefs.volume === 'in³' ? cm3ToIn3(value) : value;
    case 'altitude':
      return prefs.altitude === 'ft' ? mToFt(value) : value;
    case 'temperature':
      return prefs.temperature === '°F' ? cToF(value) : value;
  }
}

/** From the rider's unit to the API's (kg, psi, mm, cm³, m, °C). */
export function fromDisplay(quantity: Quantity, value: number, prefs: UnitPrefs): number {
  switch (quantity) {
    case 'mass':
      return prefs.mass === 'lb' ? lbToKg(value) : value;
    case 'pressure':
      return prefs.pressure === 'bar' ? barToPsi(value) : value;
    case 'length':
      return prefs.length === 'in' ? inToMm(value) : value;
    case 'volume':
      return prefs.volume === 'in³' ? in3ToCm3(value) : value;
    case 'altitude':
      return prefs.altitude === 'ft' ? ftToM(value) : value;
    case 'temperature':
      return prefs.temperature === '°F' ? fToC(value) : value;
  }
}

/**
 * Decimals a screen shows: what a pump, a scale or a tape reads (1 psi, 0.1 bar, 1 mm, 0.05 in…);
 * a spacer's volume to 0.1 cm³ or 0.01 in³, altitude to the metre or foot, temperature to the degree.
 */
export function decimalsFor(quantity: Quantity, prefs: UnitPrefs): number {
  switch (quantity) {
    case 'mass':
      return 1;
    case 'pressure':
      return prefs.pressure === 'bar' ? 1 : 0;
    case 'length':
      return prefs.length === 'in' ? 2 : 0;
    case 'volume':
      return prefs.volume === 'in³' ? 2 : 1;
    case 'altitude':
    case 'temperature':
      return 0;
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

/** A value in the API's unit, shown in the rider's unit with the unit name: "5.8 bar", "1.57 in", "68 °F". */
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
