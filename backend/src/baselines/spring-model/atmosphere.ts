import { celsiusToK, P_STD_PA } from './units';

/**
 * U.S. Standard Atmosphere 1976, troposphere (0–11 km): p(h) = p₀·(1 − h/44330.77 m)^5.255876, where
 * 44330.77 m = T₀/L (288.15 K / 0.0065 K/m) and 5.255876 = g₀·M/(R*·L). The altitude is used as
 * given (the standard's geopotential altitude; at 2000 m it differs from the geometric one by 0.6 m).
 */
export const ATMOSPHERE_SCALE_M = 44330.77;
export const ATMOSPHERE_EXPONENT = 5.255876;

/** Ambient (absolute) pressure in Pa at altitude h in metres. */
export function ambientPressure(altitudeM: number): number {
  return P_STD_PA * Math.pow(1 - altitudeM / ATMOSPHERE_SCALE_M, ATMOSPHERE_EXPONENT);
}

/**
 * Ideal gas at constant volume: p_abs ∝ T. The gauge reading (Pa) of a chamber set to `gaugePa` at
 * `fromC` once it sits at `toC`, with the ambient pressure `ambientPa` unchanged.
 */
export function gaugeAtTemperature(gaugePa: number, fromC: number, toC: number, ambientPa: number): number {
  return ((gaugePa + ambientPa) * celsiusToK(toC)) / celsiusToK(fromC) - ambientPa;
}

/**
 * A sealed chamber keeps its absolute pressure: the gauge reading (Pa) of a chamber set to `gaugePa`
 * where the ambient pressure was `fromAmbientPa`, read where it is `toAmbientPa`.
 */
export function gaugeAtAmbient(gaugePa: number, fromAmbientPa: number, toAmbientPa: number): number {
  return gaugePa + fromAmbientPa - toAmbientPa;
}
