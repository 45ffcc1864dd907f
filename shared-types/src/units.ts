/**
 * Unit factors, each exact by definition, in one place for the server's model and the browser's
 * inputs. Sources: NIST SP 811 (2008), Appendix B.8; NIST SP 330 (SI brochure); ISO 2533.
 */

/** Standard gravity, m/s²: 3rd CGPM (1901); NIST SP 330. */
export const G0 = 9.80665;
/** The avoirdupois pound, kg: NIST SP 811, B.8. */
export const LB_KG = 0.45359237;
/** The pound-force, N (= LB_KG · G0): NIST SP 811, B.8. */
export const LBF_N = 4.4482216152605;
/** The inch, m: NIST SP 811, B.8. */
export const INCH_M = 0.0254;
/** The foot, m: NIST SP 811, B.8. */
export const FOOT_M = 0.3048;
/** psi = lbf / in², Pa (derived from the exact factors above): NIST SP 811, B.8. */
export const PSI_PA = LBF_N / (INCH_M * INCH_M);
/** The bar, Pa: NIST SP 811. */
export const BAR_PA = 100_000;
/** The standard atmosphere at sea level, Pa: ISO 2533; U.S. Standard Atmosphere 1976. */
export const P_STD_PA = 101_325;
/** 0 °C in kelvin: SI brochure (BIPM), NIST SP 330. */
export const ZERO_C_K = 273.15;
/** Cubic inch, cm³ (= 2.54³): NIST SP 811, B.8. */
export const IN3_CM3 = 16.387064;
