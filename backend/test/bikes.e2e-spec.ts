import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createUser, signedInAs, type TestUser } from './factories/accounts';
import { enduroBike, hardtail } from './factories/bikes';
import { createTestApp } from './utils/test-app';

describe('the garage: /api/bikes', () => {
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

  it('creates, lists, reads, changes and deletes a bike; the specs come back as the compute API takes them', async () => {
    const created = await as(a).post('/api/bikes', enduroBike()).expect(201);
    expect(created.body).toEqual({
      id: expect.any(String),
      ...enduroBike(),
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    const id = created.body.id as string;

    const list = await as(a).get('/api/bikes').expect(200);
    expect(list.body).toEqual([created.body]);
    await as(a).get(`/api/bikes/${id}`).expect(200, created.body);

    const renamed = await as(a).patch(`/api/bikes/${id}`, { name: 'Winter enduro bike' }).expect(200);
    expect(renamed.body).toMatchObject({
      name: 'Winter enduro bike',
      fork: enduroBike().fork,
      shock: enduroBike().shock,
    });

    // a part sent replaces the stored one whole; null removes it
    const coil = { strokeMm: 62.5, wheelTravelMm: 160, spring: 'coil', spacers: 0 };
    const changed = await as(a).patch(`/api/bikes/${id}`, { shock: coil }).expect(200);
    expect(changed.body.shock).toEqual(coil);
    const noShock = await as(a).patch(`/api/bikes/${id}`, { shock: null }).expect(200);
    expect(noShock.body.shock).toBeNull();
    expect(noShock.body.fork).toEqual(enduroBike().fork);

    await as(a).del(`/api/bikes/${id}`).expect(204);
    await as(a).get(`/api/bikes/${id}`).expect(404);
    await as(a).del(`/api/bikes/${id}`).expect(404);
  });

  it('keeps a hardtail (no shock) and the real geometry a technician measured', async () => {
    const res = await as(a).post('/api/bikes', hardtail()).expect(201);
    expect(res.body.shock).toBeNull();
    expect(res.body.fork.geometry).toEqual(hardtail().fork.geometry);
  });

  it("rider B can neither read, change nor delete rider A's bike (404, and A's bike is unchanged)", async () => {
    const mine = await as(a).post('/api/bikes', enduroBike()).expect(201);
    const id = mine.body.id as string;
    const r1 = await as(b).get(`/api/bikes/${id}`).expect(404);
    expect(r1.body).toMatchObject({ statusCode: 404, error: 'Not Found' });
    await as(b).patch(`/api/bikes/${id}`, { name: 'Taken' }).expect(404);
    await as(b).del(`/api/bikes/${id}`).expect(404);
    expect((await as(b).get('/api/bikes').expect(200)).body.map((x: { id: string }) => x.id)).not.toContain(
      id,
    );
    await as(a).get(`/api/bikes/${id}`).expect(200, mine.body);
  });

  it('answers 401 signed out on every route', async () => {
    const id = '00000000-0000-4000-8000-000000000000';
    await request(http).get('/api/bikes').expect(401);
    await request(http).post('/api/bikes').send(enduroBike()).expect(401);
    await request(http).get(`/api/bikes/${id}`).expect(401);
    await request(http).patch(`/api/bikes/${id}`).send({ name: 'x' }).expect(401);
    await request(http).delete(`/api/bikes/${id}`).expect(401);
  });

  it('answers 404 for an id that is not a UUID or does not exist', async () => {
    await as(a).get('/api/bikes/not-an-id').expect(404);
    await as(a).get('/api/bikes/00000000-0000-4000-8000-000000000000').expect(404);
  });

  it.each([
    ['no name', { fork: enduroBike().fork }, 'name'],
    ['an empty name', { ...enduroBike(), name: '  ' }, 'name'],
    ['fork travel of 0', { ...enduroBike(), fork: { ...enduroBike().fork, travelMm: 0 } }, 'fork.travelMm'],
    [
      'an unknown spring type',
      { ...enduroBike(), fork: { ...enduroBike().fork, spring: 'magic' } },
      'fork.spring',
    ],
    [
      'fractional spacers',
      { ...enduroBike(), shock: { ...enduroBike().shock, spacers: 1.5 } },
      'shock.spacers',
    ],
    [
      'a missing stroke',
      { ...enduroBike(), shock: { wheelTravelMm: 160, spring: 'air', spacers: 0 } },
      'shock.strokeMm',
    ],
    ['an unknown field', { ...enduroBike(), colour: 'green' }, 'colour'],
    [
      'an unknown geometry field',
      { ...enduroBike(), fork: { ...enduroBike().fork, geometry: { foo: 1 } } },
      'fork.geometry.foo',
    ],
    ['a fork that is a string', { ...enduroBike(), fork: 'big' }, 'fork'],
  ])('POST answers 400 for %s', async (_what, body, field) => {
    const res = await as(a).post('/api/bikes', body).expect(400);
    expect(res.body.fields).toHaveProperty([field]);
  });

  it.each([
    ['a null name', { name: null }, 'name'],
    ['a negative stanchion', { fork: { ...enduroBike().fork, stanchionMm: -1 } }, 'fork.stanchionMm'],
    ['an owner change', { ownerId: '00000000-0000-4000-8000-000000000000' }, 'ownerId'],
  ])('PATCH answers 400 for %s', async (_what, body, field) => {
    const mine = await as(a).post('/api/bikes', enduroBike()).expect(201);
    const res = await as(a).patch(`/api/bikes/${mine.body.id}`, body).expect(400);
    expect(res.body.fields).toHaveProperty([field]);
    await as(a).get(`/api/bikes/${mine.body.id}`).expect(200, mine.body);
  });

  it('staff have a garage of their own too', async () => {
    const tech = await createUser(app, { role: 'technician' });
    await request(http).post('/api/bikes').set('Cookie', tech.cookie).send(hardtail()).expect(201);
    expect((await request(http).get('/api/bikes').set('Cookie', tech.cookie).expect(200)).body).toHaveLength(
      1,
    );
  });
});
