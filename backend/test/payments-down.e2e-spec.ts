import type { INestApplication } from '@nestjs/common';
import { DateTime } from 'luxon';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type { AppointmentCreated, AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { AppointmentJobs } from '../src/appointments/appointment-jobs';
import { ManualClock } from '../src/common/clock/clock';
import { PaymentsService } from '../src/payments/payments.service';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { freePort } from './utils/mail-fake-process';
import { PaymentsFakeProcess } from './utils/payments-fake';
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

/*
 * Issue 12, fault tests: the payment service goes away after a hold was made. The hold still ends
 * on time — the expiry job needs only the database — so the time is free for others at once, and
 * the intent's cancellation waits (back-off from 15 s, docs/payments.md) and is made when the
 * service is back. The fake here is a process of the test's own with its state in a file, so it
 * comes back on the same port with the same intents; the app runs on a clock in the year 2100, so
 * the rows it writes are never due for the stack's app instance that shares the database.
 */
describe('payments: the payment service goes down while a hold waits for its card', () => {
  const clock = new ManualClock(new Date('2100-03-01T08:00:00Z'));
  let payments: PaymentsFakeProcess;
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let owner: TestUser;
  let rider: TestUser;
  let slug: string;
  let paid: ShopService;

  const as = (u: TestUser) => ({
    post: (url: string, body: object = {}) => request(http).post(url).set('Cookie', u.cookie).send(body),
    put: (url: string, body: object) => request(http).put(url).set('Cookie', u.cookie).send(body),
  });
  const day = () => DateTime.fromJSDate(clock.now()).setZone(ZONE).plus({ days: 10 }).toISODate()!;
  const free = async () =>
    (
      (
        await request(http)
          .get(`/api/shops/${slug}/availability`)
          .query({ serviceId: paid.id, from: day(), to: day() })
          .expect(200)
      ).body as AvailableStart[]
    ).map((x) => x.start);
  const paymentRow = async (appointmentId: string) =>
    (
      await app
        .get(DataSource)
        .query<{ status: string; cancel_wanted: number; cancel_attempts: number; next_attempt_at: Date }[]>(
          'SELECT status, cancel_wanted, cancel_attempts, next_attempt_at FROM payments WHERE appointment_id = ?',
          [appointmentId],
        )
    )[0];

  /**
   * Waits until the payment row is as wanted: the app's own schedules (the expiry cron, the 15-s
   * payment sweep) may do a step a moment before or while the test does it, so the test waits on
   * the row, not on its own call.
   */
  const rowWhen = async (appointmentId: string, want: Record<string, unknown>) => {
    const until = Date.now() + 10_000;
    for (;;) {
      const row = await paymentRow(appointmentId);
      if (Object.entries(want).every(([k, v]) => row[k as keyof typeof row] === v)) return row;
      if (Date.now() > until)
        throw new Error(`payment row ${JSON.stringify(row)} never became ${JSON.stringify(want)}`);
      await new Promise((r) => setTimeout(r, 50));
    }
  };

  beforeAll(async () => {
    payments = await PaymentsFakeProcess.onFreePort();
    await payments.start();
    app = await createTestApp(
      { PAYMENTS_PORT: String(payments.port), PAYMENTS_TIMEOUT_MS: '1000', MAIL_RELAY_INTERVAL_MS: '0' },
      { clock },
    );
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
    paid = (
      await as(owner)
        .post('/api/workshop/services', {
          name: 'Shock air can service',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 9000,
          depositMinor: 3000,
        })
        .expect(201)
    ).body as ShopService;
  });
  afterAll(async () => {
    await app.get(PaymentsService).idle();
    await app.close();
    await payments.destroy();
  });

  it('the hold still ends on time and frees the time; the intent is cancelled once the service is back', async () => {
    const [start] = await free();
    const held = (
      await as(rider).post('/api/appointments', { shopSlug: slug, serviceId: paid.id, start }).expect(201)
    ).body as AppointmentCreated;
    expect(held.status).toBe('held');
    const intentId = held.payment!.clientSecret.split('_secret_')[0];
    expect(await free()).not.toContain(start);

    await payments.stop();
    // a clear error for the next rider: nothing is booked while the service is away
    const other = await createUser(app);
    const [otherStart] = await free();
    const refused = await as(other)
      .post('/api/appointments', { shopSlug: slug, serviceId: paid.id, start: otherStart })
      .expect(503);
    expect(refused.body.message).toMatch(/nothing was booked/);
    expect(refused.headers['retry-after']).toMatch(/^\d+$/); // RFC 9110, 10.2.3

    const jobs = app.get(AppointmentJobs);
    const worker = app.get(PaymentsService);
    // a minute before the hold ends: still held
    clock.advance(14 * 60_000);
    await jobs.expireHolds();
    await worker.idle();
    expect(await free()).not.toContain(start);
    // the hold's 15 minutes are over: the expiry job frees the time, though the service is down
    clock.advance(60_000);
    await jobs.expireHolds();
    await worker.idle(); // the cancellation kicked after the commit: tried, failed
    expect(await free()).toContain(start);
    const [a] = await app
      .get(DataSource)
      .query<{ status: string }[]>('SELECT status FROM appointments WHERE id = ?', [held.id]);
    expect(a.status).toBe('expired');
    const waiting = await paymentRow(held.id);
    expect(waiting).toMatchObject({
      status: 'requires_payment_method',
      cancel_wanted: 1,
      cancel_attempts: 1,
    });
    // retried after a back-off (15 s first, docs/payments.md), not at once
    expect(waiting.next_attempt_at.getTime() - clock.now().getTime()).toBe(15_000);
    clock.advance(15_000);
    await worker.settle();
    expect(await paymentRow(held.id)).toMatchObject({ cancel_wanted: 1, cancel_attempts: 2 });

    // the service is back (same port, same intents): the next due retry cancels the intent, once
    await payments.start();
    expect((await payments.fake.state()).intents.find((i) => i.id === intentId)?.status).toBe(
      'requires_payment_method',
    );
    clock.advance(30_000);
    await worker.settle();
    await worker.idle();
    const done = await rowWhen(held.id, { status: 'canceled', cancel_wanted: 0 });
    const state = await payments.fake.state();
    expect(state.intents.find((i) => i.id === intentId)?.status).toBe('canceled');
    // and nothing more is tried later for it
    clock.advance(3_600_000);
    await worker.settle();
    await worker.idle();
    expect(await paymentRow(held.id)).toMatchObject({
      status: 'canceled',
      cancel_attempts: done.cancel_attempts,
    });
  });
});
