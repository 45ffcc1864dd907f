import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { BaselineSheet } from '../src/baseline-sheets/baseline-sheet.entity';
import { createUser, signedInAs, type TestUser } from './factories/accounts';
import { baselineInput, hardtail } from './factories/bikes';
import { createTestApp } from './utils/test-app';

describe('baseline sheets: /api/baseline-sheets', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let a: TestUser;
  let b: TestUser;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    a = await createUser(app);
    b = await createUser(app);
  });
  afterAll(async () => {
    await app.close();
  });

  const as = (u: TestUser) => signedInAs(http, u);

  it('saves {name, input} and answers 201 with the result exactly as the public compute route gives it', async () => {
    const input = baselineInput();
    const computed = await request(http).post('/api/baselines/compute').send(input).expect(200);
    const res = await as(a).post('/api/baseline-sheets', { name: 'Enduro, 82 kg', input }).expect(201);
    expect(res.body).toEqual({
      id: expect.any(String),
      name: 'Enduro, 82 kg',
      input,
      result: computed.body,
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    await as(a).get(`/api/baseline-sheets/${res.body.id}`).expect(200, res.body);
  });

  it('keeps the result as computed then, whatever the model says later', async () => {
    const res = await as(a)
      .post('/api/baseline-sheets', { name: 'Kept', input: baselineInput() })
      .expect(201);
    // stand-in for a later model version: the stored result is what the sheet shows, not a re-computation
    const repo = app.get(DataSource).getRepository(BaselineSheet);
    const row = await repo.findOneByOrFail({ id: res.body.id });
    const marked = { ...row.result, cautions: [...row.result.cautions, 'computed by an older model'] };
    await repo.update({ id: row.id }, { result: marked });
    const again = await as(a).get(`/api/baseline-sheets/${res.body.id}`).expect(200);
    expect(again.body.result.cautions).toContain('computed by an older model');
  });

  it('lists mine newest first, with the key figures and without the curves', async () => {
    const u = await createUser(app);
    const first = await as(u)
      .post('/api/baseline-sheets', { name: 'First', input: baselineInput() })
      .expect(201);
    const coil = baselineInput({
      rider: { massKg: 95 },
      riding: { style: 'downhill', feel: 'firm' },
      shock: { strokeMm: 75, wheelTravelMm: 200, spring: 'coil', spacers: 0 },
    });
    const second = await as(u).post('/api/baseline-sheets', { name: 'Second', input: coil }).expect(201);
    const list = await as(u).get('/api/baseline-sheets').expect(200);
    expect(list.body.map((s: { name: string }) => s.name)).toEqual(['Second', 'First']);
    const [s2, s1] = list.body;
    expect(s2).toEqual({
      id: second.body.id,
      name: 'Second',
      massKg: 95,
      style: 'downhill',
      feel: 'firm',
      fork: {
        targetSagPct: second.body.result.fork.targetSagPct,
        targetSagMm: second.body.result.fork.targetSagMm,
        pressurePsi: second.body.result.fork.pressure.psi,
        rangePsi: second.body.result.fork.pressure.rangePsi,
        coilLbPerIn: null,
        warnings: second.body.result.fork.warnings.length,
      },
      shock: expect.objectContaining({
        pressurePsi: null,
        rangePsi: null,
        coilLbPerIn: second.body.result.shock.coilRate.suggestedLbPerIn,
      }),
      createdAt: second.body.createdAt,
      updatedAt: second.body.updatedAt,
    });
    expect(s1.id).toBe(first.body.id);
    expect(JSON.stringify(list.body)).not.toContain('forceN'); // no curves in the list
  });

  it('renames (200) without touching the input or result, then deletes (204)', async () => {
    const res = await as(a)
      .post('/api/baseline-sheets', { name: 'Old name', input: baselineInput() })
      .expect(201);
    const renamed = await as(a)
      .patch(`/api/baseline-sheets/${res.body.id}`, { name: ' New name ' })
      .expect(200);
    expect(renamed.body).toMatchObject({
      id: res.body.id,
      name: 'New name',
      input: res.body.input,
      result: res.body.result,
    });
    await as(a).del(`/api/baseline-sheets/${res.body.id}`).expect(204);
    await as(a).get(`/api/baseline-sheets/${res.body.id}`).expect(404);
    await as(a).del(`/api/baseline-sheets/${res.body.id}`).expect(404);
  });

  it("rider B can neither read, rename nor delete rider A's sheet (404), nor see it listed", async () => {
    const mine = await as(a)
      .post('/api/baseline-sheets', { name: "A's sheet", input: baselineInput() })
      .expect(201);
    const id = mine.body.id as string;
    await as(b).get(`/api/baseline-sheets/${id}`).expect(404);
    await as(b).patch(`/api/baseline-sheets/${id}`, { name: 'Mine now' }).expect(404);
    await as(b).del(`/api/baseline-sheets/${id}`).expect(404);
    expect(
      (await as(b).get('/api/baseline-sheets').expect(200)).body.map((s: { id: string }) => s.id),
    ).not.toContain(id);
    await as(a).get(`/api/baseline-sheets/${id}`).expect(200, mine.body);
  });

  it('shop staff cannot read a rider sheet that is not attached to their appointments (404)', async () => {
    const mine = await as(a)
      .post('/api/baseline-sheets', { name: 'Private', input: baselineInput() })
      .expect(201);
    const tech = await createUser(app, { role: 'technician' });
    await as(tech).get(`/api/baseline-sheets/${mine.body.id}`).expect(404);
  });

  it('answers 401 signed out on every route', async () => {
    const id = '00000000-0000-4000-8000-000000000000';
    await request(http).get('/api/baseline-sheets').expect(401);
    await request(http).post('/api/baseline-sheets').send({ name: 'x', input: baselineInput() }).expect(401);
    await request(http).get(`/api/baseline-sheets/${id}`).expect(401);
    await request(http).patch(`/api/baseline-sheets/${id}`).send({ name: 'x' }).expect(401);
    await request(http).delete(`/api/baseline-sheets/${id}`).expect(401);
  });

  it.each([
    ['no name', { input: baselineInput() }, 'name'],
    ['no input', { name: 'x' }, 'input'],
    ['a negative mass', { name: 'x', input: baselineInput({ rider: { massKg: -5 } }) }, 'input.rider.massKg'],
    [
      'an unknown style',
      { name: 'x', input: baselineInput({ riding: { style: 'commute' as 'trail', feel: 'balanced' } }) },
      'input.riding.style',
    ],
    [
      'an unknown field in the input',
      { name: 'x', input: { ...baselineInput(), colour: 'red' } },
      'input.colour',
    ],
    ['an unknown top-level field', { name: 'x', input: baselineInput(), result: {} }, 'result'],
  ])('POST answers 400 for %s', async (_what, body, field) => {
    const res = await as(a).post('/api/baseline-sheets', body).expect(400);
    expect(res.body.fields).toHaveProperty([field]);
  });

  it('POST answers 400 when the model cannot compute (spacers that close the chamber) and stores nothing', async () => {
    const u = await createUser(app);
    const bad = baselineInput({
      fork: { ...hardtail().fork, spacers: 12, geometry: { positiveLengthMm: 125 } },
    });
    const res = await as(u)
      .post('/api/baseline-sheets', { name: 'Too many spacers', input: bad })
      .expect(400);
    expect(Object.keys(res.body.fields ?? {}).some((k) => k.startsWith('fork'))).toBe(true);
    expect((await as(u).get('/api/baseline-sheets').expect(200)).body).toEqual([]);
  });

  it('PATCH answers 400 for an empty name or an attempt to change the input', async () => {
    const mine = await as(a)
      .post('/api/baseline-sheets', { name: 'Fixed', input: baselineInput() })
      .expect(201);
    await as(a).patch(`/api/baseline-sheets/${mine.body.id}`, { name: '' }).expect(400);
    const res = await as(a)
      .patch(`/api/baseline-sheets/${mine.body.id}`, { name: 'x', input: baselineInput() })
      .expect(400);
    expect(res.body.fields).toHaveProperty('input');
  });
});
