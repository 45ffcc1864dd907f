import { randomUUID } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type {
  BaselineInput,
  BaselineResult,
  Bike,
  CurveRun,
  ForkInput,
  ShockInput,
  SpringFitView,
} from '@loamline/shared-types';
import { AppointmentEntity } from '../src/appointments/appointment.entity';
import { computeBaseline, forkGeometry, modelCurve } from '../src/baselines/spring-model';
import { ManualClock } from '../src/common/clock/clock';
import { AppointmentAttachmentEntity } from '../src/service-reports/appointment-attachment.entity';
import { ShopServiceEntity } from '../src/shop-services/shop-service.entity';
import type { Shop } from '../src/shops/shop.entity';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { createTestApp } from './utils/test-app';

/*
 * The bike's measured spring against the real app and MariaDB. Curve runs are written straight into
 * appointment_attachments (as the uploads would), generated with the model's own `modelCurve` from
 * a known geometry ("the truth"), with friction and seeded normal noise added. The reference for the
 * pressure is the model itself (`computeBaseline` with the true geometry given explicitly).
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
const normal = (rand: () => number) => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());

const FORK: ForkInput = { travelMm: 150, stanchionMm: 36, spring: 'air', spacers: 1 };
const SHOCK: ShockInput = { strokeMm: 65, wheelTravelMm: 160, spring: 'air', spacers: 0 };
const DEFAULTS = forkGeometry(36, 150, false).geometry;
/** the truth: a shorter air column and a larger negative chamber than the defaults */
const TRUE = {
  positiveLengthMm: 205,
  negativeVolumeCm3: Math.round(DEFAULTS.negativeVolumeCm3 * 1.35 * 10) / 10,
  endStrokeVolumeCm3: null,
};
const FRICTION_N = 25;
const NOISE_N = 8;

/** A fork run from the model (compression and rebound every 3 mm) with friction and noise. */
function forkRun(mainPsi: number, rand: () => number): CurveRun {
  const travels = Array.from({ length: 51 }, (_, i) => i * 3);
  const m = modelCurve({
    part: 'fork',
    known: { travelMm: 150, stanchionMm: 36 },
    geometry: TRUE,
    frictionN: FRICTION_N,
    mainPsi,
    endStrokePsi: null,
    spacers: 1,
    travelsMm: travels,
  });
  const points: CurveRun['points'] = [
    ...m.map((p) => ({
      travelMm: p.travelMm,
      forceN: p.compressionN + NOISE_N * normal(rand),
      stroke: 'compression' as const,
    })),
    ...[...m].reverse().map((p) => ({
      travelMm: p.travelMm,
      forceN: p.reboundN + NOISE_N * normal(rand),
      stroke: 'rebound' as const,
    })),
  ];
  return {
    label: `fork at ${mainPsi} psi`,
    settings: { part: 'fork', mainPsi, endStrokePsi: null, spacers: 1 },
    units: { travel: 'mm', force: 'N' },
    points,
    comparison: null,
  };
}

/** A coil's straight line (60 N/mm), uploaded as a shock run at 200 psi. */
function coilLikeRun(): CurveRun {
  const points: CurveRun['points'] = [];
  for (const stroke of ['compression', 'rebound'] as const)
    for (let i = 0; i <= 40; i++) {
      const t = (65 * i) / 40;
      points.push({ travelMm: t, forceN: 600 + 60 * t + (stroke === 'compression' ? 30 : -30), stroke });
    }
  return {
    label: 'shock at 200 psi',
    settings: { part: 'shock', mainPsi: 200, endStrokePsi: null, spacers: 0 },
    units: { travel: 'mm', force: 'N' },
    points,
    comparison: null,
  };
}

describe('the bike’s measured spring (real app, real MariaDB)', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let db: DataSource;
  let shop: Shop;
  let owner: TestUser;
  let tech: TestUser;
  let rider: TestUser;
  let otherRider: TestUser;
  let otherTech: TestUser;
  let bike: Bike;
  let apptId: string;
  let noBikeApptId: string;
  const forkRunIds: string[] = [];
  let shockRunId: string;
  // 23:30 UTC on 2 December is already 3 December in the shop's zone (Europe/Berlin, UTC+1)
  const clock = new ManualClock(new Date('2026-12-02T23:30:00Z'));

  const as = (u: TestUser) => ({
    get: (url: string) => request(http).get(url).set('Cookie', u.cookie),
    post: (url: string, body: object = {}) => request(http).post(url).set('Cookie', u.cookie).send(body),
    patch: (url: string, body: object) => request(http).patch(url).set('Cookie', u.cookie).send(body),
  });
  const fits = (id = apptId) => `/api/workshop/appointments/${id}/fits`;

  async function appointment(bikeId: string | null): Promise<string> {
    const services = db.getRepository(ShopServiceEntity);
    const service = services.create({
      shopId: shop.id,
      name: 'Air spring setup',
      durationMinutes: 60,
      priceMinor: 0,
      depositMinor: 0,
    });
    await services.insert(service);
    const repo = db.getRepository(AppointmentEntity);
    const start = new Date('2026-12-02T09:00:00Z');
    const a = repo.create({
      shopId: shop.id,
      serviceId: service.id,
      riderId: rider.id,
      bikeId,
      bikeSnapshot: bikeId ? { name: bike.name, description: '150 mm fork' } : null,
      baselineSheetId: null,
      status: 'confirmed',
      startAt: start,
      endAt: new Date(start.getTime() + 3_600_000),
      keepUntil: new Date(start.getTime() + 3_600_000),
      bench: 1,
      priceMinor: 0,
      depositMinor: 0,
      currency: 'EUR',
    });
    await repo.insert(a);
    return a.id;
  }

  async function attach(appointmentId: string, run: CurveRun): Promise<string> {
    const repo = db.getRepository(AppointmentAttachmentEntity);
    const { comparison: _c, ...stored } = run;
    const row = repo.create({
      appointmentId,
      kind: 'curve',
      originalName: `${run.label}.csv`,
      storageKey: `test-curve-${randomUUID()}`,
      thumbnailKey: null,
      contentType: 'text/csv',
      sizeBytes: 2048,
      run: stored,
      uploadedById: tech.id,
    });
    await repo.insert(row);
    return row.id;
  }

  beforeAll(async () => {
    app = await createTestApp({}, { clock });
    http = app.getHttpServer();
    db = app.get(DataSource);
    shop = await createShop(app, { timeZone: 'Europe/Berlin' });
    owner = await createUser(app, { role: 'owner', shopId: shop.id });
    tech = await createUser(app, { role: 'technician', shopId: shop.id });
    rider = await createUser(app);
    otherRider = await createUser(app);
    otherTech = await createUser(app, { role: 'technician' });
    bike = (
      await as(rider).post('/api/bikes', { name: '150 mm trail bike', fork: FORK, shock: SHOCK }).expect(201)
    ).body as Bike;
    apptId = await appointment(bike.id);
    noBikeApptId = await appointment(null);
    const rand = mulberry32(20261202);
    for (const psi of [60, 75, 90]) forkRunIds.push(await attach(apptId, forkRun(psi, rand)));
    shockRunId = await attach(apptId, coilLikeRun());
  });
  afterAll(async () => {
    await app.close();
  });

  const baseline = (fork: ForkInput): BaselineInput => ({
    rider: { massKg: 80 },
    riding: { style: 'trail', feel: 'balanced' },
    fork,
    shock: null,
  });
  const compute = async (fork: ForkInput) =>
    (await as(rider).post('/api/baselines/compute', baseline(fork)).expect(200)).body as BaselineResult;

  let good: SpringFitView;

  it('a technician fits the fork: good, the geometry found back, every value identified', async () => {
    good = (await as(tech).post(fits(), { part: 'fork' }).expect(201)).body as SpringFitView;
    expect(good).toMatchObject({
      part: 'fork',
      quality: 'good',
      reasons: [],
      stored: false,
      rejected: false,
    });
    expect(good.runIds.sort()).toEqual([...forkRunIds].sort());
    // tolerance: at σ = 8 N over three runs of 102 points the standard errors are well under 1 %
    // (fit.spec.ts finds L₀ within 1 %, V₋₀ within 5 %, friction within 3 N at this noise)
    expect(Math.abs(good.geometry.positiveLengthMm / TRUE.positiveLengthMm - 1)).toBeLessThan(0.01);
    expect(Math.abs(good.geometry.negativeVolumeCm3 / TRUE.negativeVolumeCm3 - 1)).toBeLessThan(0.05);
    expect(Math.abs(good.frictionN - FRICTION_N)).toBeLessThan(3);
    expect(good.geometry.endStrokeVolumeCm3).toBeNull();
    expect(good.identified).toMatchObject({
      positiveLengthMm: true,
      negativeVolumeCm3: true,
      frictionN: true,
    });
    const listed = (await as(owner).get(fits()).expect(200)).body as SpringFitView[];
    expect(listed.map((f) => f.id)).toEqual([good.id]);
  });

  it('stored on the bike, a later baseline is within 2 % of the true geometry’s, labelled with the shop and day', async () => {
    const stored = (await as(tech).post(`${fits()}/${good.id}/store`, {}).expect(200)).body as SpringFitView;
    expect(stored).toMatchObject({ id: good.id, stored: true, rejected: false });
    const label = `measured on 3 December 2026 at ${shop.name}`;
    const mine = (await as(rider).get(`/api/bikes/${bike.id}`).expect(200)).body as Bike;
    expect(mine.fork!.measured).toEqual({
      positiveLengthMm: good.geometry.positiveLengthMm,
      negativeVolumeCm3: good.geometry.negativeVolumeCm3,
      endStrokeVolumeCm3: null,
      frictionN: good.frictionN,
      label,
      measuredAt: '2026-12-02T23:30:00.000Z',
      shopName: shop.name,
      appointmentId: apptId,
    });
    // the rest of the rider's fork is untouched
    expect({ ...mine.fork, measured: undefined }).toEqual({ ...FORK, measured: undefined });

    const r = await compute(mine.fork!);
    // reference: the model itself with the true geometry given
    const truth = computeBaseline(baseline({ ...FORK, geometry: TRUE_GEOMETRY() })).fork!.pressure!.psi;
    expect(Math.abs(r.fork!.pressure!.psi / truth - 1)).toBeLessThan(0.02);
    const fromMeasured = r.assumptions.filter((a) => a.key.startsWith('fork.measured.'));
    expect(fromMeasured.map((a) => a.key).sort()).toEqual([
      'fork.measured.negativeVolumeCm3',
      'fork.measured.positiveLengthMm',
    ]);
    for (const a of fromMeasured) expect(a.source).toBe(label);
    expect(r.assumptions.map((a) => a.key)).not.toContain('fork.geometry.positiveLengthMm');

    const byDefault = (await compute(FORK)).fork!.pressure!.psi;
    expect(r.fork!.measuredSpring!.label).toBe(label);
    expect(r.fork!.measuredSpring!.defaultPressurePsi).toBeCloseTo(byDefault, 9);
    expect(r.fork!.measuredSpring!.differencePct).toBeCloseTo(
      (100 * (byDefault - r.fork!.pressure!.psi)) / r.fork!.pressure!.psi,
      9,
    );
    // the default really was off here (a shorter column and a bigger negative chamber)
    expect(Math.abs(r.fork!.measuredSpring!.differencePct)).toBeGreaterThan(2);
  });

  it('a second stored fit replaces the first: only the last is stored', async () => {
    const again = (
      await as(owner)
        .post(fits(), { part: 'fork', attachmentIds: forkRunIds.slice(0, 2) })
        .expect(201)
    ).body as SpringFitView;
    expect(again.runIds).toEqual(forkRunIds.slice(0, 2));
    await as(owner).post(`${fits()}/${again.id}/store`, {}).expect(200);
    const listed = (await as(tech).get(fits()).expect(200)).body as SpringFitView[];
    expect(listed.filter((f) => f.stored).map((f) => f.id)).toEqual([again.id]);
    // a stored fit is not rejected (it stays on the bike)
    await as(tech).post(`${fits()}/${again.id}/reject`).expect(409);
  });

  it('a coil’s straight line uploaded as air is poor, with reasons; storing needs confirmPoor; rejected it stays off the bike', async () => {
    const poor = (await as(tech).post(fits(), { part: 'shock' }).expect(201)).body as SpringFitView;
    expect(poor.quality).toBe('poor');
    expect(poor.reasons.length).toBeGreaterThan(0);
    expect(poor.reasons.join(' ')).toMatch(/systematic|misses|edge/);
    expect(poor.runIds).toEqual([shockRunId]);
    const refused = await as(tech).post(`${fits()}/${poor.id}/store`, {}).expect(409);
    expect(refused.body.message).toMatch(/poor.*confirmPoor/s);
    await as(tech).post(`${fits()}/${poor.id}/store`, { confirmPoor: false }).expect(409);
    const rejected = (await as(tech).post(`${fits()}/${poor.id}/reject`).expect(200)).body as SpringFitView;
    expect(rejected).toMatchObject({ rejected: true, stored: false });
    await as(tech).post(`${fits()}/${poor.id}/store`, { confirmPoor: true }).expect(409);
    const mine = (await as(rider).get(`/api/bikes/${bike.id}`).expect(200)).body as Bike;
    expect(mine.shock!.measured).toBeUndefined();
  });

  it('refuses runs of the other part, unknown runs and bad bodies; an appointment without a bike is 409', async () => {
    const wrong = await as(tech)
      .post(fits(), { part: 'fork', attachmentIds: [shockRunId] })
      .expect(400);
    expect(wrong.body.fields).toEqual({ 'attachmentIds.0': 'a run of the shock' });
    await as(tech)
      .post(fits(), { part: 'fork', attachmentIds: [randomUUID()] })
      .expect(400);
    await as(tech).post(fits(), { part: 'wheel' }).expect(400);
    await as(tech)
      .post(fits(), { part: 'fork', attachmentIds: ['x'] })
      .expect(400);
    const noBike = await as(tech).post(fits(noBikeApptId), { part: 'fork' }).expect(409);
    expect(noBike.body.message).toMatch(/no bike from the rider's garage/);
  });

  it('another shop’s staff, the rider and another rider get 404 on every route', async () => {
    const fitId = good.id;
    for (const u of [otherTech, rider, otherRider]) {
      await as(u).get(fits()).expect(404);
      await as(u).post(fits(), { part: 'fork' }).expect(404);
      await as(u).post(`${fits()}/${fitId}/store`, {}).expect(404);
      await as(u).post(`${fits()}/${fitId}/reject`).expect(404);
    }
    await as(tech).post(`${fits()}/${randomUUID()}/store`, {}).expect(404);
    await as(tech).get(fits(randomUUID())).expect(404);
  });

  it('the garage: a PATCH that omits measured keeps it, another one is refused, null removes it', async () => {
    const before = ((await as(rider).get(`/api/bikes/${bike.id}`).expect(200)).body as Bike).fork!;
    const { measured, ...rest } = before;
    expect(measured).toBeTruthy();
    const kept = (
      await as(rider)
        .patch(`/api/bikes/${bike.id}`, { fork: { ...rest, spacers: 2 } })
        .expect(200)
    ).body as Bike;
    expect(kept.fork).toEqual({ ...rest, spacers: 2, measured });
    // sent back unchanged (as a form that round-trips the bike does): kept
    await as(rider).patch(`/api/bikes/${bike.id}`, { fork: kept.fork }).expect(200);
    const forged = await as(rider)
      .patch(`/api/bikes/${bike.id}`, {
        fork: { ...rest, measured: { ...measured!, positiveLengthMm: 300 } },
      })
      .expect(400);
    expect(Object.keys(forged.body.fields)).toEqual(['fork.measured']);
    await as(rider)
      .patch(`/api/bikes/${bike.id}`, { fork: { ...rest, measured: { ...measured!, frictionN: -1 } } })
      .expect(400);
    const removed = (
      await as(rider)
        .patch(`/api/bikes/${bike.id}`, { fork: { ...rest, measured: null } })
        .expect(200)
    ).body as Bike;
    expect(removed.fork).toEqual(rest);
    // a new bike cannot bring its own
    await as(rider)
      .post('/api/bikes', { name: 'copy', fork: { ...rest, measured } })
      .expect(400);
  });
});

function TRUE_GEOMETRY() {
  return { positiveLengthMm: TRUE.positiveLengthMm, negativeVolumeCm3: TRUE.negativeVolumeCm3 };
}
