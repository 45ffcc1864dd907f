import type { INestApplication } from '@nestjs/common';
import fc from 'fast-check';
import request from 'supertest';
import { RIDING_FEELS, RIDING_STYLES, type BaselineResult, type PartResult } from '@loamline/shared-types';
import { LIMITS, type Limit } from '../src/baselines/spring-model/limits';
import { createTestApp } from './utils/test-app';

/** The request of the compute contract in docs/spring-model.md (an invented rider and bike). */
const contractBody = () => ({
  rider: { massKg: 82, frontShare: 0.42 },
  riding: { style: 'enduro', feel: 'balanced' },
  conditions: { altitudeM: 0, temperatureC: 20 },
  fork: {
    travelMm: 160,
    stanchionMm: 36,
    spring: 'air',
    spacers: 0,
    endStroke: { pressurePsi: 180 },
    maxPressurePsi: 120,
    targetSagPct: 25,
  },
  shock: {
    strokeMm: 65,
    wheelTravelMm: 165,
    spring: 'air',
    spacers: 0,
    maxPressurePsi: 350,
    targetSagPct: 30,
  },
});

function expectPart(p: PartResult, travelMm: number) {
  expect(p.travelMm).toBe(travelMm);
  expect(typeof p.targetSagPct).toBe('number');
  expect(p.targetSagMm).toBeCloseTo((travelMm * p.targetSagPct) / 100, 9);
  expect(p.loadN).toBeGreaterThan(0);
  expect(p.curve.length).toBeGreaterThanOrEqual(40);
  expect(p.curve.length).toBeLessThanOrEqual(60);
  expect(p.curve[0]).toEqual({ travelMm: 0, forceN: expect.any(Number) });
  expect(p.curve[p.curve.length - 1].travelMm).toBe(travelMm);
  expect(p.progression).toBeGreaterThan(1);
  expect(p.hardLandingLoadN).toBeGreaterThan(p.loadN);
  expect(p.travelUsedMm).toBeGreaterThan(0);
  expect(p.travelUsedMm).toBeLessThanOrEqual(travelMm);
  expect(Array.isArray(p.overlays)).toBe(true);
  expect(Array.isArray(p.warnings)).toBe(true);
  for (const w of p.warnings)
    expect(w).toEqual({
      code: expect.any(String),
      severity: expect.stringMatching(/^(error|warning|info)$/),
      message: expect.any(String),
    });
}

describe('POST /api/baselines/compute and /api/baselines/sag-check (real app, real MariaDB)', () => {
  let app: INestApplication;
  const post = (path: string, body: unknown) =>
    request(app.getHttpServer())
      .post(`/api/baselines/${path}`)
      .set('Content-Type', 'application/json')
      .send(JSON.stringify(body));

  beforeAll(async () => {
    app = await createTestApp();
  });
  afterAll(async () => {
    await app.close();
  });

  it('answers the contract request with fork and shock, cautions and assumptions, signed out', async () => {
    const res = await post('compute', contractBody()).expect(200);
    const body = res.body as BaselineResult;
    expectPart(body.fork!, 160);
    expectPart(body.shock!, 65);
    expect(body.fork!.pressure).toEqual({
      psi: expect.any(Number),
      bar: expect.any(Number),
      rangePsi: [expect.any(Number), expect.any(Number)],
      rangeBar: [expect.any(Number), expect.any(Number)],
      maxPsi: 120,
      maxIsDefault: false,
      minPsi: 30,
      atRidePsi: null,
    });
    expect(body.fork!.endStroke).toMatchObject({ psi: 180, given: true, maxIsDefault: true });
    expect(body.fork!.rateAtSagNPerMm).toBeGreaterThan(0);
    expect(body.fork!.energyToFullTravelJ).toBeGreaterThan(0);
    expect(body.fork!.hardLandingIndex).toBe(1.4);
    expect(body.fork!.coilRate).toBeNull();
    expect(body.shock!.leverageRatio).toBeCloseTo(165 / 65, 9);
    expect(body.shock!.wheelSagMm).toBeCloseTo(165 * 0.3, 9);
    expect(body.fork!.overlays.map((o) => o.kind)).toEqual(
      expect.arrayContaining(['spacers', 'end-stroke', 'fast-hit']),
    );
    expect(body.cautions).toHaveLength(6);
    expect(body.assumptions.length).toBeGreaterThan(5);
    for (const a of body.assumptions) {
      expect(a).toEqual(
        expect.objectContaining({
          key: expect.any(String),
          label: expect.any(String),
          source: expect.any(String),
        }),
      );
    }
  });

  it('computes a fork alone (shock null) and a coil shock alone (fork null)', async () => {
    const b = contractBody();
    const forkOnly = await post('compute', { ...b, shock: null }).expect(200);
    expect(forkOnly.body.shock).toBeNull();
    expect(forkOnly.body.fork.pressure.psi).toBeGreaterThan(0);
    const coil = await post('compute', {
      rider: b.rider,
      riding: b.riding,
      fork: null,
      shock: { strokeMm: 65, wheelTravelMm: 165, spring: 'coil', spacers: 0 },
    }).expect(200);
    expect(coil.body.fork).toBeNull();
    expect(coil.body.shock.pressure).toBeNull();
    expect(coil.body.shock.coilRate).toEqual({
      nPerMm: expect.any(Number),
      lbPerIn: expect.any(Number),
      suggestedLbPerIn: expect.any(Number),
    });
  });

  it('answers the sag check: too much sag at 80 psi → add air', async () => {
    const res = await post('sag-check', {
      ...contractBody(),
      measured: { part: 'fork', pressurePsi: 80, sagMm: 48 },
    }).expect(200);
    expect(res.body).toEqual({
      measuredSagPct: 30,
      targetSagPct: 25,
      targetSagMm: 40,
      newPressurePsi: expect.any(Number),
      newPressureBar: expect.any(Number),
      changePsi: expect.any(Number),
      maxPsi: 120,
      maxIsDefault: false,
      minPsi: 30,
      warnings: expect.any(Array),
    });
    expect(res.body.changePsi).toBeGreaterThan(0);
    expect(res.body.newPressurePsi - 80).toBeCloseTo(res.body.changePsi, 9);
  });

  describe('the sag check warns like the baseline, and refuses what no spring could measure', () => {
    const rider = { rider: { massKg: 80 }, riding: { style: 'trail', feel: 'balanced' } };
    const fork = { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 0 };
    const shock = { strokeMm: 65, wheelTravelMm: 160, spring: 'air', spacers: 0 };

    it('a shock measured 29 mm at 280 psi: the blocking error comes first and names the 350 psi maximum', async () => {
      const res = await post('sag-check', {
        ...rider,
        fork: null,
        shock,
        measured: { part: 'shock', pressurePsi: 280, sagMm: 29 },
      }).expect(200);
      expect(res.body.newPressurePsi).toBeGreaterThan(350);
      expect(res.body.warnings[0]).toMatchObject({ code: 'above-max-pressure', severity: 'error' });
      expect(res.body.warnings[0].message).toContain('350 psi');
    });

    it('a fork measured 72 mm at 100 psi: above the 150 psi maximum → error', async () => {
      const res = await post('sag-check', {
        ...rider,
        fork,
        shock: null,
        measured: { part: 'fork', pressurePsi: 100, sagMm: 72 },
      }).expect(200);
      expect(res.body.warnings[0]).toMatchObject({ code: 'above-max-pressure', severity: 'error' });
    });

    it('10 mm at 5 psi and 900 psi are refused with a message on the measured field', async () => {
      for (const measured of [
        { part: 'fork', pressurePsi: 5, sagMm: 10 },
        { part: 'fork', pressurePsi: 900, sagMm: 40 },
      ]) {
        const res = await post('sag-check', { ...rider, fork, shock: null, measured }).expect(400);
        expect(Object.keys(res.body.fields)).toEqual(['measured.pressurePsi']);
      }
    });

    it('an end-stroke chamber without a pressure gets the recommended one, within its maximum', async () => {
      const res = await post('compute', {
        ...rider,
        fork: { ...fork, endStroke: { maxPressurePsi: 250 } },
        shock: null,
      }).expect(200);
      const e = res.body.fork.endStroke;
      expect(e).toMatchObject({ given: false, maxPsi: 250, maxIsDefault: false });
      expect(e.recommendedPsi).toBeLessThanOrEqual(250);
      expect(e.psi).toBe(e.recommendedPsi);
    });
  });

  describe('bad bodies → 400 naming the field', () => {
    const expect400 = async (path: string, body: unknown, field: string) => {
      const res = await post(path, body).expect(400);
      expect(res.body).toEqual(
        expect.objectContaining({ statusCode: 400, error: 'Bad Request', message: expect.any(String) }),
      );
      expect(Object.keys(res.body.fields ?? {})).toContain(field);
      return res;
    };

    it('negative mass', async () => {
      const b = contractBody();
      await expect400('compute', { ...b, rider: { massKg: -80 } }, 'rider.massKg');
    });

    it('travel of 0', async () => {
      const b = contractBody();
      await expect400('compute', { ...b, fork: { ...b.fork, travelMm: 0 } }, 'fork.travelMm');
    });

    it('spacers that close the chamber', async () => {
      const b = contractBody();
      const res = await expect400(
        'compute',
        { ...b, fork: { ...b.fork, spacers: 8, geometry: { positiveLengthMm: 180, spacerVolumeCm3: 4 } } },
        'fork.spacers',
      );
      expect(res.body.message).toContain('fork.spacers');
    });

    it('unknown style', async () => {
      const b = contractBody();
      await expect400('compute', { ...b, riding: { style: 'gravel', feel: 'balanced' } }, 'riding.style');
    });

    it('unknown fields, at the top and nested', async () => {
      const b = contractBody();
      await expect400('compute', { ...b, colour: 'red' }, 'colour');
      await expect400('compute', { ...b, rider: { ...b.rider, heightCm: 180 } }, 'rider.heightCm');
      await expect400(
        'compute',
        { ...b, fork: { ...b.fork, geometry: { volume: 3 } } },
        'fork.geometry.volume',
      );
    });

    it('neither fork nor shock', async () => {
      const b = contractBody();
      await expect400('compute', { ...b, fork: null, shock: null }, 'fork');
    });

    it('wrong types: a string mass, an array fork, fractional spacers, a missing rider', async () => {
      const b = contractBody();
      await expect400('compute', { ...b, rider: { massKg: '82' } }, 'rider.massKg');
      await expect400('compute', { ...b, fork: [] }, 'fork');
      await expect400('compute', { ...b, fork: { ...b.fork, spacers: 1.5 } }, 'fork.spacers');
      const { rider: _rider, ...noRider } = b;
      await expect400('compute', noRider, 'rider');
    });

    it('a sag check on a coil, beyond travel, or without what was measured', async () => {
      const b = contractBody();
      await expect400(
        'sag-check',
        { ...b, fork: { ...b.fork, spring: 'coil' }, measured: { part: 'fork', pressurePsi: 80, sagMm: 40 } },
        'measured.part',
      );
      await expect400(
        'sag-check',
        { ...b, measured: { part: 'fork', pressurePsi: 80, sagMm: 170 } },
        'measured.sagMm',
      );
      await expect400('sag-check', b, 'measured');
    });
  });

  it('never answers 500 to fuzzed bodies (fast-check, 200 runs)', async () => {
    // Keys of random objects are identifier-like: a key holding RegExp syntax trips the shared
    // validation pipe (see the known-bug test below), which is not this module's to fix.
    const key = fc.stringMatching(/^[A-Za-z_][A-Za-z0-9_]{0,8}$/);
    const anything = () => fc.anything({ key, maxDepth: 3 });
    const near = (l: Limit) =>
      fc.oneof(
        { weight: 40, arbitrary: fc.double({ min: l.min, max: l.max, noNaN: true }) },
        { weight: 1, arbitrary: fc.double({ min: -2 * Math.abs(l.max) - 1, max: 3 * l.max + 1 }) },
        { weight: 1, arbitrary: fc.oneof(fc.string(), fc.boolean(), fc.constant(null), fc.integer()) },
      );
    const geometry = fc.record(
      {
        pistonDiameterMm: near(LIMITS.pistonDiameterMm),
        shaftDiameterMm: near(LIMITS.shaftDiameterMm),
        positiveLengthMm: near(LIMITS.positiveLengthMm),
        negativeVolumeCm3: near(LIMITS.negativeVolumeCm3),
        spacerVolumeCm3: near(LIMITS.spacerVolumeCm3),
        endStrokeVolumeCm3: near(LIMITS.endStrokeVolumeCm3),
        polytropicIndex: near(LIMITS.polytropicIndex),
      },
      { requiredKeys: [] },
    );
    const spring = fc.oneof(
      { weight: 20, arbitrary: fc.constantFrom('air', 'coil') },
      { weight: 1, arbitrary: fc.string() },
    );
    const spacers = fc.oneof(
      { weight: 20, arbitrary: fc.integer({ min: 0, max: 12 }) },
      { weight: 1, arbitrary: near(LIMITS.spacers) },
    );
    const fork = fc.record(
      {
        travelMm: near(LIMITS.forkTravelMm),
        stanchionMm: near(LIMITS.stanchionMm),
        spring,
        spacers,
        endStroke: fc.oneof(
          { weight: 20, arbitrary: fc.record({ pressurePsi: near(LIMITS.endStrokePsi) }) },
          { weight: 1, arbitrary: anything() },
        ),
        maxPressurePsi: near(LIMITS.maxPressurePsi),
        targetSagPct: near(LIMITS.targetSagPct),
        geometry: fc.oneof({ weight: 20, arbitrary: geometry }, { weight: 1, arbitrary: anything() }),
      },
      { requiredKeys: ['travelMm', 'stanchionMm', 'spring', 'spacers'] },
    );
    const shock = fc.record(
      {
        strokeMm: near(LIMITS.shockStrokeMm),
        wheelTravelMm: near(LIMITS.wheelTravelMm),
        spring,
        spacers,
        maxPressurePsi: near(LIMITS.maxPressurePsi),
        targetSagPct: near(LIMITS.targetSagPct),
        geometry: fc.oneof({ weight: 20, arbitrary: geometry }, { weight: 1, arbitrary: anything() }),
      },
      { requiredKeys: ['strokeMm', 'wheelTravelMm', 'spring', 'spacers'] },
    );
    const body = fc.record(
      {
        rider: fc.oneof(
          fc.record(
            { massKg: near(LIMITS.massKg), frontShare: near(LIMITS.frontShare) },
            { requiredKeys: ['massKg'] },
          ),
          { weight: 1, arbitrary: anything() },
        ),
        riding: fc.record({
          style: fc.oneof(
            { weight: 20, arbitrary: fc.constantFrom(...RIDING_STYLES) },
            { weight: 1, arbitrary: fc.string() },
          ),
          feel: fc.oneof(
            { weight: 20, arbitrary: fc.constantFrom(...RIDING_FEELS) },
            { weight: 1, arbitrary: fc.string() },
          ),
        }),
        conditions: fc.record(
          { altitudeM: near(LIMITS.altitudeM), temperatureC: near(LIMITS.temperatureC) },
          { requiredKeys: [] },
        ),
        fork: fc.oneof(
          { weight: 4, arbitrary: fork },
          { weight: 1, arbitrary: fc.oneof(fc.constant(null), anything()) },
        ),
        shock: fc.oneof(
          { weight: 4, arbitrary: shock },
          { weight: 1, arbitrary: fc.oneof(fc.constant(null), anything()) },
        ),
        measured: fc.record(
          {
            part: fc.oneof(
              { weight: 20, arbitrary: fc.constantFrom('fork', 'shock') },
              { weight: 1, arbitrary: fc.string() },
            ),
            pressurePsi: near(LIMITS.measuredPressurePsi),
            sagMm: near(LIMITS.measuredSagMm),
          },
          { requiredKeys: ['part', 'pressurePsi', 'sagMm'] },
        ),
      },
      { requiredKeys: ['rider', 'riding', 'fork', 'shock', 'measured'] },
    );
    const seen = { 200: 0, 400: 0 };
    await fc.assert(
      fc.asyncProperty(body, fc.boolean(), async (b, check) => {
        const path = check ? 'sag-check' : 'compute';
        const payload = check ? b : { ...b, measured: undefined };
        const res = await post(path, payload);
        expect([200, 400]).toContain(res.status);
        if (res.status === 400) {
          expect(typeof res.body.message).toBe('string');
          seen[400]++;
        } else {
          seen[200]++;
        }
      }),
      { numRuns: 200 },
    );
    // the fuzz reached both the model (200) and the validation (400)
    expect(seen[200]).toBeGreaterThan(0);
    expect(seen[400]).toBeGreaterThan(0);
  });

  // Found by the fuzz: field names are not patterns (the pipe once built a RegExp from them).
  it('answers 400 to an unknown field whose name is RegExp syntax, e.g. "("', async () => {
    const res = await post('compute', { ...contractBody(), '(': 1, '[x': 2 }).expect(400);
    expect(res.body.fields).toHaveProperty(['(']);
  });

  it('is described in the OpenAPI document', async () => {
    const res = await request(app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(res.body.paths).toHaveProperty(['/api/baselines/compute', 'post']);
    expect(res.body.paths).toHaveProperty(['/api/baselines/sag-check', 'post']);
    expect(res.body.components.schemas).toHaveProperty('ComputeBaselineDto');
  });
});
