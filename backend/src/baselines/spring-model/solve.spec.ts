import { polynomialRoot } from 'mathjs';
import { type AirCharge, type AirSpring, joinTravel, springForce } from './air-spring';
import { computeBaseline, sagCheck } from './index';
import { brent, solveChargePressure, travelUnderLoad } from './solve';
import { circleArea, P_STD_PA, PSI_PA, psiToPa } from './units';
import { ambientPressure } from './atmosphere';
import type { BaselineInput } from '@loamline/shared-types';

const spring = (over: Partial<AirSpring> = {}): AirSpring => {
  const A = circleArea(0.032);
  return {
    area: A,
    negativeArea: A - circleArea(0.01),
    positiveVolume: A * 0.24,
    negativeVolume: 50e-6,
    endStrokeVolume: 0,
    travel: 0.15,
    ...over,
  };
};

describe("Brent's method", () => {
  it("finds the real root of x³ − 2x − 5 as mathjs polynomialRoot does (Wallis' cubic)", () => {
    const reference = (polynomialRoot(-5, -2, 0, 1) as unknown[]).filter(
      (r): r is number => typeof r === 'number',
    );
    expect(reference).toHaveLength(1);
    expect(brent((x) => x ** 3 - 2 * x - 5, 0, 5)).toBeCloseTo(reference[0], 12);
    expect(reference[0]).toBeCloseTo(2.0945514815423265, 12); // the classic value, from memory
  });

  it('finds the fixed point of cos (cos x = x at 0.7390851332151607, the Dottie number; from memory)', () => {
    const r = brent((x) => Math.cos(x) - x, 0, 1);
    expect(r).toBeCloseTo(0.7390851332151607, 12);
    expect(Math.cos(r)).toBeCloseTo(r, 12);
  });

  it('refuses an interval that does not bracket a root', () => {
    expect(() => brent((x) => x * x + 1, -1, 1)).toThrow(RangeError);
  });
});

describe('pressure solve', () => {
  it('single chamber at n = 1, no negative chamber: p₀g = (W/A + p_amb)(1 − x/L₀) − p_amb (closed form)', () => {
    const s = spring({ negativeVolume: 0 });
    const L0 = s.positiveVolume / s.area;
    for (const [W, x] of [
      [330, 0.035],
      [500, 0.05],
      [150, 0.02],
    ]) {
      const p0 = solveChargePressure(s, x, W, P_STD_PA, null);
      expect(p0 - P_STD_PA).toBeCloseTo((W / s.area + P_STD_PA) * (1 - x / L0) - P_STD_PA, 4);
    }
  });

  it('the same closed form holds at altitude with the local ambient pressure (79 495 Pa at 2000 m, US Std Atm 1976)', () => {
    const input: BaselineInput = {
      rider: { massKg: 80, frontShare: 0.4 },
      riding: { style: 'trail', feel: 'balanced' },
      conditions: { altitudeM: 2000 },
      fork: {
        travelMm: 150,
        stanchionMm: 35,
        spring: 'air',
        spacers: 0,
        targetSagPct: 25,
        geometry: { pistonDiameterMm: 32, positiveLengthMm: 240, negativeVolumeCm3: 0 },
      },
      shock: null,
    };
    const r = computeBaseline(input);
    const A = circleArea(0.032);
    const W = 80 * 9.80665 * 0.4; // m·g0·s_f (NIST SP 330 g0)
    const pAmb = ambientPressure(2000);
    expect(pAmb).toBeCloseTo(79495, -1);
    const expected = ((W / A + pAmb) * (1 - 0.0375 / 0.24) - pAmb) / PSI_PA;
    expect(r.fork!.pressure!.psi).toBeCloseTo(expected, 6);
  });

  it('where the end-stroke chamber has joined by the sag, the root finder carries the load exactly', () => {
    const s = spring({ endStrokeVolume: 60e-6 });
    const x = 0.05;
    const W = 330;
    const pEnd = psiToPa(70) + P_STD_PA; // low enough to join before x
    const p0 = solveChargePressure(s, x, W, P_STD_PA, pEnd);
    const c: AirCharge = { p0, pEnd, pAmb: P_STD_PA, n: 1 };
    expect(joinTravel(s, c)!).toBeLessThan(x);
    expect(springForce(s, c, x) / W).toBeCloseTo(1, 9);
  });

  it('the closed form and the root finder agree where both apply', () => {
    const s = spring();
    const closed = solveChargePressure(s, 0.04, 400, P_STD_PA, null);
    const root = brent(
      (p0) => springForce(s, { p0, pEnd: null, pAmb: P_STD_PA, n: 1 }, 0.04) - 400,
      1000,
      5e6,
    );
    expect(closed / root).toBeCloseTo(1, 9);
  });

  it('travel under a load: F(x) equals the load there, full travel when it bottoms out', () => {
    const s = spring();
    const c: AirCharge = { p0: psiToPa(80) + P_STD_PA, pEnd: null, pAmb: P_STD_PA, n: 1 };
    const x = travelUnderLoad(s, c, 1000);
    expect(springForce(s, c, x)).toBeCloseTo(1000, 6);
    expect(travelUnderLoad(s, c, 1e6)).toBe(s.travel);
    expect(travelUnderLoad(s, c, 1)).toBe(0);
  });
});

describe('sag check', () => {
  const base: BaselineInput = {
    rider: { massKg: 75 },
    riding: { style: 'trail', feel: 'balanced' },
    fork: {
      travelMm: 140,
      stanchionMm: 34,
      spring: 'air',
      spacers: 0,
      targetSagPct: 25,
      geometry: { pistonDiameterMm: 31, positiveLengthMm: 220, negativeVolumeCm3: 0 },
    },
    shock: null,
  };

  it("single chamber at n = 1: p'abs = p_abs,m·(L₀ − x_t)/(L₀ − x_m) (closed form, docs/spring-model.md)", () => {
    for (const [psi, sag] of [
      [80, 48],
      [60, 20],
      [95, 35],
    ]) {
      const r = sagCheck({ ...base, measured: { part: 'fork', pressurePsi: psi, sagMm: sag } });
      const pAbs = psi * PSI_PA + P_STD_PA;
      const expected = (pAbs * (220 - 35)) / (220 - sag) - P_STD_PA;
      expect(r.newPressurePsi!).toBeCloseTo(expected / PSI_PA, 6);
      expect(r.changePsi).toBeCloseTo(r.newPressurePsi! - psi, 9);
      expect(r.targetSagMm).toBe(35);
      expect(r.measuredSagPct).toBeCloseTo((sag / 140) * 100, 9);
    }
  });

  it('too much sag means add air, too little means let air out (with the default geometry)', () => {
    const fork = { ...base.fork!, geometry: undefined };
    const more = sagCheck({ ...base, fork, measured: { part: 'fork', pressurePsi: 70, sagMm: 50 } });
    const less = sagCheck({ ...base, fork, measured: { part: 'fork', pressurePsi: 70, sagMm: 25 } });
    expect(more.changePsi).toBeGreaterThan(0);
    expect(less.changePsi).toBeLessThan(0);
  });

  it('at the target sag it changes nothing', () => {
    const r = sagCheck({ ...base, measured: { part: 'fork', pressurePsi: 77, sagMm: 35 } });
    expect(r.changePsi).toBeCloseTo(0, 9);
  });

  it('names the field when the sag reaches the travel, the part is missing, or the spring is a coil', () => {
    expect(() => sagCheck({ ...base, measured: { part: 'fork', pressurePsi: 70, sagMm: 140 } })).toThrow(
      expect.objectContaining({ field: 'measured.sagMm' }),
    );
    expect(() => sagCheck({ ...base, measured: { part: 'shock', pressurePsi: 70, sagMm: 10 } })).toThrow(
      expect.objectContaining({ field: 'measured.part' }),
    );
    const coil = { ...base, fork: { ...base.fork!, spring: 'coil' as const } };
    expect(() => sagCheck({ ...coil, measured: { part: 'fork', pressurePsi: 70, sagMm: 10 } })).toThrow(
      expect.objectContaining({ field: 'measured.part' }),
    );
  });
});
