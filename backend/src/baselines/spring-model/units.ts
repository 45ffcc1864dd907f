/**
 * Constants and unit conversions of the spring model, each with its source. Everything inside the
 * model is SI (m, m², m³, Pa, N, K); the API edges speak mm, cm³, psi, bar, kg.
 */

import { BAR_PA, G0, INCH_M, LB_KG, LBF_N, P_STD_PA, PSI_PA, ZERO_C_K } from '@loamline/shared-types';

/** The exact factors live in shared-types (NIST SP 811, NIST SP 330, ISO 2533), shared with the browser. */
export { BAR_PA, G0, INCH_M, LB_KG, LBF_N, P_STD_PA, PSI_PA, ZERO_C_K };

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
