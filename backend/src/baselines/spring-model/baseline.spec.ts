import fc from 'fast-check';
import {
  RIDING_FEELS,
  RIDING_STYLES,
  type BaselineInput,
  type ForkInput,
  type ShockInput,
} from '@loamline/shared-types';
import { type AirCharge, makeAirSpring, springForce } from './air-spring';
import { CAUTIONS, computeBaseline, CURVE_POINTS, HARD_LANDING_MULTIPLE } from './index';
import { forkGeometry } from './defaults';
import { SpringModelInputError } from './limits';
import { solveChargePressure, travelUnderLoad } from './solve';
import {
  barToPsi,
  cm3ToM3,
  G0,
  inToMm,
  kgToLb,
  lbPerInToNPerMm,
  lbToKg,
  mmToM,
  P_STD_PA,
  psiToBar,
  psiToPa,
} from './units';

const RUNS = { numRuns: 60 };

const rider = (massKg = 80): BaselineInput['rider'] => ({ massKg });
const trail = { style: 'trail', feel: 'balanced' } as const;
const airFork = (over: Partial<ForkInput> = {}): ForkInput => ({
  travelMm: 140,
  stanchionMm: 35,
  spring: 'air',
  spacers: 0,
  ...over,
});
const airShock = (over: Partial<ShockInput> = {}): ShockInput => ({
  strokeMm: 60,
  wheelTravelMm: 165,
  spring: 'air',
  spacers: 0,
  ...over,
});
const input = (over: Partial<BaselineInput>): BaselineInput => ({
  rider: rider(),
  riding: trail,
  fork: null,
  shock: null,
  ...over,
});

/** The default-geometry air spring of a fork, and a charge at a given gauge pressure. */
function defaultForkSpring(stanchionMm: number, travelMm: number, spacers: number, endStrokeVolume = false) {
  const g = forkGeometry(stanchionMm, travelMm, endStrokeVolume).geometry;
  return {
    g,
    spring: makeAirSpring(
      {
        pistonDiameter: mmToM(g.pistonDiameterMm),
        shaftDiameter: mmToM(g.shaftDiameterMm),
        positiveLength: mmToM(g.positiveLengthMm),
        negativeVolume: cm3ToM3(g.negativeVolumeCm3),
        spacerVolume: cm3ToM3(g.spacerVolumeCm3),
        spacers,
        endStrokeVolume: endStrokeVolume ? cm3ToM3(g.endStrokeVolumeCm3) : 0,
        travel: mmToM(travelMm),
      },
      'fork',
    ),
  };
}

/* ----------------------------------------------------------------- arbitraries (valid inputs) */

const arbFork = fc.record({
  travelMm: fc.integer({ min: 80, max: 200 }),
  stanchionMm: fc.constantFrom(30, 32, 34, 35, 36, 38, 40),
  spring: fc.constant('air' as const),
  spacers: fc.integer({ min: 0, max: 6 }),
});
const arbShock = fc.record({
  strokeMm: fc.constantFrom(40, 45, 50, 55, 57.5, 60, 62.5, 65, 70, 75),
  leverage: fc.double({ min: 2, max: 3.2, noNaN: true }),
  spacers: fc.integer({ min: 0, max: 4 }),
});
const arbRiding = fc.record({
  style: fc.constantFrom(...RIDING_STYLES),
  feel: fc.constantFrom(...RIDING_FEELS),
});

describe('properties (fast-check)', () => {
  it('a heavier rider needs more pressure, front and rear', () => {
    fc.assert(
      fc.property(
        arbFork,
        arbShock,
        arbRiding,
        fc.double({ min: 30, max: 150, noNaN: true }),
        fc.double({ min: 0.5, max: 40, noNaN: true }),
        (fork, shock, riding, m, extra) => {
          const body = (massKg: number) =>
            input({
              rider: { massKg },
              riding,
              fork,
              shock: {
                strokeMm: shock.strokeMm,
                wheelTravelMm: Math.round(shock.strokeMm * shock.leverage),
                spring: 'air',
                spacers: shock.spacers,
              },
            });
          const light = computeBaseline(body(m));
          const heavy = computeBaseline(body(m + extra));
          expect(heavy.fork!.pressure!.psi).toBeGreaterThan(light.fork!.pressure!.psi);
          expect(heavy.shock!.pressure!.psi).toBeGreaterThan(light.shock!.pressure!.psi);
        },
      ),
      RUNS,
    );
  });

  it('more spacers at the same pressure use less travel under the same load and leave the curve start unchanged', () => {
    fc.assert(
      fc.property(
        arbFork,
        fc.integer({ min: 1, max: 4 }),
        fc.double({ min: 40, max: 140, noNaN: true }),
        fc.double({ min: 1.5, max: 6, noNaN: true }),
        ({ travelMm, stanchionMm, spacers }, more, psi, multiple) => {
          const fewer = defaultForkSpring(stanchionMm, travelMm, spacers).spring;
          const moreSp = defaultForkSpring(stanchionMm, travelMm, spacers + more).spring;
          const c: AirCharge = { p0: psiToPa(psi) + P_STD_PA, pEnd: null, pAmb: P_STD_PA, n: 1 };
          const load = multiple * springForce(fewer, c, 0.25 * fewer.travel);
          expect(travelUnderLoad(moreSp, c, load)).toBeLessThanOrEqual(travelUnderLoad(fewer, c, load));
          // strictly less wherever the spring with fewer spacers does not bottom out
          if (travelUnderLoad(fewer, c, load) < fewer.travel) {
            expect(travelUnderLoad(moreSp, c, load)).toBeLessThan(travelUnderLoad(fewer, c, load));
          }
          expect(springForce(moreSp, c, 0)).toBe(springForce(fewer, c, 0));
          // … and the difference they make grows towards the end of travel
          const gap = (share: number) =>
            springForce(moreSp, c, share * fewer.travel) - springForce(fewer, c, share * fewer.travel);
          expect(gap(0.25)).toBeGreaterThan(0);
          expect(gap(0.25)).toBeLessThan(gap(0.5));
          expect(gap(0.5)).toBeLessThan(gap(1));
        },
      ),
      RUNS,
    );
  });

  it('the same holds for the overlays of a computed baseline', () => {
    fc.assert(
      fc.property(
        arbFork,
        arbRiding,
        fc.double({ min: 50, max: 120, noNaN: true }),
        (fork, riding, massKg) => {
          const r = computeBaseline(input({ rider: { massKg }, riding, fork })).fork!;
          const spacerCurves = r.overlays.filter((o) => o.kind === 'spacers' && o.spacers! > fork.spacers);
          expect(spacerCurves.length).toBeGreaterThan(0);
          let previous = r.travelUsedMm;
          for (const o of spacerCurves) {
            expect(o.curve[0]).toEqual(r.curve[0]);
            expect(o.travelUsedMm).toBeLessThanOrEqual(previous + 1e-9);
            previous = o.travelUsedMm;
          }
        },
      ),
      RUNS,
    );
  });

  it('a higher end-stroke pressure never lowers the force at any travel', () => {
    fc.assert(
      fc.property(
        arbFork,
        fc.double({ min: 30, max: 120, noNaN: true }),
        fc.double({ min: 0, max: 400, noNaN: true }),
        fc.double({ min: 0, max: 300, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.constantFrom(1, 1.2, 1.4),
        ({ travelMm, stanchionMm, spacers }, psi, e1, de, share, n) => {
          const { spring } = defaultForkSpring(stanchionMm, travelMm, spacers, true);
          const c = (endPsi: number): AirCharge => ({
            p0: psiToPa(psi) + P_STD_PA,
            pEnd: psiToPa(endPsi) + P_STD_PA,
            pAmb: P_STD_PA,
            n,
          });
          const x = share * spring.travel;
          const lower = springForce(spring, c(e1), x);
          const higher = springForce(spring, c(e1 + de), x);
          expect(higher).toBeGreaterThanOrEqual(lower - 1e-9 * Math.abs(lower));
        },
      ),
      RUNS,
    );
  });

  it('metric and imperial inputs give the same answer (NIST SP 811 factors)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 100, max: 260, noNaN: true }), // rider in lb
        fc.double({ min: 4, max: 7.5, noNaN: true }), // fork travel in inches
        fc.double({ min: 8, max: 16, noNaN: true }), // end-stroke pressure in bar
        (lb, travelIn, endBar) => {
          const metric = computeBaseline(
            input({
              rider: { massKg: lbToKg(lb) },
              fork: airFork({ travelMm: inToMm(travelIn), endStroke: { pressurePsi: barToPsi(endBar) } }),
            }),
          ).fork!;
          // the same rider, fork and chamber typed in as the SI numbers they stand for
          const si = computeBaseline(
            input({
              rider: { massKg: lb * 0.45359237 },
              fork: airFork({
                travelMm: travelIn * 25.4,
                endStroke: { pressurePsi: (endBar * 1e5) / 6894.757293168361 },
              }),
            }),
          ).fork!;
          expect(metric.pressure!.psi).toBeCloseTo(si.pressure!.psi, 8);
          expect(metric.pressure!.bar).toBeCloseTo(psiToBar(metric.pressure!.psi), 12);
          expect(metric.loadN).toBeCloseTo(lb * 0.45359237 * G0 * 0.42, 8);
          expect(kgToLb(lbToKg(lb))).toBeCloseTo(lb, 10);
        },
      ),
      RUNS,
    );
  });

  it('more pressure means less sag: the solved pressure rises as the target sag falls', () => {
    fc.assert(
      fc.property(arbFork, fc.integer({ min: 10, max: 37 }), (fork, pct) => {
        const at = (targetSagPct: number) =>
          computeBaseline(input({ fork: { ...fork, targetSagPct } })).fork!.pressure!.psi;
        expect(at(pct)).toBeGreaterThan(at(pct + 3));
      }),
      RUNS,
    );
  });
});

describe('trade facts (common practice, no source)', () => {
  it('a fork with its end-stroke chamber set runs a few points more sag, by style: up to about 35 % on long travel, 30 % on shorter travel', () => {
    for (const style of RIDING_STYLES) {
      for (const feel of RIDING_FEELS) {
        for (const travelMm of [100, 120, 130, 140, 160, 180]) {
          const plain = computeBaseline(
            input({ riding: { style, feel }, fork: airFork({ travelMm }) }),
          ).fork!;
          const r = computeBaseline(
            input({ riding: { style, feel }, fork: airFork({ travelMm, endStroke: { pressurePsi: 180 } }) }),
          ).fork!;
          expect(r.targetSagPct).toBeGreaterThanOrEqual(plain.targetSagPct); // common practice, no source
          expect(r.targetSagPct).toBeLessThanOrEqual(plain.targetSagPct + 6); // "a few points more"
          expect(r.targetSagPct).toBeLessThanOrEqual(travelMm <= 130 ? 30 : 35); // common practice, no source
        }
      }
    }
    // the gravity styles on long travel reach the 30–35 % band; cross-country stays well below it
    const dh = computeBaseline(
      input({
        riding: { style: 'downhill', feel: 'balanced' },
        fork: airFork({ travelMm: 180, endStroke: {} }),
      }),
    ).fork!;
    expect(dh.targetSagPct).toBeGreaterThanOrEqual(30);
    const xc = computeBaseline(
      input({
        riding: { style: 'cross-country', feel: 'balanced' },
        fork: airFork({ travelMm: 100, endStroke: {} }),
      }),
    ).fork!;
    expect(xc.targetSagPct).toBeLessThan(25);
  });

  it('five spacers added to a 120 mm fork at unchanged pressure leave about 110–115 mm under the force that used all 120 mm', () => {
    for (const stanchionMm of [30, 32, 34, 35, 36]) {
      const none = defaultForkSpring(stanchionMm, 120, 0).spring;
      const five = defaultForkSpring(stanchionMm, 120, 5).spring;
      const W = 80 * G0 * 0.42;
      const p0 = solveChargePressure(none, 0.25 * none.travel, W, P_STD_PA, null);
      const c: AirCharge = { p0, pEnd: null, pAmb: P_STD_PA, n: 1 };
      const usedAllBefore = springForce(none, c, none.travel);
      const usable = travelUnderLoad(five, c, usedAllBefore) * 1000;
      expect(usable).toBeGreaterThanOrEqual(110); // common practice, no source
      expect(usable).toBeLessThanOrEqual(115); // common practice, no source
    }
  });

  it('raising the end-stroke pressure in steps firms the last part of travel and still reaches full travel', () => {
    const r = computeBaseline(
      input({ fork: airFork({ travelMm: 150, stanchionMm: 36, endStroke: { pressurePsi: 150 } }) }),
    );
    const psi = r.fork!.pressure!.psi;
    const { spring } = defaultForkSpring(36, 150, 0, true);
    const steps = [150, 175, 200, 225, 250];
    const charge = (endPsi: number): AirCharge => ({
      p0: psiToPa(psi) + P_STD_PA,
      pEnd: psiToPa(endPsi) + P_STD_PA,
      pAmb: P_STD_PA,
      n: 1,
    });
    const T = spring.travel;
    const end = steps.map((e) => springForce(spring, charge(e), T));
    for (let i = 1; i < steps.length; i++) {
      expect(end[i]).toBeGreaterThan(end[i - 1]); // firmer at full travel with each step
      for (const share of [0.75, 0.8, 0.85, 0.9, 0.95]) {
        expect(springForce(spring, charge(steps[i]), share * T)).toBeGreaterThanOrEqual(
          springForce(spring, charge(steps[i - 1]), share * T),
        );
      }
    }
    // still reaches full travel: under a big enough force every step bottoms out at T …
    const big = 1.01 * Math.max(...end);
    for (const e of steps) expect(travelUnderLoad(spring, charge(e), big)).toBe(T);
    // … and a hard landing still uses at least 90 % of it (estimate of a good setup, common practice)
    const hard = HARD_LANDING_MULTIPLE * r.fork!.loadN;
    for (const e of steps) expect(travelUnderLoad(spring, charge(e), hard)).toBeGreaterThanOrEqual(0.9 * T);
  });
});

describe('plausibility bands (common practice, from memory)', () => {
  it('trail fork: pressure in psi roughly equals rider mass in kg at 25 % sag (34–36 mm, 130–150 mm)', () => {
    for (const stanchionMm of [34, 35, 36]) {
      for (const travelMm of [130, 140, 150]) {
        for (const massKg of [60, 70, 80, 90, 100]) {
          const r = computeBaseline(
            input({ rider: { massKg }, fork: airFork({ travelMm, stanchionMm, targetSagPct: 25 }) }),
          );
          const ratio = r.fork!.pressure!.psi / massKg;
          expect(ratio).toBeGreaterThan(0.85); // "psi ≈ kg", from memory
          expect(ratio).toBeLessThan(1.15);
        }
      }
    }
  });

  it('air shock: pressure in psi roughly equals rider weight in lb at LR 2.6–2.9 and 30 % sag', () => {
    for (const strokeMm of [50, 55, 57.5, 60, 62.5, 65]) {
      for (const lr of [2.6, 2.75, 2.9]) {
        for (const massKg of [60, 80, 100]) {
          const r = computeBaseline(
            input({
              rider: { massKg },
              shock: airShock({ strokeMm, wheelTravelMm: strokeMm * lr, targetSagPct: 30 }),
            }),
          );
          const ratio = r.shock!.pressure!.psi / kgToLb(massKg);
          expect(ratio).toBeGreaterThan(0.85); // "psi ≈ lb", from memory
          expect(ratio).toBeLessThan(1.15);
        }
      }
    }
  });

  it('a baseline uses most but not all of its travel under a hard landing, and progression is that of an air spring', () => {
    const r = computeBaseline(input({ fork: airFork(), shock: airShock() }));
    for (const p of [r.fork!, r.shock!]) {
      expect(p.travelUsedMm / p.travelMm).toBeGreaterThan(0.85);
      expect(p.travelUsedMm / p.travelMm).toBeLessThanOrEqual(1);
      expect(p.progression).toBeGreaterThan(2);
      expect(p.progression).toBeLessThan(4.5);
    }
  });
});

describe('computeBaseline', () => {
  const r = computeBaseline(input({ fork: airFork({ endStroke: { pressurePsi: 160 } }), shock: airShock() }));

  it('answers the contract for fork and shock', () => {
    for (const p of [r.fork!, r.shock!]) {
      expect(p.curve).toHaveLength(CURVE_POINTS);
      expect(p.curve[0].travelMm).toBe(0);
      expect(p.curve[p.curve.length - 1].travelMm).toBe(p.travelMm);
      for (let i = 1; i < p.curve.length; i++)
        expect(p.curve[i].forceN).toBeGreaterThan(p.curve[i - 1].forceN);
      expect(p.pressure!.rangePsi[0]).toBeLessThanOrEqual(p.pressure!.psi);
      expect(p.pressure!.rangePsi[1]).toBeGreaterThanOrEqual(p.pressure!.psi);
      expect(p.pressure!.bar).toBeCloseTo(psiToBar(p.pressure!.psi), 12);
      expect(p.targetSagMm).toBeCloseTo((p.travelMm * p.targetSagPct) / 100, 12);
      expect(p.hardLandingLoadN).toBeCloseTo(HARD_LANDING_MULTIPLE * p.loadN, 9);
      expect(p.coilRate).toBeNull();
    }
    expect(r.shock!.leverageRatio).toBeCloseTo(165 / 60, 12);
    expect(r.shock!.wheelSagMm).toBeCloseTo((165 * r.shock!.targetSagPct) / 100, 12);
    expect(r.shock!.loadN).toBeCloseTo(80 * G0 * 0.72 * (165 / 60), 9); // m·g0·s_r,seated·LR
    expect(r.cautions).toEqual([...CAUTIONS]);
    expect(r.cautions).toHaveLength(6);
  });

  it('has overlays for spacers, end-stroke pressures around the set one and a hard landing', () => {
    const kinds = r.fork!.overlays.map((o) => o.kind);
    expect(kinds.filter((k) => k === 'spacers')).toHaveLength(3);
    const end = r.fork!.overlays.filter((o) => o.kind === 'end-stroke').map((o) => o.endStrokePsi!);
    expect(end.length).toBeGreaterThanOrEqual(2);
    expect(end.some((e) => e < 160) && end.some((e) => e > 160)).toBe(true);
    expect(kinds).toContain('fast-hit');
    expect(r.shock!.overlays.some((o) => o.kind === 'end-stroke')).toBe(false);
    // a hard landing (n = 1.4) is firmer than the slow curve at every travel past full extension
    const fast = r.fork!.overlays.find((o) => o.kind === 'fast-hit')!;
    for (let i = 1; i < fast.curve.length; i++)
      expect(fast.curve[i].forceN).toBeGreaterThan(r.fork!.curve[i].forceN);
    // travel used is read on the hard-landing curve, not the slow one
    expect(fast.travelUsedMm).toBe(r.fork!.travelUsedMm);
    const slowCrossing = r.fork!.curve.find((pt) => pt.forceN >= r.fork!.hardLandingLoadN);
    expect(slowCrossing === undefined || slowCrossing.travelMm > fast.travelUsedMm).toBe(true);
  });

  it('leaves air-only assumptions out when every spring is a coil', () => {
    const coil = computeBaseline(
      input({ fork: airFork({ spring: 'coil' }), shock: airShock({ spring: 'coil' }) }),
    );
    const keys = coil.assumptions.map((a) => a.key);
    expect(keys).not.toContain('conditions.ambientPressure');
    expect(keys).not.toContain('conditions.temperatureC');
    expect(keys).toContain('rider.frontShare');
    const mixed = computeBaseline(input({ fork: airFork({ spring: 'coil' }), shock: airShock() }));
    expect(mixed.assumptions.map((a) => a.key)).toContain('conditions.ambientPressure');
  });

  it('lists every default it used, with a source', () => {
    const keys = r.assumptions.map((a) => a.key);
    for (const key of [
      'rider.frontShare',
      'conditions.altitudeM',
      'conditions.temperatureC',
      'fork.targetSagPct',
      'fork.geometry.pistonDiameterMm',
      'fork.geometry.positiveLengthMm',
      'fork.geometry.endStrokeVolumeCm3',
      'fork.maxPressurePsi',
      'shock.geometry.negativeVolumeCm3',
      'shock.leverageRatioAtSag',
      'model.hardLandingMultiple',
    ]) {
      expect(keys).toContain(key);
    }
    expect(keys).not.toContain('shock.geometry.endStrokeVolumeCm3');
    for (const a of r.assumptions) expect(a.source.length).toBeGreaterThan(3);
    const given = computeBaseline(
      input({
        rider: { massKg: 80, frontShare: 0.45 },
        fork: airFork({ targetSagPct: 24, geometry: { pistonDiameterMm: 32 } }),
      }),
    );
    const givenKeys = given.assumptions.map((a) => a.key);
    expect(givenKeys).not.toContain('rider.frontShare');
    expect(givenKeys).not.toContain('fork.targetSagPct');
    expect(givenKeys).not.toContain('fork.geometry.pistonDiameterMm');
  });

  it('coil: rate = W / x_sag, in N/mm and lb/in, with the nearest stocked rate', () => {
    const c = computeBaseline(
      input({ fork: airFork({ spring: 'coil' }), shock: airShock({ spring: 'coil', targetSagPct: 30 }) }),
    );
    const W = 80 * G0 * 0.72 * (165 / 60); // seated rear share (estimate) × average leverage ratio
    const x = 0.3 * 60; // mm
    expect(c.shock!.coilRate!.nPerMm).toBeCloseTo(W / x, 9);
    expect(lbPerInToNPerMm(c.shock!.coilRate!.lbPerIn)).toBeCloseTo(W / x, 9);
    expect(c.shock!.coilRate!.suggestedLbPerIn % 25).toBe(0); // shock coils stocked every 25 lb/in (common practice)
    expect(Math.abs(c.shock!.coilRate!.suggestedLbPerIn - c.shock!.coilRate!.lbPerIn)).toBeLessThanOrEqual(
      12.5,
    );
    expect(c.fork!.coilRate!.suggestedLbPerIn % 5).toBe(0);
    expect(c.shock!.pressure).toBeNull();
    expect(c.shock!.curve[c.shock!.curve.length - 1].forceN).toBeCloseTo((W / x) * 60, 0);
    expect(c.shock!.travelUsedMm).toBe(60); // a linear spring: 5 × 30 % sag is past full travel
    expect(c.fork!.overlays).toEqual([]);
  });

  it('temperature: the gauge baseline is set where you ride; away from 20 °C it says what to pump indoors (ideal gas law)', () => {
    const warm = computeBaseline(input({ fork: airFork() }));
    const cold = computeBaseline(input({ conditions: { temperatureC: 0 }, fork: airFork() }));
    expect(cold.fork!.pressure!.psi).toBeCloseTo(warm.fork!.pressure!.psi, 9);
    const note = cold.fork!.warnings.find((w) => w.code === 'temperature-offset');
    expect(note).toBeDefined();
    // (P + 14.696)·293.15/273.15 − 14.696, the same air warmed from 0 °C to 20 °C
    const indoor = (warm.fork!.pressure!.psi + 14.6959488) * (293.15 / 273.15) - 14.6959488;
    expect(note!.message).toContain(`${Math.round(indoor)} psi`);
    expect(warm.fork!.warnings.some((w) => w.code === 'temperature-offset')).toBe(false);
  });

  it('altitude: the gauge needs a little more pressure where the air is thinner', () => {
    const sea = computeBaseline(input({ fork: airFork() })).fork!.pressure!.psi;
    const high = computeBaseline(input({ conditions: { altitudeM: 2500 }, fork: airFork() })).fork!.pressure!
      .psi;
    expect(high).toBeGreaterThan(sea);
    expect(high - sea).toBeLessThan(5);
  });
});

describe('warnings (stable codes)', () => {
  const codes = (b: BaselineInput, part: 'fork' | 'shock' = 'fork') =>
    computeBaseline(b)[part]!.warnings.map((w) => w.code);

  it('above-max-pressure when the baseline passes the rated maximum', () => {
    expect(codes(input({ rider: rider(120), fork: airFork({ maxPressurePsi: 90 }) }))).toContain(
      'above-max-pressure',
    );
    expect(codes(input({ fork: airFork() }))).not.toContain('above-max-pressure');
  });

  it('below-min-pressure for a very light rider', () => {
    expect(codes(input({ rider: rider(22), fork: airFork({ stanchionMm: 40 }) }))).toContain(
      'below-min-pressure',
    );
  });

  it('sag-out-of-range outside 10–40 %', () => {
    expect(codes(input({ fork: airFork({ targetSagPct: 45 }) }))).toContain('sag-out-of-range');
    expect(codes(input({ fork: airFork({ targetSagPct: 8 }) }))).toContain('sag-out-of-range');
    expect(codes(input({ fork: airFork({ targetSagPct: 25 }) }))).not.toContain('sag-out-of-range');
  });

  it('no-full-travel when a hard landing cannot use most of the travel', () => {
    const tight = input({
      fork: airFork({ spacers: 12, targetSagPct: 15, geometry: { spacerVolumeCm3: 5 } }),
    });
    expect(codes(tight)).toContain('no-full-travel');
  });

  it('bottoms-out-on-hard-landing names a change that keeps the same landing off the stop', () => {
    // 33 % sag with an end-stroke chamber at 180 psi on a 160 mm fork: the hard landing uses it all.
    const deep = computeBaseline(
      input({
        rider: rider(82),
        riding: { style: 'enduro', feel: 'balanced' },
        fork: airFork({ travelMm: 160, stanchionMm: 36, endStroke: { pressurePsi: 180 } }),
      }),
    ).fork!;
    expect(deep.travelUsedMm).toBeGreaterThan(159.5);
    const advice = deep.warnings.find((w) => w.code === 'bottoms-out-on-hard-landing');
    expect(advice).toBeDefined();
    // the change it names is one of the overlays, and that overlay stops short of full travel
    const named = deep.overlays.find((o) => advice!.message.includes(`${o.endStrokePsi ?? 'x'} psi`));
    expect(named).toBeDefined();
    expect(named!.travelUsedMm).toBeLessThan(159.5);
    // a trail fork at 23 % that keeps travel in reserve gets no such advice
    expect(codes(input({ fork: airFork({ travelMm: 140, stanchionMm: 34 }) }))).not.toContain(
      'bottoms-out-on-hard-landing',
    );
  });

  it('end-stroke-below-main when the end-stroke chamber is set under the main chamber', () => {
    expect(codes(input({ fork: airFork({ endStroke: { pressurePsi: 30 } }) }))).toContain(
      'end-stroke-below-main',
    );
  });

  it('leverage-ratio-unusual for a wheel travel that does not fit the stroke', () => {
    expect(codes(input({ shock: airShock({ strokeMm: 40, wheelTravelMm: 200 }) }), 'shock')).toContain(
      'leverage-ratio-unusual',
    );
  });

  it('each warning has a message', () => {
    const w = computeBaseline(input({ fork: airFork({ targetSagPct: 45, maxPressurePsi: 10 }) })).fork!
      .warnings;
    expect(w.length).toBeGreaterThan(0);
    for (const x of w) expect(x.message.length).toBeGreaterThan(20);
  });
});

describe('bad input names the field', () => {
  const field = (b: unknown) => {
    try {
      computeBaseline(b as BaselineInput);
    } catch (e) {
      if (e instanceof SpringModelInputError) return e.field;
      throw e;
    }
    return null;
  };

  it('spacers that close the chamber → fork.spacers', () => {
    expect(
      field(
        input({
          fork: airFork({
            travelMm: 120,
            spacers: 6,
            geometry: { positiveLengthMm: 130, spacerVolumeCm3: 2 },
          }),
        }),
      ),
    ).toBe('fork.spacers');
  });

  it('each bad value names its own field', () => {
    expect(field(input({ rider: rider(-5), fork: airFork() }))).toBe('rider.massKg');
    expect(field(input({ fork: airFork({ travelMm: 0 }) }))).toBe('fork.travelMm');
    expect(field(input({ riding: { style: 'gravel' as never, feel: 'balanced' }, fork: airFork() }))).toBe(
      'riding.style',
    );
    expect(field(input({}))).toBe('fork');
    expect(field(input({ shock: airShock({ geometry: { positiveLengthMm: 50 } }) }))).toBe(
      'shock.geometry.positiveLengthMm',
    );
    expect(field(input({ fork: airFork({ spacers: 1.5 }) }))).toBe('fork.spacers');
  });
});
