import { evaluate, gravity, type Unit, unit } from 'mathjs';
import { ambientPressure, gaugeAtAmbient, gaugeAtTemperature } from './atmosphere';
import {
  BAR_PA,
  barToPsi,
  celsiusToK,
  G0,
  GAMMA_AIR,
  inToMm,
  INCH_M,
  kgToLb,
  LB_KG,
  lbPerInToNPerMm,
  LBF_N,
  lbToKg,
  nPerMmToLbPerIn,
  P_STD_PA,
  paToPsi,
  PSI_PA,
  psiToBar,
  psiToPa,
} from './units';

/** mathjs is the independent reference here: its units are defined from the same NIST factors. */
const mj = (expr: string, to: string): number => unit(expr).toNumber(to);

describe('units and constants (against mathjs)', () => {
  it('standard gravity is 9.80665 m/s² exactly (3rd CGPM 1901; NIST SP 330)', () => {
    expect(G0).toBe(9.80665);
    expect(G0).toBe(gravity.toNumber('m/s^2')); // mathjs' physical constant `gravity` (g0)
  });

  it('the pound is 0.45359237 kg exactly (NIST SP 811, App. B.8)', () => {
    expect(LB_KG).toBe(0.45359237);
    expect(LB_KG).toBeCloseTo(mj('1 lbm', 'kg'), 15);
    expect(lbToKg(100)).toBeCloseTo(mj('100 lbm', 'kg'), 12);
    expect(kgToLb(82)).toBeCloseTo(mj('82 kg', 'lbm'), 12);
  });

  it('the pound-force is 4.4482216152605 N exactly (NIST SP 811, App. B.8)', () => {
    expect(LBF_N).toBe(4.4482216152605);
    expect(LBF_N).toBeCloseTo(mj('1 lbf', 'N'), 12);
    // lbf = lb · g0 by definition (NIST SP 811, App. B.8)
    expect(LB_KG * G0).toBeCloseTo(LBF_N, 12);
  });

  it('psi written as lbf/in² is 6894.757293168361 Pa (NIST SP 811, App. B.8; mathjs psi itself is rounded)', () => {
    const mathjsPsi = (evaluate('1 lbf / in^2') as Unit).toNumber('Pa');
    expect(PSI_PA).toBeCloseTo(6894.757293168361, 9);
    expect(PSI_PA).toBeCloseTo(mathjsPsi, 9);
    expect(psiToPa(80)).toBeCloseTo(80 * mathjsPsi, 7);
    expect(paToPsi(psiToPa(123.4))).toBeCloseTo(123.4, 12);
  });

  it('the bar is 100 000 Pa exactly and 1 bar ≈ 14.5038 psi (NIST SP 811)', () => {
    expect(BAR_PA).toBe(mj('1 bar', 'Pa'));
    expect(barToPsi(1)).toBeCloseTo(14.503773773, 8); // 1e5 / 6894.757293168361 (NIST SP 811)
    expect(psiToBar(barToPsi(5.5))).toBeCloseTo(5.5, 12);
  });

  it('the inch is 25.4 mm exactly (NIST SP 811, App. B.8)', () => {
    expect(INCH_M).toBe(mj('1 in', 'm'));
    expect(inToMm(6.3)).toBeCloseTo(mj('6.3 in', 'mm'), 12);
  });

  it('spring rates: 1 lbf/in = 0.175126835 N/mm (NIST SP 811 factors, via mathjs)', () => {
    const nPerMmPerLbPerIn = (evaluate('1 lbf / in') as Unit).toNumber('N/mm');
    expect(lbPerInToNPerMm(1)).toBeCloseTo(nPerMmPerLbPerIn, 12);
    expect(lbPerInToNPerMm(1)).toBeCloseTo(0.175126835, 8);
    expect(nPerMmToLbPerIn(lbPerInToNPerMm(400))).toBeCloseTo(400, 10);
  });

  it('the standard atmosphere is 101 325 Pa (ISO 2533; U.S. Standard Atmosphere 1976) and mathjs agrees', () => {
    expect(P_STD_PA).toBe(101325);
    expect(P_STD_PA).toBe(mj('1 atm', 'Pa'));
  });

  it('air has γ = 1.40 near 20 °C (NBS Circular 564, 1955)', () => {
    expect(GAMMA_AIR).toBe(1.4);
  });

  it('0 °C is 273.15 K (SI Brochure)', () => {
    expect(celsiusToK(0)).toBe(273.15);
    expect(celsiusToK(20)).toBeCloseTo(mj('20 degC', 'K'), 12);
  });
});

describe('atmosphere (U.S. Standard Atmosphere 1976)', () => {
  it('is 101 325 Pa at sea level', () => {
    expect(ambientPressure(0)).toBe(101325);
  });

  it('is 79 495 Pa at 2000 m (U.S. Standard Atmosphere 1976, table value 7.9495 × 10⁴ Pa)', () => {
    expect(ambientPressure(2000)).toBeCloseTo(79495, -1); // within ±5 Pa
  });

  it('is about 89 875 Pa at 1000 m and 54 020 Pa at 5000 m (U.S. Standard Atmosphere 1976 by geopotential altitude, from memory)', () => {
    expect(Math.abs(ambientPressure(1000) - 89875) / 89875).toBeLessThan(2e-4);
    expect(Math.abs(ambientPressure(5000) - 54020) / 54020).toBeLessThan(2e-4);
  });

  it('a sealed chamber keeps its absolute pressure: set to 80 psi at sea level it reads more up high', () => {
    // gauge' = gauge + p_amb(0) − p_amb(2000 m) = 80 psi + (101 325 − 79 495) Pa (definition of gauge pressure)
    const up = paToPsi(gaugeAtAmbient(psiToPa(80), ambientPressure(0), ambientPressure(2000)));
    expect(up).toBeCloseTo(80 + (101325 - 79495.2) / PSI_PA, 3);
  });
});

describe('temperature (ideal gas law at constant volume)', () => {
  it('100 psi set at 20 °C reads about 103.91 psi at 30 °C (p_abs ∝ T)', () => {
    const at30 = paToPsi(gaugeAtTemperature(psiToPa(100), 20, 30, P_STD_PA));
    // (100 + 14.6959) psi · 303.15 K / 293.15 K − 14.6959 psi = 103.913 psi
    expect(at30).toBeCloseTo(103.91, 2);
  });

  it('falls in the cold: 100 psi at 20 °C reads about 88.26 psi at −10 °C (ideal gas law)', () => {
    // (100 + 14.6959)·263.15/293.15 − 14.6959 = 88.2606
    expect(paToPsi(gaugeAtTemperature(psiToPa(100), 20, -10, P_STD_PA))).toBeCloseTo(88.26, 2);
  });
});
