import type { AirSpringGeometry, BaselineInput } from '@loamline/shared-types';
import { makeAirSpring, springForce } from './air-spring';
import { computeBaseline } from './baseline';
import { forkGeometry, shockGeometry } from './defaults';
import {
  type BenchRun,
  compareRun,
  FIT_THRESHOLDS,
  type FitPart,
  fitSpring,
  modelCurve,
  type SpringFitResult,
} from './fit';
import { interpolate, invertSymmetric, runsTest } from './fit-math';
import { SpringModelInputError } from './limits';
import { circleArea, cm3ToM3, mmToM, P_STD_PA, psiToPa } from './units';

/*
 * The curves here are generated with the model's own force law (air-spring.ts, called directly, not
 * through fit.ts) from known geometry, with a friction offset and seeded normal noise added; the fit
 * must find the geometry back. Checks against something outside the project are marked with their
 * source.
 */

/** mulberry32, a small seeded 32-bit PRNG (public-domain algorithm), uniform on [0, 1). */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A standard normal number from two uniform ones (the polar-coordinates transform). */
function normal(rand: () => number): number {
  const u = 1 - rand();
  const v = rand();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

interface Setting {
  label: string;
  mainPsi: number;
  endStrokePsi: number | null;
  spacers: number;
}

/** A bench run from the model: compression and rebound every `stepMm`, friction and noise added. */
function benchRun(
  g: AirSpringGeometry,
  travelMm: number,
  setting: Setting,
  opts: {
    frictionN: number;
    noiseN: number;
    stepMm: number;
    rand: () => number;
    extra?: (t: number) => number;
  },
): BenchRun {
  const spring = makeAirSpring(
    {
      pistonDiameter: mmToM(g.pistonDiameterMm),
      shaftDiameter: mmToM(g.shaftDiameterMm),
      positiveLength: mmToM(g.positiveLengthMm),
      negativeVolume: cm3ToM3(g.negativeVolumeCm3),
      spacerVolume: cm3ToM3(g.spacerVolumeCm3),
      spacers: setting.spacers,
      endStrokeVolume: setting.endStrokePsi === null ? 0 : cm3ToM3(g.endStrokeVolumeCm3),
      travel: mmToM(travelMm),
    },
    'fork',
  );
  const charge = {
    p0: psiToPa(setting.mainPsi) + P_STD_PA,
    pEnd: setting.endStrokePsi === null ? null : psiToPa(setting.endStrokePsi) + P_STD_PA,
    pAmb: P_STD_PA,
    n: 1,
  };
  const points: BenchRun['points'] = [];
  for (const stroke of ['compression', 'rebound'] as const) {
    const count = Math.round(travelMm / opts.stepMm);
    for (let i = 0; i <= count; i++) {
      const t = (travelMm * i) / count;
      const friction = stroke === 'compression' ? opts.frictionN : -opts.frictionN;
      const forceN =
        springForce(spring, charge, mmToM(t)) +
        (opts.extra?.(t) ?? 0) +
        friction +
        opts.noiseN * normal(opts.rand);
      points.push({ travelMm: t, forceN, stroke });
    }
  }
  return { ...setting, points };
}

const relErr = (got: number, want: number) => Math.abs(got - want) / Math.abs(want);

/** The baseline pressure (trail, 80 kg) of a part with a geometry override. */
function baselinePsi(part: FitPart, geometry: Partial<AirSpringGeometry>, endStrokePsi?: number): number {
  const input: BaselineInput = {
    rider: { massKg: 80 },
    riding: { style: 'trail', feel: 'balanced' },
    fork:
      part === 'fork'
        ? {
            travelMm: 150,
            stanchionMm: 36,
            spring: 'air',
            spacers: 0,
            geometry,
            ...(endStrokePsi === undefined ? {} : { endStroke: { pressurePsi: endStrokePsi } }),
          }
        : null,
    shock:
      part === 'shock' ? { strokeMm: 60, wheelTravelMm: 165, spring: 'air', spacers: 0, geometry } : null,
  };
  const r = computeBaseline(input);
  return (part === 'fork' ? r.fork : r.shock)!.pressure!.psi;
}

/* -------------------------------------------------------------------------- the test springs */

// 36 mm stanchion, 150 mm fork: the default geometry (defaults.ts), D 33 mm, d 10 mm, L₀ 240 mm.
const FORK_TRAVEL = 150;
const FORK = forkGeometry(36, FORK_TRAVEL, false).geometry;
// the same fork as built with an end-stroke chamber: L₀ = 1.4·T, V_e = 0.35·A·L₀
const FORK_END = forkGeometry(36, FORK_TRAVEL, true).geometry;
// 60 mm stroke shock: D 49 mm, d 10 mm, L₀ 96 mm
const SHOCK_STROKE = 60;
const SHOCK = shockGeometry(SHOCK_STROKE).geometry;

/*
 * Noise: σ = 8 N on a fork curve spanning about 1.7 kN (0.5 %), σ = 20 N on a shock spanning about
 * 9 kN (0.2 %): what a bench load cell of about 0.5 % of full scale shows (from memory). Friction:
 * 25 N (fork), 40 N (shock), a plausible seal drag (estimate).
 */
const FORK_NOISE = { frictionN: 25, noiseN: 8, stepMm: 5 };
const SHOCK_NOISE = { frictionN: 40, noiseN: 20, stepMm: 2 };

const forkRuns = (seed: number) => {
  const rand = mulberry32(seed);
  return [
    { label: '60 psi', mainPsi: 60, endStrokePsi: null, spacers: 0 },
    { label: '80 psi, 1 spacer', mainPsi: 80, endStrokePsi: null, spacers: 1 },
    { label: '100 psi, 2 spacers', mainPsi: 100, endStrokePsi: null, spacers: 2 },
  ].map((s) => benchRun(FORK, FORK_TRAVEL, s, { ...FORK_NOISE, rand }));
};

const FORK_KNOWN = { travelMm: FORK_TRAVEL, stanchionMm: 36 };

/** The fitted value is within `k` standard errors of the truth: the reported errors are honest. */
function withinStandardErrors(fit: SpringFitResult, truth: Record<string, number>, k = 4) {
  for (const [key, want] of Object.entries(truth)) {
    const got = key === 'frictionN' ? fit.frictionN : fit.geometry[key as keyof SpringFitResult['geometry']]!;
    const se = fit.standardErrors[key as keyof SpringFitResult['standardErrors']];
    expect(se).not.toBeNull();
    expect(Math.abs(got - want)).toBeLessThan(k * se!);
  }
}

describe('fitSpring: a fork measured at three settings', () => {
  const fit = fitSpring({ part: 'fork', known: FORK_KNOWN, runs: forkRuns(1) });

  it('finds L₀, the negative chamber and friction back', () => {
    // Tolerances: L₀ 1 %, V₋₀ 5 %, friction 3 N. At this noise the standard errors are about
    // 0.1 % (L₀), 0.7 % (V₋₀) and 0.6 N: each tolerance is at least 5 of them.
    expect(relErr(fit.geometry.positiveLengthMm, FORK.positiveLengthMm)).toBeLessThan(0.01);
    expect(relErr(fit.geometry.negativeVolumeCm3, FORK.negativeVolumeCm3)).toBeLessThan(0.05);
    expect(Math.abs(fit.frictionN - FORK_NOISE.frictionN)).toBeLessThan(3);
    expect(fit.geometry.endStrokeVolumeCm3).toBeNull();
    withinStandardErrors(fit, {
      positiveLengthMm: FORK.positiveLengthMm,
      negativeVolumeCm3: FORK.negativeVolumeCm3,
      frictionN: FORK_NOISE.frictionN,
    });
  });

  it('reports a good fit at the noise level, every parameter identified', () => {
    expect(fit.quality).toBe('good');
    expect(fit.reasons).toEqual([]);
    // the RMS of a correct fit is the noise σ (to within sampling: 186 points, ±10 %)
    expect(fit.rmsN / FORK_NOISE.noiseN).toBeGreaterThan(0.85);
    expect(fit.rmsN / FORK_NOISE.noiseN).toBeLessThan(1.1);
    expect(fit.relativeRms).toBeCloseTo(fit.rmsN / fit.forceRangeN, 12);
    expect(fit.perRun.map((r) => r.label)).toEqual(['60 psi', '80 psi, 1 spacer', '100 psi, 2 spacers']);
    expect(fit.identified).toEqual({
      positiveLengthMm: true,
      negativeVolumeCm3: true,
      endStrokeVolumeCm3: false,
      frictionN: true,
    });
    expect(fit.polytropicIndex).toBe(1);
    expect(fit.known.defaulted).toEqual([
      'known.pistonDiameterMm',
      'known.shaftDiameterMm',
      'known.spacerVolumeCm3',
    ]);
  });

  it('gives a baseline pressure within 2 % of the true geometry’s', () => {
    const truth = baselinePsi('fork', {});
    const fitted = baselinePsi('fork', {
      positiveLengthMm: fit.geometry.positiveLengthMm,
      negativeVolumeCm3: fit.geometry.negativeVolumeCm3,
    });
    expect(relErr(fitted, truth)).toBeLessThan(0.02);
  });
});

describe('fitSpring: a shock measured at three settings', () => {
  const rand = mulberry32(2);
  const runs = [
    { label: '150 psi', mainPsi: 150, endStrokePsi: null, spacers: 0 },
    { label: '200 psi, 1 spacer', mainPsi: 200, endStrokePsi: null, spacers: 1 },
    { label: '250 psi, 2 spacers', mainPsi: 250, endStrokePsi: null, spacers: 2 },
  ].map((s) => benchRun(SHOCK, SHOCK_STROKE, s, { ...SHOCK_NOISE, rand }));
  const fit = fitSpring({ part: 'shock', known: { travelMm: SHOCK_STROKE }, runs });

  it('finds L₀, the negative chamber and friction back, and the baseline within 2 %', () => {
    // Tolerances: L₀ 1 %, V₋₀ 5 %, friction 6 N (standard errors about 0.04 %, 0.3 %, 1.4 N).
    expect(relErr(fit.geometry.positiveLengthMm, SHOCK.positiveLengthMm)).toBeLessThan(0.01);
    expect(relErr(fit.geometry.negativeVolumeCm3, SHOCK.negativeVolumeCm3)).toBeLessThan(0.05);
    expect(Math.abs(fit.frictionN - SHOCK_NOISE.frictionN)).toBeLessThan(6);
    withinStandardErrors(fit, {
      positiveLengthMm: SHOCK.positiveLengthMm,
      negativeVolumeCm3: SHOCK.negativeVolumeCm3,
      frictionN: SHOCK_NOISE.frictionN,
    });
    expect(fit.quality).toBe('good');
    const truth = baselinePsi('shock', {});
    const fitted = baselinePsi('shock', {
      positiveLengthMm: fit.geometry.positiveLengthMm,
      negativeVolumeCm3: fit.geometry.negativeVolumeCm3,
    });
    expect(relErr(fitted, truth)).toBeLessThan(0.02);
  });
});

describe('fitSpring: the end-stroke chamber', () => {
  it('is recovered when the runs reach the travel where it joins', () => {
    // joins at x_j = L₀·(1 − p₀/p_e) (abs): 70/150 psi → about 102 mm of 150, so every run reaches it
    const rand = mulberry32(3);
    const runs = [
      { label: '70/150', mainPsi: 70, endStrokePsi: 150, spacers: 0 },
      { label: '80/200', mainPsi: 80, endStrokePsi: 200, spacers: 0 },
      { label: '60/130, 1 spacer', mainPsi: 60, endStrokePsi: 130, spacers: 1 },
    ].map((s) => benchRun(FORK_END, FORK_TRAVEL, s, { ...FORK_NOISE, rand }));
    const fit = fitSpring({ part: 'fork', known: FORK_KNOWN, runs });
    expect(fit.perRun.every((r) => r.reachesEndStroke === true)).toBe(true);
    expect(fit.identified.endStrokeVolumeCm3).toBe(true);
    // Tolerances: L₀ 1 %, V₋₀ 5 %, V_e 8 % (its standard error is about 1.8 %: few points past the join)
    expect(relErr(fit.geometry.endStrokeVolumeCm3!, FORK_END.endStrokeVolumeCm3)).toBeLessThan(0.08);
    expect(relErr(fit.geometry.positiveLengthMm, FORK_END.positiveLengthMm)).toBeLessThan(0.01);
    expect(relErr(fit.geometry.negativeVolumeCm3, FORK_END.negativeVolumeCm3)).toBeLessThan(0.05);
    withinStandardErrors(fit, {
      positiveLengthMm: FORK_END.positiveLengthMm,
      endStrokeVolumeCm3: FORK_END.endStrokeVolumeCm3,
    });
    expect(fit.quality).toBe('good');
    const truth = baselinePsi('fork', {}, 150);
    const fitted = baselinePsi(
      'fork',
      {
        positiveLengthMm: fit.geometry.positiveLengthMm,
        negativeVolumeCm3: fit.geometry.negativeVolumeCm3,
        endStrokeVolumeCm3: fit.geometry.endStrokeVolumeCm3!,
      },
      150,
    );
    expect(relErr(fitted, truth)).toBeLessThan(0.02);
  });

  it('is reported not identified when no run reaches the join', () => {
    // 60/300 psi joins at about 160 mm and 70/300 at about 153 mm: past the 150 mm travel
    const rand = mulberry32(4);
    const runs = [
      { label: '60/300', mainPsi: 60, endStrokePsi: 300, spacers: 0 },
      { label: '70/300', mainPsi: 70, endStrokePsi: 300, spacers: 0 },
    ].map((s) => benchRun(FORK_END, FORK_TRAVEL, s, { ...FORK_NOISE, rand }));
    const fit = fitSpring({ part: 'fork', known: FORK_KNOWN, runs });
    expect(fit.identified.endStrokeVolumeCm3).toBe(false);
    expect(fit.geometry.endStrokeVolumeCm3).toBeNull();
    expect(fit.standardErrors.endStrokeVolumeCm3).toBeNull();
    expect(fit.perRun.map((r) => r.reachesEndStroke)).toEqual([false, false]);
    expect(fit.notes.join(' ')).toMatch(/end-stroke chamber volume is not identified/);
    // the rest is still found, and the fit is good
    expect(relErr(fit.geometry.positiveLengthMm, FORK_END.positiveLengthMm)).toBeLessThan(0.01);
    expect(fit.quality).toBe('good');
  });
});

describe('fitSpring: a curve no air spring gives', () => {
  it('a coil’s straight line F = k·x is a poor fit, with the reasons', () => {
    const rand = mulberry32(5);
    const k = 8; // N/mm
    const points: BenchRun['points'] = [];
    for (const stroke of ['compression', 'rebound'] as const) {
      for (let t = 0; t <= FORK_TRAVEL; t += 5) {
        const friction = stroke === 'compression' ? 20 : -20;
        points.push({ travelMm: t, forceN: k * t + friction + 8 * normal(rand), stroke });
      }
    }
    const fit = fitSpring({
      part: 'fork',
      known: FORK_KNOWN,
      runs: [{ label: 'coil', mainPsi: 80, endStrokePsi: null, spacers: 0, points }],
    });
    expect(fit.quality).toBe('poor');
    expect(fit.reasons.length).toBeGreaterThan(0);
    expect(fit.reasons.join(' ')).toMatch(/systematic/);
    expect(fit.residualRuns.z).toBeLessThan(FIT_THRESHOLDS.systematicRunsZ);
  });

  it('the same line at two pump settings is far off: the pressure does not change a coil', () => {
    const points: BenchRun['points'] = [];
    for (const stroke of ['compression', 'rebound'] as const) {
      for (let t = 0; t <= FORK_TRAVEL; t += 5) {
        points.push({ travelMm: t, forceN: 8 * t + (stroke === 'compression' ? 20 : -20), stroke });
      }
    }
    const fit = fitSpring({
      part: 'fork',
      known: FORK_KNOWN,
      runs: [
        { label: '60', mainPsi: 60, endStrokePsi: null, spacers: 0, points },
        { label: '100', mainPsi: 100, endStrokePsi: null, spacers: 0, points },
      ],
    });
    expect(fit.quality).toBe('poor');
    expect(fit.relativeRms).toBeGreaterThan(FIT_THRESHOLDS.poorRelativeRms);
    expect(fit.reasons.join(' ')).toMatch(/misses the measured forces/);
  });
});

describe('modelCurve', () => {
  it('matches Boyle’s law in closed form for a single chamber at n = 1', () => {
    // Boyle's law (isothermal ideal gas): p·V constant, so with no negative chamber and no end-stroke
    // chamber F(x) = (p₀,abs·V₀'/(V₀' − A·x) − p_amb)·A, V₀' = A·L₀ − k·V_sp.
    const known = { travelMm: 140, pistonDiameterMm: 32, shaftDiameterMm: 10, spacerVolumeCm3: 1.9 };
    const geometry = { positiveLengthMm: 210, negativeVolumeCm3: 0, endStrokeVolumeCm3: null };
    const ambientPa = 90000;
    const travelsMm = [0, 10, 35.5, 70, 105, 133, 140];
    const curve = modelCurve({
      part: 'fork',
      known,
      geometry,
      frictionN: 30,
      mainPsi: 75,
      endStrokePsi: null,
      spacers: 2,
      ambientPa,
      travelsMm,
    });
    const A = circleArea(mmToM(32));
    const V0 = A * mmToM(210) - 2 * cm3ToM3(1.9);
    const p0 = psiToPa(75) + ambientPa;
    curve.forEach((pt, i) => {
      const x = mmToM(travelsMm[i]);
      const boyle = ((p0 * V0) / (V0 - A * x) - ambientPa) * A;
      expect(pt.travelMm).toBe(travelsMm[i]);
      expect(relErr(pt.springN, boyle)).toBeLessThan(1e-9);
      expect(relErr(pt.compressionN, boyle + 30)).toBeLessThan(1e-9);
      expect(relErr(pt.reboundN, boyle - 30)).toBeLessThan(1e-9);
    });
  });
});

describe('compareRun', () => {
  const geometry = {
    positiveLengthMm: FORK.positiveLengthMm,
    negativeVolumeCm3: FORK.negativeVolumeCm3,
    endStrokeVolumeCm3: null,
  };
  const setting = { label: '80 psi', mainPsi: 80, endStrokePsi: null, spacers: 1 };
  const compare = (run: BenchRun) =>
    compareRun({ part: 'fork', known: FORK_KNOWN, geometry, frictionN: 25, run });

  it('on a clean curve: the friction band is the injected friction, sag and end match, no bump stop', () => {
    const run = benchRun(FORK, FORK_TRAVEL, setting, {
      frictionN: 25,
      noiseN: 0,
      stepMm: 2.5,
      rand: mulberry32(6),
    });
    const c = compare(run);
    // compression and rebound at the same travels: half the gap is exactly the friction
    expect(c.frictionBandN).toBeCloseTo(25, 9);
    expect(c.atSag!.travelMm).toBeCloseTo(0.23 * FORK_TRAVEL, 12); // trail fork target, 23 %
    expect(Math.abs(c.atSag!.differenceN)).toBeLessThan(1); // linear interpolation between 2.5 mm points
    expect(c.nearEnd!.travelMm).toBeCloseTo(135, 12);
    expect(Math.abs(c.nearEnd!.differenceN)).toBeLessThan(1e-6); // 135 mm is a measured point
    expect(c.bumpStop).toBeNull();
  });

  it('with noise: the friction band is within 4 standard errors of the injected friction; no bump stop', () => {
    const run = benchRun(FORK, FORK_TRAVEL, setting, {
      frictionN: 25,
      noiseN: 8,
      stepMm: 2.5,
      rand: mulberry32(7),
    });
    const c = compare(run);
    // half the gap of two noisy points has σ/√2; averaged over the mid-travel points (20–80 %)
    const midPoints = run.points.filter(
      (p) => p.stroke === 'compression' && p.travelMm >= 30 && p.travelMm <= 120,
    ).length;
    const se = 8 / Math.SQRT2 / Math.sqrt(midPoints);
    expect(Math.abs(c.frictionBandN! - 25)).toBeLessThan(4 * se);
    expect(c.bumpStop).toBeNull();
  });

  it('finds a bump stop in the last 5 % of travel near where it starts', () => {
    const start = 0.95 * FORK_TRAVEL; // 142.5 mm
    const run = benchRun(FORK, FORK_TRAVEL, setting, {
      frictionN: 25,
      noiseN: 8,
      stepMm: 2.5,
      rand: mulberry32(8),
      extra: (t) => (t > start ? 60 * (t - start) : 0), // 60 N/mm ramp: 450 N at full travel
    });
    const c = compare(run);
    expect(c.bumpStop).not.toBeNull();
    // it starts to show once the ramp exceeds the margin (max(3σ, 2 % of peak) ≈ 35 N, about
    // 0.6 mm into the ramp); allow one 2.5 mm point spacing
    expect(c.bumpStop!.travelMm).toBeGreaterThanOrEqual(start);
    expect(c.bumpStop!.travelMm).toBeLessThan(start + 2.5);
    expect(c.bumpStop!.excessAtEndN).toBeGreaterThan(400);
  });
});

describe('input checks', () => {
  const good = forkRuns(9)[0];
  const fit = (over: Partial<Parameters<typeof fitSpring>[0]>) => () =>
    fitSpring({ part: 'fork', known: FORK_KNOWN, runs: [good], ...over });
  const field = (f: () => unknown) => {
    try {
      f();
    } catch (e) {
      expect(e).toBeInstanceOf(SpringModelInputError);
      return (e as SpringModelInputError).field;
    }
    throw new Error('no error');
  };

  it('names the field at fault', () => {
    expect(field(fit({ runs: [] }))).toBe('runs');
    expect(field(fit({ runs: [{ ...good, points: good.points.slice(0, 9) }] }))).toBe('runs[0].points');
    const outside = good.points.map((p, i) => (i === 3 ? { ...p, travelMm: 151 } : p));
    expect(field(fit({ runs: [{ ...good, points: outside }] }))).toBe('runs[0].points[3].travelMm');
    const negative = good.points.map((p, i) => (i === 4 ? { ...p, travelMm: -1 } : p));
    expect(field(fit({ runs: [{ ...good, points: negative }] }))).toBe('runs[0].points[4].travelMm');
    const nan = good.points.map((p, i) => (i === 5 ? { ...p, forceN: NaN } : p));
    expect(field(fit({ runs: [{ ...good, points: nan }] }))).toBe('runs[0].points[5].forceN');
    const inf = good.points.map((p, i) => (i === 6 ? { ...p, forceN: Infinity } : p));
    expect(field(fit({ runs: [{ ...good, points: inf }] }))).toBe('runs[0].points[6].forceN');
    expect(field(fit({ runs: [{ ...good, mainPsi: NaN }] }))).toBe('runs[0].mainPsi');
    expect(field(fit({ runs: [{ ...good, spacers: 1.5 }] }))).toBe('runs[0].spacers');
    expect(field(fit({ known: { travelMm: 150 } }))).toBe('known.stanchionMm');
    expect(field(fit({ known: { travelMm: Infinity, stanchionMm: 36 } }))).toBe('known.travelMm');
    expect(field(fit({ polytropicIndex: 2 }))).toBe('polytropicIndex');
    expect(
      field(() =>
        fitSpring({
          part: 'shock',
          known: { travelMm: 60 },
          runs: [
            {
              ...good,
              endStrokePsi: 200,
              points: good.points.map((p) => ({ ...p, travelMm: 0.4 * p.travelMm })),
            },
          ],
        }),
      ),
    ).toBe('runs[0].endStrokePsi');
    expect(
      field(() =>
        modelCurve({
          part: 'fork',
          known: FORK_KNOWN,
          geometry: { positiveLengthMm: 200, negativeVolumeCm3: 40, endStrokeVolumeCm3: null },
          frictionN: 0,
          mainPsi: 80,
          endStrokePsi: null,
          spacers: 0,
          travelsMm: [0, 160],
        }),
      ),
    ).toBe('travelsMm[1]');
  });

  it('uses the known bores when given, and n = 1 unless told', () => {
    const r = fitSpring({
      part: 'fork',
      known: { travelMm: 150, pistonDiameterMm: 33, shaftDiameterMm: 10, spacerVolumeCm3: 2.1 },
      runs: forkRuns(10),
    });
    expect(r.known.defaulted).toEqual([]);
    expect(r.polytropicIndex).toBe(1);
    expect(relErr(r.geometry.positiveLengthMm, FORK.positiveLengthMm)).toBeLessThan(0.01);
  });
});

describe('fit-math', () => {
  it('inverts a symmetric matrix (A·A⁻¹ = I) and refuses a singular one', () => {
    const m = [
      [4, 1, 0.5],
      [1, 3, 0.2],
      [0.5, 0.2, 2],
    ];
    const inv = invertSymmetric(m)!;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        const v = m[i].reduce((s, _, k) => s + m[i][k] * inv[k][j], 0);
        expect(v).toBeCloseTo(i === j ? 1 : 0, 12);
      }
    expect(
      invertSymmetric([
        [1, 2],
        [2, 4],
      ]),
    ).toBeNull();
  });

  it('runs test: textbook expectation E = 2n₊n₋/n + 1', () => {
    // 10 positives then 10 negatives: 2 runs, E = 2·10·10/20 + 1 = 11 (the runs test's expectation)
    const blocky = [...Array(10).fill(1), ...Array(10).fill(-1)];
    const r = runsTest(blocky);
    expect(r.runs).toBe(2);
    expect(r.expected).toBe(11);
    expect(r.z).toBeLessThan(-3);
    // alternating signs: 20 runs, far more than chance
    expect(runsTest(blocky.map((_, i) => (i % 2 ? 1 : -1))).z).toBeGreaterThan(3);
  });

  it('interpolates linearly and refuses outside the curve', () => {
    expect(interpolate([0, 10], [0, 5], 4)).toBe(2);
    expect(interpolate([0, 10], [0, 5], 11)).toBeNull();
  });
});
