import type { CurveRun, ForkInput } from '@loamline/shared-types';
import { forkGeometry, modelCurve } from '../baselines/spring-model';
import { runComparison } from './run-comparison';

/*
 * runComparison on clean curves made by the model itself (`modelCurve`): measured equals model where
 * the geometry and friction are the model's, and the comparison follows the bike's measured spring.
 */

const FORK: ForkInput = { travelMm: 150, stanchionMm: 36, spring: 'air', spacers: 1 };
const DEFAULTS = forkGeometry(36, 150, false).geometry;

function run(geometry: { positiveLengthMm: number; negativeVolumeCm3: number }, frictionN: number): CurveRun {
  const travels = Array.from({ length: 51 }, (_, i) => i * 3);
  const m = modelCurve({
    part: 'fork',
    known: { travelMm: 150, stanchionMm: 36 },
    geometry: { ...geometry, endStrokeVolumeCm3: null },
    frictionN,
    mainPsi: 70,
    endStrokePsi: null,
    spacers: 1,
    travelsMm: travels,
  });
  return {
    label: 'fork at 70 psi',
    settings: { part: 'fork', mainPsi: 70, endStrokePsi: null, spacers: 1 },
    units: { travel: 'mm', force: 'N' },
    points: [
      ...m.map((p) => ({ travelMm: p.travelMm, forceN: p.compressionN, stroke: 'compression' as const })),
      ...m.map((p) => ({ travelMm: p.travelMm, forceN: p.reboundN, stroke: 'rebound' as const })),
    ],
    comparison: null,
  };
}

describe('runComparison', () => {
  it('a curve of the default geometry: measured = model, the friction band is the friction, no bump stop', () => {
    const c = runComparison({ run: run(DEFAULTS, 20), part: FORK })!;
    // measured is read by linear interpolation between points 3 mm apart: off by at most h²/8 · F''
    // (closed form of the interpolation error), well under 0.1 N on this curve
    expect(Math.abs(c.measuredAtSagN - c.modelAtSagN)).toBeLessThan(0.1);
    expect(Math.abs(c.measuredAtEndN - c.modelAtEndN)).toBeLessThan(0.1);
    expect(c.frictionBandN).toBeCloseTo(20, 9);
    expect(c.bumpStopMm).toBeNull();
    expect(c.endTravelMm).toBeCloseTo(135, 9);
    expect(c.model).toHaveLength(51);
    expect(c.model[10].compressionN - c.model[10].reboundN).toBeCloseTo(40, 9);
  });

  it('sag: the report’s measured sag, else the target (trail, balanced: 23 % of a fork without end-stroke chamber)', () => {
    const r = run(DEFAULTS, 20);
    expect(runComparison({ run: r, part: FORK })!.sagTravelMm).toBeCloseTo(0.23 * 150, 9);
    const report = {
      mainPsi: 70,
      endStrokePsi: null,
      spacers: 1,
      springRateLbPerIn: null,
      reboundClicks: null,
      compressionClicks: null,
      sagMm: 42,
    };
    expect(runComparison({ run: r, part: FORK, report })!.sagTravelMm).toBeCloseTo(42, 9);
  });

  it('with a measured spring stored on the bike the model is its geometry and friction', () => {
    const truth = { positiveLengthMm: 205, negativeVolumeCm3: DEFAULTS.negativeVolumeCm3 * 1.3 };
    const r = run(truth, 25);
    const measured = {
      ...truth,
      endStrokeVolumeCm3: null,
      frictionN: 25,
      label: 'measured on 2 December 2026 at a test shop',
      measuredAt: '2026-12-02T10:00:00.000Z',
      shopName: 'a test shop',
      appointmentId: '00000000-0000-4000-8000-000000000000',
    };
    const withMeasured = runComparison({ run: r, part: { ...FORK, measured } })!;
    expect(Math.abs(withMeasured.measuredAtSagN - withMeasured.modelAtSagN)).toBeLessThan(0.1);
    const byDefault = runComparison({ run: r, part: FORK })!;
    expect(Math.abs(byDefault.measuredAtEndN - byDefault.modelAtEndN)).toBeGreaterThan(20);
  });

  it('null when it cannot be read: no bike part, a coil, no rebound stroke, a point past the travel', () => {
    const r = run(DEFAULTS, 20);
    expect(runComparison({ run: r, part: null })).toBeNull();
    expect(runComparison({ run: r, part: { ...FORK, spring: 'coil' } })).toBeNull();
    const compressionOnly = { ...r, points: r.points.filter((p) => p.stroke === 'compression') };
    expect(runComparison({ run: compressionOnly, part: FORK })).toBeNull();
    const tooFar = {
      ...r,
      points: [...r.points, { travelMm: 170, forceN: 3000, stroke: 'compression' as const }],
    };
    expect(runComparison({ run: tooFar, part: FORK })).toBeNull();
  });
});
