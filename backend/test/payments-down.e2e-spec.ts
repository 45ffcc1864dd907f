import type { INestApplication } from '@nestjs/common';
import { DateTime } from 'luxon';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type { AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { freePort } from './utils/mail-fake-process';
import { createTestApp } from './utils/test-app';

/*
 * The payment service down (nothing listens on its port): booking a paid service answers 503 with
 * a clear message and leaves no hold behind; free services still book. Its own app, so nothing of
 * the other payment tests' app is touched.
 */
const ZONE = 'Europe/Berlin';

describe('payments with the payment service down', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let owner: TestUser;
  let rider: TestUser;
  let slug: string;

  const as = (u: TestUser) => ({
    post: (url: string, body: object = {}) => request(http).post(url).set('Cookie', u.cookie).send(body),
    put: (url: string, body: object) => request(http).put(url).set('Cookie', u.cookie).send(body),
  });
  const service = async (name: string, priceMinor: number, depositMinor: number) =>
    (
      await as(owner)
        .post('/api/workshop/services', {
          name,
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor,
          depositMinor,
        })
        .expect(201)
    ).body as ShopService;
  const firstFree = async (s: ShopService) => {
    const day = DateTime.now().setZone(ZONE).plus({ days: 10 }).toISODate()!;
    const slots = (
      await request(http)
        .get(`/api/shops/${slug}/availability`)
        .query({ serviceId: s.id, from: day, to: day })
    ).body as AvailableStart[];
    return slots.map((x) => x.start);
  };

  beforeAll(async () => {
    app = await createTestApp({ PAYMENTS_PORT: String(await freePort()), PAYMENTS_TIMEOUT_MS: '1000' });
    http = app.getHttpServer();
    const shop = await createShop(app, { timeZone: ZONE });
    slug = shop.slug;
    owner = await createUser(app, { role: 'owner', shopId: shop.id });
    rider = await createUser(app);
    const settings: ShopSettings = {
      timeZone: ZONE,
      currency: 'EUR',
      benches: 1,
      hours: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '09:00', end: '17:00' })),
      closures: [],
      rules: {
        slotStepMinutes: 60,
        minNoticeMinutes: 0,
        maxDaysAhead: 365,
        holdMinutes: 15,
        cancellationWindowHours: 48,
      },
    };
    await as(owner).put('/api/workshop/settings', settings).expect(200);
  });
  afterAll(async () => {
    await app.close();
  });

  it('booking a paid service says so clearly and leaves no hold behind', async () => {
    const paid = await service('Fork air spring setup', 6900, 2000);
    const [start] = await firstFree(paid);
    const res = await as(rider)
      .post('/api/appointments', { shopSlug: slug, serviceId: paid.id, start })
      .expect(503);
    expect(res.body.message).toMatch(/Online payment isn't available right now, so nothing was booked/);
    expect(
      await app.get(DataSource).query('SELECT id FROM appointments WHERE rider_id = ?', [rider.id]),
    ).toHaveLength(0);
    expect(await firstFree(paid)).toContain(start);
  });

  it('a free service still books', async () => {
    const free = await service('Free sag check', 0, 0);
    const [start] = await firstFree(free);
    const res = await as(rider)
      .post('/api/appointments', { shopSlug: slug, serviceId: free.id, start })
      .expect(201);
    expect(res.body.status).toBe('requested');
  });
});
