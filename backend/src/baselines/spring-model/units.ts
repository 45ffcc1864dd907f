/**
 * Constants and unit conversions of the spring model, each with its source. Everything inside the
 * model is SI (m, m², m³, Pa, N, K); the API edges speak mm, cm³, psi, bar, kg.
 */

/** Standard gravity, exact by definition: 3rd CGPM (1901); NIST SP 330. */
export const G0 = 9.80665; // m/s²

/** The avoirdupois pound, exact: NIST SP 811, App. B.8. */
export const LB_KG = 0.45359237; // kg

/** The pound-force, exact (= LB_KG · G0): NIST SP 811, App. B.8. */
export const LBF_N = 4.4482216152605; // N

/** The inch, exact: NIST SP 811, App. B.8. */
export const INCH_M = 0.0254; // m

/** psi = lbf / in², derived from the exact factors above (6894.757293168361 Pa): NIST SP 811, App. B.8. */
export const PSI_PA = LBF_N / (INCH_M * INCH_M); // Pa

/** The bar, exact: NIST SP 811. */
export const BAR_PA = 100_000; // Pa

/** The standard atmosphere at sea level, exact: ISO 2533; U.S. Standard Atmosphere 1976. */
export const P_STD_PA = 101_325; // Pa

/** 0 °C in kelvin, exact: SI Brochure (BIPM), NIST SP 330. */
export const ZERO_C_K = 273.15; // K

/** Heat capacity ratio of dry air near 20 °C: NBS Circular 564 (1955); Lange's Handbook. */
export const GAMMA_AIR = 1.4;

export const mmToM = (mm: number): number => mm / 1000;
export const mToMm = (m: number): number => m * 1000;
export const cm3ToM3 = (cm3: number): number => cm3 * 1e-6;
export const m3ToCm3 = (m3: number): number => m3 * 1e6;
export const psiToPa = (psi: number): number => psi * PSI_PA;
export const paToPsi = (pa: number): number => pa / PSI_PA;
export const psiToBar = (psi: number): number => (psi * PSI_PA) / BAR_PA;
export const barToPsi = (bar: number): number => (bar * BAR_PA) / PSI_PA;
export const lbToKg = (lb: number): number => lb * LB_KG;
export const kgToLb = (kg: number): number => kg / LB_KG;
export const inToMm = (inch: number): number => inch * INCH_M * 1000;
export const celsiusToK = (c: number): number => c + ZERO_C_K;
/** N/mm → lb/in (lbf per inch) */
export const nPerMmToLbPerIn = (nPerMm: number): number => (nPerMm * 1000 * INCH_M) / LBF_N;
/** lb/in (lbf per inch) → N/mm */
export const lbPerInToNPerMm = (lbPerIn: number): number => (lbPerIn * LBF_N) / (INCH_M * 1000);
/** Area of a circle of diameter d. */
export const circleArea = (diameter: number): number => (Math.PI * diameter * diameter) / 4;
