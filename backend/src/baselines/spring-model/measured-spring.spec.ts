import type { BaselineInput, ForkInput, MeasuredSpring, ShockInput } from '@loamline/shared-types';
import { computeBaseline } from './baseline';
import { forkGeometry, GEOMETRY_SOURCE } from './defaults';
import { SpringModelInputError } from './limits';
import { resolveContext, resolvePart } from './resolve';
import { sagCheck } from './sag-check';

/*
 * A part's measured spring (a shop's bench fit stored on the bike): which geometry wins, how it is
 * labelled, and what the default geometry would have given.
 */

const LABEL = 'measured on 2 December 2026 at a test shop';
const measured = (over: Partial<MeasuredSpring> = {}): MeasuredSpring => ({
  positiveLengthMm: 210,
  negativeVolumeCm3: 150,
  endStrokeVolumeCm3: 55,
  frictionN: 20,
  label: LABEL,
  measuredAt: '2026-12-02T10:00:00.000Z',
  shopName: 'a test shop',
  appointmentId: '00000000-0000-4000-8000-000000000000',
  ...over,
});
const fork = (over: Partial<ForkInput> = {}): ForkInput => ({
  travelMm: 150,
  stanchionMm: 36,
  spring: 'air',
  spacers: 1,
  ...over,
});
const input = (f: ForkInput | null, s: ShockInput | null = null): BaselineInput => ({
  rider: { massKg: 80 },
  riding: { style: 'trail', feel: 'balanced' },
  fork: f,
  shock: s,
});
const resolveFork = (f: ForkInput) => {
  const ctx = resolveContext(input(f));
  return { rp: resolvePart('fork', f, ctx), assumptions: ctx.assumptions };
};

describe('a measured spring in resolve', () => {
  it('replaces the default column and volumes, labelled with where and when it was measured', () => {
    const { rp, assumptions } = resolveFork(fork({ endStroke: { pressurePsi: 180 }, measured: measured() }));
    expect(rp.geometry!.geometry).toMatchObject({
      positiveLengthMm: 210,
      negativeVolumeCm3: 150,
      endStrokeVolumeCm3: 55,
    });
    expect(rp.measuredLabel).toBe(LABEL);
    const m = assumptions.filter((a) => a.key.startsWith('fork.measured.'));
    expect(m.map((a) => [a.key, a.value, a.source])).toEqual([
      ['fork.measured.positiveLengthMm', 210, LABEL],
      ['fork.measured.negativeVolumeCm3', 150, LABEL],
      ['fork.measured.endStrokeVolumeCm3', 55, LABEL],
    ]);
    // the bores and the spacer volume still come from the defaults, labelled as such
    const defaulted = assumptions.filter((a) => a.key.startsWith('fork.geometry.'));
    expect(defaulted.map((a) => a.key)).toEqual(
      expect.arrayContaining(['fork.geometry.pistonDiameterMm', 'fork.geometry.spacerVolumeCm3']),
    );
    expect(defaulted.map((a) => a.key)).not.toContain('fork.geometry.positiveLengthMm');
    for (const a of defaulted)
      if (a.key !== 'fork.geometry.polytropicIndex') expect(a.source).toBe(GEOMETRY_SOURCE);
  });

  it('precedence: the rider’s explicit geometry > measured > defaults', () => {
    const { rp, assumptions } = resolveFork(
      fork({ geometry: { positiveLengthMm: 230 }, measured: measured() }),
    );
    const g = rp.geometry!.geometry;
    expect(g.positiveLengthMm).toBe(230); // the rider's
    expect(g.negativeVolumeCm3).toBe(150); // measured
    expect(g.pistonDiameterMm).toBe(forkGeometry(36, 150, false).geometry.pistonDiameterMm); // default
    expect(assumptions.map((a) => a.key)).not.toContain('fork.measured.positiveLengthMm');
    expect(assumptions.map((a) => a.key)).toContain('fork.measured.negativeVolumeCm3');
  });

  it('an end-stroke volume not measured (null) falls back to the default; without a chamber it is not listed', () => {
    const withChamber = resolveFork(
      fork({ endStroke: { pressurePsi: 180 }, measured: measured({ endStrokeVolumeCm3: null }) }),
    );
    const byDefault = forkGeometry(36, 150, true, { positiveLengthMm: 210 }).geometry.endStrokeVolumeCm3;
    expect(withChamber.rp.geometry!.geometry.endStrokeVolumeCm3).toBe(byDefault);
    expect(withChamber.assumptions.map((a) => a.key)).toContain('fork.geometry.endStrokeVolumeCm3');
    const without = resolveFork(fork({ measured: measured() }));
    expect(without.assumptions.map((a) => a.key)).not.toContain('fork.measured.endStrokeVolumeCm3');
  });

  it('a shock takes the column and negative volume (it has no end-stroke chamber)', () => {
    const shock: ShockInput = {
      strokeMm: 65,
      wheelTravelMm: 160,
      spring: 'air',
      spacers: 0,
      measured: measured({ positiveLengthMm: 95, negativeVolumeCm3: 80 }),
    };
    const ctx = resolveContext(input(null, shock));
    const rp = resolvePart('shock', shock, ctx);
    expect(rp.geometry!.geometry).toMatchObject({
      positiveLengthMm: 95,
      negativeVolumeCm3: 80,
      endStrokeVolumeCm3: 0,
    });
    expect(ctx.assumptions.filter((a) => a.key.startsWith('shock.measured.')).map((a) => a.key)).toEqual([
      'shock.measured.positiveLengthMm',
      'shock.measured.negativeVolumeCm3',
    ]);
  });

  it('a coil ignores it, as it ignores other air-only fields', () => {
    const r = computeBaseline(input(fork({ spring: 'coil', spacers: 0, measured: measured() })));
    expect(r.fork!.measuredSpring).toBeUndefined();
    expect(r.assumptions.map((a) => a.key).filter((k) => k.includes('measured'))).toEqual([]);
    expect(r.fork!.warnings.find((w) => w.code === 'air-settings-ignored')!.message).toMatch(
      /the measured spring/,
    );
  });

  it('is checked like any input: a value out of range names its field', () => {
    const bad = (m: Partial<MeasuredSpring>, field: string) => {
      expect(() => resolveFork(fork({ measured: measured(m) }))).toThrow(SpringModelInputError);
      try {
        resolveFork(fork({ measured: measured(m) }));
      } catch (e) {
        expect((e as SpringModelInputError).field).toBe(field);
      }
    };
    bad({ positiveLengthMm: 5 }, 'fork.measured.positiveLengthMm');
    bad({ negativeVolumeCm3: -1 }, 'fork.measured.negativeVolumeCm3');
    bad({ endStrokeVolumeCm3: 5000 }, 'fork.measured.endStrokeVolumeCm3');
    bad({ frictionN: Number.NaN }, 'fork.measured.frictionN');
    bad({ label: ' ' }, 'fork.measured.label');
  });
});

describe('a measured spring in the baseline', () => {
  it('gives the baseline of its geometry, and shows what the default geometry would have given', () => {
    const m = measured({ endStrokeVolumeCm3: null });
    const r = computeBaseline(input(fork({ measured: m })));
    // the same as giving the measured values as geometry (one model)
    const same = computeBaseline(input(fork({ geometry: { positiveLengthMm: 210, negativeVolumeCm3: 150 } })))
      .fork!.pressure!.psi;
    expect(r.fork!.pressure!.psi).toBe(same);
    const byDefault = computeBaseline(input(fork())).fork!.pressure!.psi;
    expect(r.fork!.measuredSpring).toEqual({
      label: LABEL,
      defaultPressurePsi: byDefault,
      differencePct: (100 * (byDefault - same)) / same,
    });
    // leaving `measured` out (or null) is the default baseline, with nothing to compare
    expect(computeBaseline(input(fork({ measured: null }))).fork!.measuredSpring).toBeUndefined();
  });

  it('no comparison when the rider’s geometry overrides every measured value', () => {
    const r = computeBaseline(
      input(
        fork({
          geometry: { positiveLengthMm: 230, negativeVolumeCm3: 120 },
          measured: measured({ endStrokeVolumeCm3: null }),
        }),
      ),
    );
    expect(r.fork!.measuredSpring).toBeUndefined();
  });

  it('the sag check uses it too', () => {
    const m = measured({ endStrokeVolumeCm3: null });
    const check = (f: ForkInput) =>
      sagCheck({ ...input(f), measured: { part: 'fork', pressurePsi: 70, sagMm: 40 } }).newPressurePsi!;
    expect(check(fork({ measured: m }))).toBe(
      check(fork({ geometry: { positiveLengthMm: 210, negativeVolumeCm3: 150 } })),
    );
    expect(check(fork({ measured: m }))).not.toBe(check(fork()));
  });
});
