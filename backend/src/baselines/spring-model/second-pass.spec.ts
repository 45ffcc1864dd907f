import fc from 'fast-check';
import {
  BASELINE_LIMITS as L,
  RIDING_FEELS,
  RIDING_STYLES,
  type BaselineInput,
  type BaselineResult,
  type ForkInput,
  type MeasuredSpring,
  type PartResult,
  type SagCheckInput,
  type ShockInput,
} from '@loamline/shared-types';
import { springForce, springRate, storedEnergy } from './air-spring';
import { ambientPressure } from './atmosphere';
import { computeBaseline, airSetting, chargeOf } from './baseline';
import { forkGeometry, shockGeometry } from './defaults';
import { SpringModelInputError } from './limits';
import { DEFAULT_END_STROKE_MAX_PSI, HARD_LANDING_MULTIPLE } from './policy';
import { resolveContext, resolvePart } from './resolve';
import { sagCheck } from './sag-check';
import { travelUnderLoad } from './solve';
import { G0, kgToLb, paToPsi, psiToBar } from './units';

/*
 * The second pass over the baseline: every example of the issue that answered unsafely, the
 * safety properties over everything the API accepts, one load model for air and coil, continuous
 * defaults, and the hard landing on the fast curve.
 */

const trail = { style: 'trail', feel: 'balanced' } as const;
const fork160: ForkInput = { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 0 };
const shock65: ShockInput = { strokeMm: 65, wheelTravelMm: 160, spring: 'air', spacers: 0 };
const body = (over: Partial<BaselineInput>): BaselineInput => ({
  rider: { massKg: 80 },
  riding: trail,
  fork: null,
  shock: null,
  ...over,
});
const check = (over: Partial<SagCheckInput> & Pick<SagCheckInput, 'measured'>): SagCheckInput => ({
  ...body({}),
  ...over,
});
const refusal = (fn: () => unknown): SpringModelInputError => {
  try {
    fn();
  } catch (e) {
    if (e instanceof SpringModelInputError) return e;
    throw e;
  }
  throw new Error('expected the input to be refused');
};

describe('sag check: the examples that answered with no warning', () => {
  it('a shock measured 29 mm at 280 psi needs about 417 psi: a blocking error naming the shock’s 350 psi maximum, first', () => {
    const r = sagCheck(check({ shock: shock65, measured: { part: 'shock', pressurePsi: 280, sagMm: 29 } }));
    expect(r.newPressurePsi!).toBeGreaterThan(350);
    expect(r.warnings[0].severity).toBe('error');
    expect(r.warnings[0].code).toBe('above-max-pressure');
    expect(r.warnings[0].message).toContain("shock's maximum of 350 psi");
    expect(r.warnings[0].message).toContain('a default');
  });

  it('a fork measured 72 mm at 100 psi needs about 172 psi: a blocking error naming the 150 psi main-chamber maximum', () => {
    const r = sagCheck(check({ fork: fork160, measured: { part: 'fork', pressurePsi: 100, sagMm: 72 } }));
    expect(r.newPressurePsi!).toBeGreaterThan(150);
    expect(r.warnings[0]).toMatchObject({ code: 'above-max-pressure', severity: 'error' });
    expect(r.warnings[0].message).toContain("fork's main-chamber maximum of 150 psi");
  });

  it('a fork with a 190 psi end-stroke chamber measured 54 mm at 130 psi: past the main maximum → error', () => {
    const r = sagCheck(
      check({
        fork: { ...fork160, endStroke: { pressurePsi: 190 } },
        measured: { part: 'fork', pressurePsi: 130, sagMm: 54 },
      }),
    );
    expect(r.newPressurePsi!).toBeGreaterThan(150);
    expect(r.warnings[0]).toMatchObject({ code: 'above-max-pressure', severity: 'error' });
  });

  it('a main pressure at or above the end-stroke pressure is named, with a fix within the end-stroke maximum', () => {
    const r = sagCheck(
      check({
        fork: { ...fork160, maxPressurePsi: 250, endStroke: { pressurePsi: 150, maxPressurePsi: 220 } },
        measured: { part: 'fork', pressurePsi: 130, sagMm: 54 },
      }),
    );
    expect(r.newPressurePsi!).toBeGreaterThanOrEqual(150);
    const w = r.warnings.find((x) => x.code === 'end-stroke-below-main')!;
    expect(w.severity).toBe('warning');
    const advised = [...w.message.matchAll(/(\d+) psi/g)].map((m) => Number(m[1]));
    expect(Math.max(...advised)).toBeLessThanOrEqual(220);
  });

  it('10 mm at 5 psi (it answered −7 psi) is refused: too little air to be a measurement', () => {
    const e = refusal(() =>
      sagCheck(check({ fork: fork160, measured: { part: 'fork', pressurePsi: 5, sagMm: 10 } })),
    );
    expect(e.field).toBe('measured.pressurePsi');
  });

  it('900 psi measured (it answered "1,000 psi") is refused, naming the maximum', () => {
    for (const part of ['fork', 'shock'] as const) {
      const e = refusal(() =>
        sagCheck(check({ fork: fork160, shock: shock65, measured: { part, pressurePsi: 900, sagMm: 20 } })),
      );
      expect(e.field).toBe('measured.pressurePsi');
      expect(e.message).toContain('maximum');
    }
  });

  it('a sag that no working spring gives is refused, not corrected', () => {
    for (const sagMm of [2, 120]) {
      const e = refusal(() =>
        sagCheck(check({ fork: fork160, measured: { part: 'fork', pressurePsi: 80, sagMm } })),
      );
      expect(e.field).toBe('measured.sagMm');
    }
  });

  it('an answer below a settable pressure is no number at all, with a blocking error', () => {
    const r = sagCheck(check({ fork: fork160, measured: { part: 'fork', pressurePsi: 16, sagMm: 9 } }));
    if (r.newPressurePsi === null) {
      expect(r.changePsi).toBeNull();
      expect(r.warnings[0]).toMatchObject({ code: 'no-positive-pressure', severity: 'error' });
    } else {
      expect(r.newPressurePsi).toBeGreaterThanOrEqual(1);
      expect(r.warnings.some((w) => w.code === 'below-min-pressure')).toBe(true);
    }
  });
});

/* ----------------------------------------------------------------- safety over all accepted input */

const num = (l: { min: number; max: number }) => fc.double({ min: l.min, max: l.max, noNaN: true });
const opt = <T>(a: fc.Arbitrary<T>) => fc.option(a, { nil: undefined });
const arbGeometry = opt(
  fc.record(
    {
      pistonDiameterMm: num(L.pistonDiameterMm),
      shaftDiameterMm: num(L.shaftDiameterMm),
      positiveLengthMm: num(L.positiveLengthMm),
      negativeVolumeCm3: num(L.negativeVolumeCm3),
      spacerVolumeCm3: num(L.spacerVolumeCm3),
      endStrokeVolumeCm3: num(L.endStrokeVolumeCm3),
      polytropicIndex: num(L.polytropicIndex),
    },
    { requiredKeys: [] },
  ),
);
/**
 * A measured spring as a stored fit carries it: every value the API accepts, weighted towards
 * plausible columns (60–600 mm: most travels stay open) so the property mostly computes.
 */
const arbMeasured: fc.Arbitrary<MeasuredSpring> = fc.record({
  positiveLengthMm: fc.oneof(num({ min: 60, max: 600 }), num(L.positiveLengthMm)),
  negativeVolumeCm3: num(L.negativeVolumeCm3),
  endStrokeVolumeCm3: fc.option(num(L.endStrokeVolumeCm3), { nil: null }),
  frictionN: num({ min: 0, max: 500 }),
  label: fc.constant('measured on 2 December 2026 at a test shop'),
  measuredAt: fc.constant('2026-12-02T10:00:00.000Z'),
  shopName: fc.constant('a test shop'),
  appointmentId: fc.constant('00000000-0000-4000-8000-000000000000'),
});
const arbAnyFork: fc.Arbitrary<ForkInput> = fc.record(
  {
    travelMm: num(L.forkTravelMm),
    stanchionMm: num(L.stanchionMm),
    spring: fc.constantFrom('air' as const, 'air' as const, 'coil' as const),
    spacers: fc.integer({ min: 0, max: 12 }),
    endStroke: opt(
      fc.record(
        { pressurePsi: opt(num(L.endStrokePsi)), maxPressurePsi: opt(num(L.maxPressurePsi)) },
        { requiredKeys: [] },
      ),
    ),
    maxPressurePsi: opt(num(L.maxPressurePsi)),
    targetSagPct: opt(num(L.targetSagPct)),
    geometry: arbGeometry,
    measured: opt(arbMeasured),
  },
  { requiredKeys: ['travelMm', 'stanchionMm', 'spring', 'spacers'] },
);
const arbAnyShock: fc.Arbitrary<ShockInput> = fc.record(
  {
    strokeMm: num(L.shockStrokeMm),
    wheelTravelMm: num(L.wheelTravelMm),
    spring: fc.constantFrom('air' as const, 'air' as const, 'coil' as const),
    spacers: fc.integer({ min: 0, max: 12 }),
    maxPressurePsi: opt(num(L.maxPressurePsi)),
    targetSagPct: opt(num(L.targetSagPct)),
    leverageRatioAtSag: opt(num(L.leverageRatioAtSag)),
    geometry: arbGeometry,
    measured: opt(arbMeasured),
  },
  { requiredKeys: ['strokeMm', 'wheelTravelMm', 'spring', 'spacers'] },
);
const arbInput: fc.Arbitrary<BaselineInput> = fc
  .record({
    rider: fc.record(
      {
        massKg: num(L.massKg),
        frontShare: opt(num(L.frontShare)),
        seatedRearShare: opt(num(L.seatedRearShare)),
      },
      { requiredKeys: ['massKg'] },
    ),
    riding: fc.record({ style: fc.constantFrom(...RIDING_STYLES), feel: fc.constantFrom(...RIDING_FEELS) }),
    conditions: opt(
      fc.record(
        {
          altitudeM: opt(num(L.altitudeM)),
          pumpAltitudeM: opt(num(L.altitudeM)),
          temperatureC: opt(num(L.temperatureC)),
        },
        { requiredKeys: [] },
      ),
    ),
    fork: fc.option(arbAnyFork, { nil: null }),
    shock: fc.option(arbAnyShock, { nil: null }),
  })
  .filter((i) => i.fork !== null || i.shock !== null);

const errorCodes = (p: { warnings: { code: string; severity: string }[] }) =>
  p.warnings.filter((w) => w.severity === 'error').map((w) => w.code);

/** Every pressure a part shows: never negative, never past a maximum without a blocking error. */
function expectSafePart(p: PartResult, part: 'fork' | 'shock', input: ForkInput | ShockInput) {
  const errors = errorCodes(p);
  for (let i = 1; i < p.warnings.length; i++) {
    const order = { error: 0, warning: 1, info: 2 };
    expect(order[p.warnings[i].severity]).toBeGreaterThanOrEqual(order[p.warnings[i - 1].severity]);
  }
  if (p.pressure) {
    const pr = p.pressure;
    for (const v of [pr.psi, pr.bar, ...pr.rangePsi, ...pr.rangeBar, pr.atRidePsi ?? 0]) {
      expect(Number.isFinite(v)).toBe(true);
      expect(v).toBeGreaterThanOrEqual(0);
    }
    expect(pr.psi).toBeGreaterThanOrEqual(1);
    if (pr.psi > pr.maxPsi) expect(errors).toContain('above-max-pressure');
    expect(pr.maxPsi).toBe(input.maxPressurePsi ?? (part === 'fork' ? 150 : 350));
  } else if (input.spring === 'air') {
    expect(errors).toContain('no-positive-pressure');
  }
  if (p.endStroke) {
    const e = p.endStroke;
    expect(e.recommendedPsi).toBeGreaterThan(0);
    expect(e.recommendedPsi).toBeLessThanOrEqual(e.maxPsi);
    if (!e.given) expect(e.psi).toBe(e.recommendedPsi);
    if (e.psi > e.maxPsi) expect(errors).toContain('end-stroke-above-max');
    for (const o of p.overlays)
      if (o.kind === 'end-stroke') expect(o.endStrokePsi!).toBeLessThanOrEqual(e.maxPsi);
  }
  if (p.measuredSpring) {
    // only an air spring with a positive pressure compares with the default geometry
    expect(input.spring).toBe('air');
    expect(input.measured).toBeTruthy();
    expect(p.measuredSpring.label).toBe(input.measured!.label);
    expect(p.measuredSpring.defaultPressurePsi).toBeGreaterThanOrEqual(1);
    expect(Number.isFinite(p.measuredSpring.differencePct)).toBe(true);
  }
  for (const w of p.warnings) {
    // advice never names a pressure past the maximum it concerns
    if (w.code === 'bottoms-out-on-hard-landing' && p.endStroke) {
      const m = /end-stroke pressure to (\d+) psi/.exec(w.message);
      if (m) expect(Number(m[1])).toBeLessThanOrEqual(p.endStroke.maxPsi);
    }
    expect(w.message).not.toMatch(/-\d+(\.\d+)? (psi|bar)/);
    expect(w.message).not.toMatch(/NaN|Infinity|undefined/);
  }
}

describe('safety over every input the API accepts (fast-check)', () => {
  it('no negative pressure, no value past a maximum without a blocking error', () => {
    fc.assert(
      fc.property(arbInput, (input) => {
        let r: BaselineResult;
        try {
          r = computeBaseline(input);
        } catch (e) {
          expect(e).toBeInstanceOf(SpringModelInputError);
          return;
        }
        if (r.fork) expectSafePart(r.fork, 'fork', input.fork!);
        if (r.shock) expectSafePart(r.shock, 'shock', input.shock!);
      }),
      { numRuns: 1000 },
    );
  });

  it('the sag check likewise: never negative, past a maximum only with a blocking error first', () => {
    fc.assert(
      fc.property(
        arbInput,
        fc.constantFrom('fork' as const, 'shock' as const),
        num(L.measuredPressurePsi),
        num(L.measuredSagMm),
        (input, part, pressurePsi, sagMm) => {
          try {
            const r = sagCheck({ ...input, measured: { part, pressurePsi, sagMm } });
            if (r.newPressurePsi === null) {
              expect(r.warnings[0].severity).toBe('error');
              return;
            }
            expect(r.newPressurePsi).toBeGreaterThanOrEqual(1);
            expect(r.newPressureBar!).toBeGreaterThan(0);
            if (r.newPressurePsi > r.maxPsi) expect(r.warnings[0]).toMatchObject({ severity: 'error' });
            // a measurement past the maximum never gets this far
            expect(pressurePsi).toBeLessThanOrEqual(r.maxPsi);
          } catch (e) {
            expect(e).toBeInstanceOf(SpringModelInputError);
          }
        },
      ),
      { numRuns: 1000 },
    );
  });
});

/* ----------------------------------------------------------------- one consistent model */

describe('one consistent model', () => {
  it('a hard landing is read on the fast curve (γ = 1.4 by default, NBS Circular 564)', () => {
    const input = body({ fork: fork160 });
    const r = computeBaseline(input).fork!;
    expect(r.hardLandingIndex).toBe(1.4);
    const ctx = resolveContext(input);
    const rp = resolvePart('fork', fork160, ctx);
    const set = airSetting(rp, ctx);
    const fast = travelUnderLoad(rp.air!, chargeOf(set.p0, null, ctx, 1.4), HARD_LANDING_MULTIPLE * rp.loadN);
    const slow = travelUnderLoad(rp.air!, chargeOf(set.p0, null, ctx, 1), HARD_LANDING_MULTIPLE * rp.loadN);
    expect(r.travelUsedMm).toBeCloseTo(fast * 1000, 9);
    expect(fast).toBeLessThan(slow); // the same landing uses less travel when it is fast
  });

  it('a coil ignores air-only fields everywhere: an end-stroke chamber does not move its sag or rate', () => {
    for (const style of RIDING_STYLES) {
      const coil = { ...fork160, spring: 'coil' as const };
      const plain = computeBaseline(body({ riding: { style, feel: 'balanced' }, fork: coil })).fork!;
      const withEnd = computeBaseline(
        body({
          riding: { style, feel: 'balanced' },
          fork: { ...coil, spacers: 3, maxPressurePsi: 90, endStroke: { pressurePsi: 150 } },
        }),
      ).fork!;
      expect(withEnd.targetSagPct).toBe(plain.targetSagPct);
      expect(withEnd.coilRate).toEqual(plain.coilRate);
      expect(withEnd.endStroke).toBeNull();
      expect(withEnd.warnings.map((w) => w.code)).toEqual(['air-settings-ignored']);
      expect(withEnd.warnings[0].severity).toBe('info');
    }
  });

  it('rear: one load model, and both rules of thumb hold at once with the default geometry', () => {
    // air shock: psi ≈ rider weight in lb at LR 2.6–2.9, 30 % sag (from memory)
    for (const strokeMm of [50, 57.5, 65]) {
      for (const lr of [2.6, 2.75, 2.9]) {
        for (const massKg of [60, 80, 100]) {
          const shock = { ...shock65, strokeMm, wheelTravelMm: strokeMm * lr, targetSagPct: 30 };
          const air = computeBaseline(body({ rider: { massKg }, shock })).shock!;
          const ratio = air.pressure!.psi / kgToLb(massKg);
          expect(ratio).toBeGreaterThan(0.85); // from memory
          expect(ratio).toBeLessThan(1.15);
          const coil = computeBaseline(
            body({ rider: { massKg }, shock: { ...shock, spring: 'coil' } }),
          ).shock!;
          expect(coil.loadN).toBeCloseTo(air.loadN, 9); // the same load for air and coil
        }
      }
    }
    // coil: roughly 400–550 lb/in for an 80 kg rider, 65 mm stroke, 160 mm bike (from memory)
    for (const style of ['trail', 'enduro'] as const) {
      const coil = computeBaseline(
        body({ riding: { style, feel: 'balanced' }, shock: { ...shock65, spring: 'coil' } }),
      ).shock!;
      expect(coil.coilRate!.lbPerIn).toBeGreaterThanOrEqual(400); // from memory
      expect(coil.coilRate!.lbPerIn).toBeLessThanOrEqual(550);
    }
  });

  it('rear load: seated rear share × leverage ratio at sag when known, the average otherwise', () => {
    const avg = computeBaseline(body({ shock: shock65 })).shock!;
    expect(avg.loadN).toBeCloseTo(80 * G0 * 0.72 * (160 / 65), 9);
    expect(avg.leverageRatioIsAverage).toBe(true);
    const known = computeBaseline(
      body({ rider: { massKg: 80, seatedRearShare: 0.7 }, shock: { ...shock65, leverageRatioAtSag: 2.9 } }),
    ).shock!;
    expect(known.loadN).toBeCloseTo(80 * G0 * 0.7 * 2.9, 9);
    expect(known.leverageRatio).toBe(2.9);
    expect(known.leverageRatioIsAverage).toBe(false);
  });

  it('with the recommended end-stroke pressure the product never says its own baseline bottoms out', () => {
    for (const style of RIDING_STYLES)
      for (const feel of RIDING_FEELS)
        for (const travelMm of [100, 120, 140, 160, 180])
          for (const massKg of [55, 80, 110]) {
            const f = computeBaseline(
              body({
                rider: { massKg },
                riding: { style, feel },
                fork: { ...fork160, travelMm, endStroke: {} },
              }),
            ).fork!;
            const e = f.endStroke!;
            expect(e.given).toBe(false);
            expect(e.recommendedPsi).toBeLessThanOrEqual(DEFAULT_END_STROKE_MAX_PSI);
            expect(e.recommendedPsi).toBeGreaterThanOrEqual(2 * f.pressure!.psi); // common practice, no source: about 2–3 × main
            expect(f.warnings.map((w) => w.code)).not.toContain('bottoms-out-on-hard-landing');
            expect(f.travelUsedMm).toBeLessThan(travelMm);
            // a reserve a gauge a few psi off does not use up (3 % of travel, an estimate)
            if (e.recommendedPsi < DEFAULT_END_STROKE_MAX_PSI - 5)
              expect(e.recommendedTravelUsedMm).toBeLessThanOrEqual(0.97 * travelMm + 1e-9);
            // and set by hand to the same pressure, the answer is the same
            const given = computeBaseline(
              body({
                rider: { massKg },
                riding: { style, feel },
                fork: { ...fork160, travelMm, endStroke: { pressurePsi: e.recommendedPsi } },
              }),
            ).fork!;
            expect(given.warnings.map((w) => w.code)).not.toContain('bottoms-out-on-hard-landing');
          }
  });

  it('an end-stroke pressure past its own maximum is a blocking error, and nothing advises past it', () => {
    const f = computeBaseline(
      body({ fork: { ...fork160, endStroke: { pressurePsi: 260, maxPressurePsi: 220 } } }),
    ).fork!;
    expect(f.warnings[0]).toMatchObject({ code: 'end-stroke-above-max', severity: 'error' });
    expect(f.warnings[0].message).toContain("end-stroke chamber's maximum of 220 psi");
    for (const o of f.overlays) if (o.kind === 'end-stroke') expect(o.endStrokePsi!).toBeLessThanOrEqual(220);
  });
});

describe('continuous default geometry', () => {
  /** Samples a baseline pressure along one input; no step may jump more than the trend allows. */
  function expectContinuous(at: (v: number) => number, from: number, to: number, h: number) {
    const values: number[] = [];
    const n = Math.round((to - from) / h);
    for (let i = 0; i <= n; i++) values.push(at(Math.min(to, from + i * h)));
    const steps = values.slice(1).map((v, i) => Math.abs(v - values[i]));
    const trend = Math.max(
      ...steps.map(
        (_, i) => Math.abs(values[Math.min(i + 20, values.length - 1)] - values[Math.max(i - 20, 0)]) / 40,
      ),
    );
    for (const s of steps) expect(s).toBeLessThanOrEqual(2 * trend + 0.05);
  }

  it('stanchion 37.0 → 37.1 mm no longer moves the fork pressure by 10 psi; no jump across 20–45 mm', () => {
    const psi = (stanchionMm: number) =>
      computeBaseline(body({ fork: { ...fork160, stanchionMm } })).fork!.pressure!.psi;
    expect(Math.abs(psi(37.1) - psi(37.0))).toBeLessThan(1);
    expectContinuous(psi, 20, 45, 0.1);
  });

  it('stroke 67.5 → 67.6 mm no longer moves the shock pressure by 19 psi; no jump across 20–110 mm', () => {
    const psi = (strokeMm: number) =>
      computeBaseline(body({ shock: { ...shock65, strokeMm, wheelTravelMm: strokeMm * 2.3 } })).shock!
        .pressure!.psi;
    expect(Math.abs(psi(67.6) - psi(67.5))).toBeLessThan(1);
    expectContinuous(psi, 20, 110, 0.25);
  });

  it('outside the table the answer says it extrapolated', () => {
    expect(forkGeometry(44, 160, false).extrapolated).toBe(true);
    expect(forkGeometry(36.5, 160, false).extrapolated).toBe(false);
    expect(shockGeometry(100).extrapolated).toBe(true);
    const r = computeBaseline(body({ fork: { ...fork160, stanchionMm: 44 } }));
    expect(r.fork!.warnings.some((w) => w.code === 'geometry-extrapolated')).toBe(true);
    expect(r.assumptions.find((a) => a.key === 'fork.geometry.pistonDiameterMm')!.label).toContain(
      'extrapolated',
    );
    const given = computeBaseline(
      body({
        fork: {
          ...fork160,
          stanchionMm: 44,
          geometry: { pistonDiameterMm: 41, shaftDiameterMm: 12, spacerVolumeCm3: 3 },
        },
      }),
    );
    expect(given.fork!.warnings.some((w) => w.code === 'geometry-extrapolated')).toBe(false);
  });
});

describe('what the answer carries', () => {
  const input = body({ fork: fork160, shock: shock65 });
  const r = computeBaseline(input);

  it('the range in bar as well as psi (NIST SP 811: 1 bar = 100 000 Pa)', () => {
    for (const p of [r.fork!, r.shock!]) {
      const [lo, hi] = p.pressure!.rangeBar;
      expect(Math.abs(lo - psiToBar(p.pressure!.rangePsi[0]))).toBeLessThanOrEqual(0.06);
      expect(Math.abs(hi - psiToBar(p.pressure!.rangePsi[1]))).toBeLessThanOrEqual(0.06);
    }
  });

  it('rate at sag = dF/dx, checked against a central difference of the force', () => {
    const ctx = resolveContext(input);
    const rp = resolvePart('fork', fork160, ctx);
    const set = airSetting(rp, ctx);
    const c = chargeOf(set.p0, null, ctx, 1);
    const x = (rp.air!.travel * rp.targetPct) / 100;
    const h = 1e-6;
    const numeric = (springForce(rp.air!, c, x + h) - springForce(rp.air!, c, x - h)) / (2 * h) / 1000;
    expect(r.fork!.rateAtSagNPerMm).toBeCloseTo(numeric, 3);
    expect(r.fork!.rateAtSagNPerMm).toBeCloseTo(springRate(rp.air!, c, x) / 1000, 9);
    expect(r.fork!.energyToFullTravelJ).toBeCloseTo(storedEnergy(rp.air!, c, rp.air!.travel), 6);
  });

  it('a coil: rate at sag is W / x_sag and energy ½·k·T² (Hooke’s law, closed form)', () => {
    const c = computeBaseline(body({ shock: { ...shock65, spring: 'coil' } })).shock!;
    const k = c.loadN / (c.targetSagMm / 1000); // N/m
    expect(c.rateAtSagNPerMm).toBeCloseTo(k / 1000, 9);
    expect(c.energyToFullTravelJ).toBeCloseTo(0.5 * k * 0.065 ** 2, 9);
  });

  it('pumped at altitude A, ridden at altitude B: the chamber keeps its absolute pressure (U.S. Standard Atmosphere 1976)', () => {
    const ride = computeBaseline(body({ conditions: { altitudeM: 2000 }, fork: fork160 })).fork!.pressure!;
    const pumpedLow = computeBaseline(
      body({ conditions: { altitudeM: 2000, pumpAltitudeM: 0 }, fork: fork160 }),
    ).fork!;
    const diffPsi = paToPsi(ambientPressure(0) - ambientPressure(2000));
    expect(pumpedLow.pressure!.psi).toBeCloseTo(ride.psi - diffPsi, 6);
    expect(pumpedLow.pressure!.atRidePsi!).toBeCloseTo(ride.psi, 6);
    expect(pumpedLow.warnings.some((w) => w.code === 'pump-altitude' && w.severity === 'info')).toBe(true);
  });

  it('spacer overlays show removing spacers too (0…N fitted), at the same pressure', () => {
    const f = computeBaseline(body({ fork: { ...fork160, spacers: 2 } })).fork!;
    const counts = f.overlays.filter((o) => o.kind === 'spacers').map((o) => o.spacers);
    expect(counts).toEqual([0, 1, 3, 4, 5]);
  });
});

describe('trade facts on the hard-landing curve (common practice, no source)', () => {
  it('raising the end-stroke pressure from about 2× to 3× the main pressure firms the end while full travel stays reachable', () => {
    const input = body({ fork: { ...fork160, travelMm: 150, endStroke: {} } });
    const ctx = resolveContext(input);
    const rp = resolvePart('fork', input.fork!, ctx);
    const set = airSetting(rp, ctx);
    const T = rp.air!.travel;
    const steps = [2, 2.25, 2.5, 2.75, 3].map((k) => k * set.psi);
    const endForce = steps.map((e) => springForce(rp.air!, chargeOf(set.p0, e, ctx, 1.4), T));
    for (let i = 1; i < steps.length; i++) expect(endForce[i]).toBeGreaterThan(endForce[i - 1]);
    for (const e of steps) {
      const used = travelUnderLoad(rp.air!, chargeOf(set.p0, e, ctx, 1.4), HARD_LANDING_MULTIPLE * rp.loadN);
      expect(used).toBeGreaterThanOrEqual(0.9 * T); // full travel stays within reach of a hard landing
    }
  });
});
