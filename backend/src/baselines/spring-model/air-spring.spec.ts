import * as math from 'mathjs';
import {
  type AirCharge,
  type AirSpring,
  joinTravel,
  makeAirSpring,
  positivePressure,
  springForce,
  springRate,
  storedEnergy,
} from './air-spring';
import { SpringModelInputError } from './limits';
import { circleArea, INCH_M, LBF_N, P_STD_PA, PSI_PA, psiToPa } from './units';

/** mathjs' solveODE is missing from its type declarations; this is its documented signature. */
const { solveODE } = math as unknown as {
  solveODE: (
    f: (t: number, y: number[]) => number[],
    span: [number, number],
    y0: number[],
    opts?: { tol?: number; maxStep?: number },
  ) => { t: number[]; y: number[][] };
};

/** An invented 150 mm fork leg: 32 mm piston, 10 mm shaft, 240 mm air column, 50 cm³ negative. */
const fork = (over: Partial<AirSpring> = {}): AirSpring => {
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
const charge = (psi: number, over: Partial<AirCharge> = {}): AirCharge => ({
  p0: psiToPa(psi) + P_STD_PA,
  pEnd: null,
  pAmb: P_STD_PA,
  n: 1,
  ...over,
});

describe('one air chamber, closed forms', () => {
  it('single chamber at n = 1 without a negative chamber: F = (p₀·L₀/(L₀ − x) − p_amb)·A (Boyle–Mariotte law)', () => {
    const s = fork({ negativeVolume: 0 });
    const c = charge(80);
    const L0 = s.positiveVolume / s.area;
    for (const x of [0, 0.02, 0.05, 0.1, 0.149]) {
      expect(springForce(s, c, x)).toBeCloseTo((c.p0 * (L0 / (L0 - x)) - c.pAmb) * s.area, 8);
    }
  });

  it('with a negative chamber equalised at full extension, F(0) = P₀·(A − A₋) = P₀·πd²/4 (force balance)', () => {
    const s = fork();
    expect(springForce(s, charge(80), 0)).toBeCloseTo(psiToPa(80) * circleArea(0.01), 8);
  });

  it('polytropic: p·Vⁿ stays constant along the stroke (n = 1.4, the adiabatic law for air)', () => {
    const s = fork();
    const c = charge(80, { n: 1.4 });
    const x = 0.1;
    const v = s.positiveVolume - s.area * x;
    expect(positivePressure(s, c, x) * Math.pow(v, 1.4)).toBeCloseTo(
      c.p0 * Math.pow(s.positiveVolume, 1.4),
      6,
    );
  });

  it('rate k = dF/dx matches the symbolic derivative by mathjs', () => {
    const s = fork();
    for (const n of [1, 1.4]) {
      const c = charge(90, { n });
      const expr = '(p0*(V0/(V0-A*x))^n - pa)*A - (p0*(Vn/(Vn+An*x))^n - pa)*An';
      const dF = math.derivative(expr, 'x');
      for (const x of [0, 0.03, 0.09, 0.14]) {
        const scope = {
          p0: c.p0,
          pa: c.pAmb,
          A: s.area,
          An: s.negativeArea,
          V0: s.positiveVolume,
          Vn: s.negativeVolume,
          n,
          x,
        };
        const reference = dF.evaluate(scope) as number;
        expect(springRate(s, c, x) / reference).toBeCloseTo(1, 10);
      }
    }
  });

  it('stored energy equals the closed-form polytropic work (n = 1 and n = 1.4)', () => {
    const s = fork();
    for (const n of [1, 1.4]) {
      const c = charge(85, { n });
      const { area: A, negativeArea: An, positiveVolume: V0, negativeVolume: Vn } = s;
      for (const x of [0.05, 0.15]) {
        // Work on an ideal gas along p·Vⁿ = const (closed form): ∫p dV
        const posWork =
          n === 1
            ? c.p0 * V0 * Math.log(V0 / (V0 - A * x))
            : ((c.p0 * V0) / (n - 1)) * (Math.pow(V0 / (V0 - A * x), n - 1) - 1);
        const negWork =
          n === 1
            ? c.p0 * Vn * Math.log((Vn + An * x) / Vn)
            : ((c.p0 * Vn) / (1 - n)) * (Math.pow((Vn + An * x) / Vn, 1 - n) - 1);
        const closed = posWork - c.pAmb * A * x - negWork + c.pAmb * An * x;
        expect(storedEnergy(s, c, x) / closed).toBeCloseTo(1, 9);
      }
    }
  });

  it('stored energy with an end-stroke chamber joining agrees with mathjs solveODE (RK45) integrating dE/dx = F', () => {
    const s = fork({ endStrokeVolume: 60e-6 });
    const c = charge(70, { pEnd: psiToPa(150) + P_STD_PA });
    const xj = joinTravel(s, c)!;
    expect(xj).toBeGreaterThan(0);
    expect(xj).toBeLessThan(s.travel);
    const ode = solveODE((x) => [springForce(s, c, x)], [0, s.travel], [0], { tol: 1e-10, maxStep: 0.002 });
    const reference = ode.y[ode.y.length - 1][0];
    expect(storedEnergy(s, c, s.travel) / reference).toBeCloseTo(1, 6);
  });
});

describe('the end-stroke chamber', () => {
  const Ve = 60e-6;

  it("with p_e = p₀ it is one chamber of both volumes V₀' + V_e", () => {
    const c = charge(75);
    const withChamber = fork({ endStrokeVolume: Ve });
    const oneChamber = fork({ positiveVolume: withChamber.positiveVolume + Ve });
    for (const x of [0, 0.04, 0.08, 0.12, 0.15]) {
      expect(springForce(withChamber, { ...c, pEnd: c.p0 }, x)).toBeCloseTo(springForce(oneChamber, c, x), 6);
    }
  });

  it('set below the main chamber it acts as one chamber too (the floating piston is pushed back)', () => {
    const c = charge(75);
    const s = fork({ endStrokeVolume: Ve });
    const oneChamber = fork({ positiveVolume: s.positiveVolume + Ve });
    expect(springForce(s, { ...c, pEnd: psiToPa(40) + P_STD_PA }, 0.1)).toBeCloseTo(
      springForce(oneChamber, c, 0.1),
      6,
    );
  });

  it('as p_e grows it tends to the chamber without it', () => {
    const c = charge(75);
    const s = fork({ endStrokeVolume: Ve });
    const without = springForce(fork(), c, s.travel);
    const gaps = [100, 150, 200, 250, 300, 400].map(
      (psi) => without - springForce(s, { ...c, pEnd: psiToPa(psi) + P_STD_PA }, s.travel),
    );
    for (let i = 1; i < gaps.length; i++) expect(gaps[i]).toBeLessThanOrEqual(gaps[i - 1]);
    expect(gaps[0]).toBeGreaterThan(1);
    expect(gaps[gaps.length - 1]).toBeCloseTo(0, 9); // 400 psi is never reached within the travel
    expect(springForce(s, { ...c, pEnd: 1e12 }, 0.12)).toBe(springForce(fork(), c, 0.12));
  });

  it('the curve is continuous where it joins, at p(x_j) = p_e', () => {
    const s = fork({ endStrokeVolume: Ve });
    for (const n of [1, 1.4]) {
      const c = charge(70, { n, pEnd: psiToPa(140) + P_STD_PA });
      const xj = joinTravel(s, c)!;
      expect(positivePressure(s, c, xj)).toBeCloseTo(c.pEnd!, 3);
      const eps = 1e-7;
      const jump = springForce(s, c, xj + eps) - springForce(s, c, xj - eps);
      expect(Math.abs(jump)).toBeLessThan(springRate(s, c, xj - eps) * 2 * eps * 1.01);
      // the rate drops where the extra volume joins (the end softens)
      expect(springRate(s, c, xj + eps)).toBeLessThan(springRate(s, c, xj - eps));
    }
  });
});

describe('units', () => {
  it('the same spring in inches, in² and psi gives the same force in lbf (dimensional homogeneity; NIST SP 811 factors)', () => {
    const s = fork({ endStrokeVolume: 60e-6 });
    const c = charge(80, { pEnd: psiToPa(160) + P_STD_PA, n: 1.2 });
    const in2 = INCH_M * INCH_M;
    const imperial: AirSpring = {
      area: s.area / in2,
      negativeArea: s.negativeArea / in2,
      positiveVolume: s.positiveVolume / (in2 * INCH_M),
      negativeVolume: s.negativeVolume / (in2 * INCH_M),
      endStrokeVolume: s.endStrokeVolume / (in2 * INCH_M),
      travel: s.travel / INCH_M,
    };
    const cPsi: AirCharge = { p0: c.p0 / PSI_PA, pEnd: c.pEnd! / PSI_PA, pAmb: c.pAmb / PSI_PA, n: c.n };
    for (const x of [0, 0.05, 0.1, 0.14]) {
      expect((springForce(imperial, cPsi, x / INCH_M) * LBF_N) / springForce(s, c, x)).toBeCloseTo(1, 10);
    }
  });
});

describe('makeAirSpring', () => {
  const params = {
    pistonDiameter: 0.032,
    shaftDiameter: 0.01,
    positiveLength: 0.2,
    negativeVolume: 40e-6,
    spacerVolume: 10e-6,
    spacers: 0,
    endStrokeVolume: 0,
    travel: 0.15,
  };

  it("applies spacers: V₀' = A·L₀ − k·V_sp", () => {
    const s = makeAirSpring({ ...params, spacers: 3 }, 'fork');
    expect(s.positiveVolume).toBeCloseTo(circleArea(0.032) * 0.2 - 3 * 10e-6, 15);
  });

  it("refuses spacers that close the chamber (V₀' ≤ A·T), naming fork.spacers", () => {
    // A·(L₀ − T) = 8.04 cm² · 5 cm = 40.2 cm³: four 10 cm³ spacers still fit, five do not
    expect(() => makeAirSpring({ ...params, spacers: 4 }, 'fork')).not.toThrow();
    expect(() => makeAirSpring({ ...params, spacers: 5 }, 'fork')).toThrow(SpringModelInputError);
    expect(() => makeAirSpring({ ...params, spacers: 5 }, 'fork')).toThrow(
      expect.objectContaining({ field: 'fork.spacers' }),
    );
  });

  it('refuses an air column no longer than the travel, naming the geometry field', () => {
    expect(() => makeAirSpring({ ...params, positiveLength: 0.15 }, 'shock')).toThrow(
      expect.objectContaining({ field: 'shock.geometry.positiveLengthMm' }),
    );
  });

  it('refuses a shaft wider than the piston', () => {
    expect(() => makeAirSpring({ ...params, shaftDiameter: 0.04 }, 'fork')).toThrow(
      expect.objectContaining({ field: 'fork.geometry.shaftDiameterMm' }),
    );
  });
});
