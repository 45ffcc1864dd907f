import type { INestApplication } from '@nestjs/common';
import { DateTime } from 'luxon';
import Stripe from 'stripe';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type {
  Appointment,
  AppointmentCreated,
  AvailableStart,
  ShopService,
  ShopSettings,
  WorkshopPaymentRow,
  WorkshopPayments,
} from '@loamline/shared-types';
import { AppointmentsService } from '../src/appointments/appointments.service';
import { ManualClock } from '../src/common/clock/clock';
import { PaymentGateway } from '../src/payments/payment-gateway';
import { PaymentsService } from '../src/payments/payments.service';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { waitForMail } from './utils/mail-inbox';
import { PaymentsFake } from './utils/payments-fake';
import { createTestApp } from './utils/test-app';

/*
 * Payments against the real app, MariaDB, the real `stripe` SDK and the payment fake that
 * `npm test` started (it speaks the hosted service's wire protocol; its webhooks go to the stack's
 * app instance, which shares this database, as a second instance would). The test plays the
 * rider's browser with the same SDK calls the browser library makes: confirm with a test card.
 * Test cards and tokens and their outcomes are the hosted service's documented test values
 * (pm_card_visa succeeds, pm_card_chargeDeclined is declined, pm_card_authenticationRequired asks
 * for authentication).
 */

const ZONE = 'Europe/Berlin';
const SECRET_KEY = process.env.PAYMENTS_SECRET_KEY ?? 'sk_test_loamline_local';
const WEBHOOK_SECRET = process.env.PAYMENTS_WEBHOOK_SECRET ?? 'whsec_loamline_local';
const settings = (): ShopSettings => ({
  timeZone: ZONE,
  currency: 'EUR',
  benches: 1,
  hours: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '00:00', end: '24:00' })),
  closures: [],
  rules: {
    slotStepMinutes: 60,
    minNoticeMinutes: 0,
    maxDaysAhead: 365,
    holdMinutes: 15,
    cancellationWindowHours: 48,
  },
});

async function eventually<T>(what: string, probe: () => Promise<T | undefined | null | false>, ms = 15_000) {
  const until = Date.now() + ms;
  for (;;) {
    const v = await probe();
    if (v) return v;
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('payments (real app, real stripe SDK against the payment fake)', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let db: DataSource;
  let clock: ManualClock;
  let fake: PaymentsFake;
  let browser: Stripe; // what the rider's browser does, through the same SDK
  let owner: TestUser;
  let tech: TestUser;
  let otherOwner: TestUser;
  let slug: string;
  let deposit: ShopService;
  let full: ShopService;
  let hour = 0;

  const as = (u: TestUser) => ({
    get: (url: string) => request(http).get(url).set('Cookie', u.cookie),
    post: (url: string, body: object = {}) => request(http).post(url).set('Cookie', u.cookie).send(body),
    put: (url: string, body: object) => request(http).put(url).set('Cookie', u.cookie).send(body),
  });

  /** A free start `daysAhead` days from the clock, a different hour each call. */
  async function freeStart(service: ShopService, daysAhead = 14): Promise<string> {
    const day = DateTime.fromJSDate(clock.now()).setZone(ZONE).plus({ days: daysAhead }).toISODate()!;
    const slots = (
      await request(http)
        .get(`/api/shops/${slug}/availability`)
        .query({ serviceId: service.id, from: day, to: day })
    ).body as AvailableStart[];
    const s = slots[hour++ % slots.length];
    if (!s) throw new Error('no free start');
    return s.start;
  }

  async function book(rider: TestUser, service = deposit, daysAhead = 14): Promise<AppointmentCreated> {
    const start = await freeStart(service, daysAhead);
    return (
      await as(rider).post('/api/appointments', { shopSlug: slug, serviceId: service.id, start }).expect(201)
    ).body as AppointmentCreated;
  }

  const intentOf = (created: AppointmentCreated) => created.payment!.clientSecret.split('_secret_')[0];
  const mine = async (rider: TestUser, id: string) =>
    (await as(rider).get(`/api/appointments/${id}`).expect(200)).body as Appointment;
  const until = (rider: TestUser, id: string, pred: (a: Appointment) => boolean, what: string) =>
    eventually(what, async () => {
      const a = await mine(rider, id);
      return pred(a) ? a : null;
    });
  const paidEvents = async (id: string) =>
    Number(
      (
        await db.query<{ n: number }[]>(
          "SELECT COUNT(*) AS n FROM appointment_events WHERE appointment_id = ? AND event = 'paid'",
          [id],
        )
      )[0].n,
    );

  /** Waits until the fake has delivered every event of the intent to the app (2xx), in its order. */
  const deliveredAll = (intentId: string) =>
    eventually(`the fake's deliveries for ${intentId}`, async () => {
      const { events } = await fake.state();
      const mine = events.filter((x) => {
        const o = x.event.data.object as { id?: string; payment_intent?: unknown };
        return o.id === intentId || o.payment_intent === intentId;
      });
      return (
        mine.length > 0 &&
        mine.every((x) =>
          (x.deliveries as { status: number | null }[] | undefined)?.some((d) => d.status === 200),
        )
      );
    });

  /** A webhook as the service signs it (the SDK's own test header), at `timestamp`. */
  function signed(event: object, opts: { secret?: string; timestamp?: number } = {}) {
    const payload = JSON.stringify(event);
    const header = browser.webhooks.generateTestHeaderString({
      payload,
      secret: opts.secret ?? WEBHOOK_SECRET,
      timestamp: opts.timestamp ?? Math.floor(Date.now() / 1000),
    });
    return request(http)
      .post('/api/payments/webhook')
      .set('Content-Type', 'application/json')
      .set('Stripe-Signature', header)
      .send(payload);
  }

  beforeAll(async () => {
    clock = new ManualClock();
    fake = new PaymentsFake();
    app = await createTestApp({}, { clock });
    http = app.getHttpServer();
    db = app.get(DataSource);
    browser = new Stripe(SECRET_KEY, { host: '127.0.0.1', port: fake.port, protocol: 'http' });
    const shop = await createShop(app, { timeZone: ZONE });
    slug = shop.slug;
    owner = await createUser(app, { role: 'owner', shopId: shop.id, name: 'Olive Owner' });
    tech = await createUser(app, { role: 'technician', shopId: shop.id });
    otherOwner = await createUser(app, { role: 'owner' });
    await as(owner).put('/api/workshop/settings', settings()).expect(200);
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
    deposit = await service('Fork air spring setup', 6900, 2000);
    full = await service('Shock service', 12000, 12000);
  });
  afterAll(async () => {
    await fake.control('webhooks/resume').catch(() => undefined);
    await app.get(PaymentsService).idle();
    await app.close();
  });

  it('publishes the publishable key and the payment script for the browser', async () => {
    const res = await request(http).get('/api/payments/config').expect(200);
    expect(res.body.publishableKey).toMatch(/^pk_test_/);
    expect(res.body.scriptUrl).toBe(`${fake.url}/js/stripe.js`);
    // and the Content-Security-Policy lets the page load it, call it and frame its authentication page
    const csp = String(res.headers['content-security-policy']);
    for (const d of ['script-src', 'connect-src', 'frame-src'])
      expect(csp).toMatch(new RegExp(`${d} [^;]*${fake.url.replace(/[.]/g, '\\.')}`));
  });

  it('a held booking has its intent: the deposit in minor units, the appointment in metadata', async () => {
    const rider = await createUser(app);
    const created = await book(rider);
    expect(created.status).toBe('held');
    expect(created.payment).toMatchObject({ amountMinor: 2000, currency: 'EUR', kind: 'deposit' });
    expect(created.payment!.publishableKey).toMatch(/^pk_test_/);
    const intent = await browser.paymentIntents.retrieve(intentOf(created));
    expect(intent).toMatchObject({
      amount: 2000,
      currency: 'eur',
      status: 'requires_payment_method',
      metadata: { appointmentId: created.id },
    });
    const a = await mine(rider, created.id);
    expect(a.payment).toMatchObject({ status: 'requires_payment_method', paidMinor: 0, amountMinor: 2000 });
    // a reload continues with the same intent
    const again = await as(rider).get(`/api/appointments/${created.id}/payment`).expect(200);
    expect(again.body.clientSecret).toBe(created.payment!.clientSecret);
    // nobody else sees it
    const other = await createUser(app);
    await as(other).get(`/api/appointments/${created.id}/payment`).expect(404);
    await as(other).post(`/api/appointments/${created.id}/payment/sync`).expect(404);
  });

  it('a browser asking again and again reaches the payment service at most once a second', async () => {
    const rider = await createUser(app);
    const created = await book(rider);
    const retrieve = jest.spyOn(app.get(PaymentGateway), 'retrieve'); // counts, and calls through
    try {
      const began = Date.now();
      const answers = await Promise.all(
        Array.from({ length: 20 }, () => as(rider).post(`/api/appointments/${created.id}/payment/sync`)),
      );
      const seconds = (Date.now() - began) / 1000;
      expect(answers.every((r) => r.status === 200)).toBe(true);
      // once a second: one call when the 20 answers came within a second (as on a quiet machine),
      // never more than one per second they took (a loaded machine may spread them out)
      expect(retrieve.mock.calls.length).toBeGreaterThanOrEqual(1);
      expect(retrieve.mock.calls.length).toBeLessThanOrEqual(1 + Math.floor(seconds));
    } finally {
      retrieve.mockRestore();
    }
    expect((await mine(rider, created.id)).status).toBe('held');
  });

  it('the same appointment never gets two intents: creating again with its key returns the first', async () => {
    const gateway = app.get(PaymentGateway);
    const p = {
      appointmentId: '00000000-0000-4000-8000-00000000abcd',
      amountMinor: 1234,
      currency: 'EUR',
      description: 'idempotency check',
      shopId: 's',
      riderId: 'r',
    };
    const [a, b] = await Promise.all([gateway.createIntent(p), gateway.createIntent(p)]);
    const c = await gateway.createIntent(p);
    expect(b.id).toBe(a.id);
    expect(c.id).toBe(a.id);
    const state = await fake.state();
    expect(state.intents.filter((i) => i.metadata.appointmentId === p.appointmentId)).toHaveLength(1);
  });

  it('held → paid → requested → confirmed with the success card; receipt and mails; a cancellation in good time refunds all', async () => {
    const rider = await createUser(app);
    const created = await book(rider);
    const paid = await browser.paymentIntents.confirm(intentOf(created), { payment_method: 'pm_card_visa' });
    expect(paid.status).toBe('succeeded');
    // the browser asks the app to check; the webhook does the same: one transition either way
    await as(rider).post(`/api/appointments/${created.id}/payment/sync`).expect(200);
    const a = await until(rider, created.id, (x) => x.status === 'requested', 'requested');
    expect(a.payment).toMatchObject({
      status: 'succeeded',
      paidMinor: 2000,
      refundedMinor: 0,
      netMinor: 2000,
      balanceDueMinor: 4900,
      card: { brand: 'visa', last4: '4242' },
    });
    await new Promise((r) => setTimeout(r, 500)); // let the webhook land too
    expect(await paidEvents(created.id)).toBe(1);
    const mails = await waitForMail(rider.email, 2);
    expect(mails.map((m) => m.subject)).toEqual(
      expect.arrayContaining([
        'Payment received: €20.00 for Fork air spring setup',
        'Request received: Fork air spring setup',
      ]),
    );
    await as(tech).post(`/api/workshop/appointments/${created.id}/confirm`).expect(200);
    const before = await mine(rider, created.id);
    expect(before).toMatchObject({
      status: 'confirmed',
      fullRefundIfCancelled: true,
      refundIfCancelledMinor: 2000,
    });

    await as(rider).post(`/api/appointments/${created.id}/cancel`, { reason: 'Plans changed' }).expect(200);
    await app.get(PaymentsService).idle();
    const after = await until(
      rider,
      created.id,
      (x) => x.payment?.refunds[0]?.status === 'succeeded',
      'the refund made',
    );
    expect(after.payment).toMatchObject({ refundedMinor: 2000, netMinor: 0, balanceDueMinor: 0 });
    expect(after.payment!.refunds[0]).toMatchObject({ kind: 'rider-cancel', amountMinor: 2000, by: 'rider' });
    const refunds = (await fake.state()).refunds.filter((r) => r.payment_intent === intentOf(created));
    expect(refunds.map((r) => r.amount)).toEqual([2000]);
    const refundMail = await waitForMail(rider.email, 5);
    expect(refundMail.map((m) => m.subject)).toContain('Refund: €20.00 for Fork air spring setup');
  });

  it('a cancellation inside the window keeps the deposit; a decline refunds everything', async () => {
    const rider = await createUser(app);
    const late = await book(rider, deposit, 1); // tomorrow: inside the 48-hour window
    await browser.paymentIntents.confirm(intentOf(late), { payment_method: 'pm_card_visa' });
    await as(rider).post(`/api/appointments/${late.id}/payment/sync`).expect(200);
    const a = await mine(rider, late.id);
    expect(a).toMatchObject({ status: 'requested', fullRefundIfCancelled: false, refundIfCancelledMinor: 0 });
    await as(rider).post(`/api/appointments/${late.id}/cancel`, {}).expect(200);
    await app.get(PaymentsService).idle();
    const kept = await mine(rider, late.id);
    expect(kept.payment).toMatchObject({ paidMinor: 2000, refundedMinor: 0, netMinor: 2000, refunds: [] });

    const declined = await book(rider, full);
    await browser.paymentIntents.confirm(intentOf(declined), { payment_method: 'pm_card_visa' });
    await as(rider).post(`/api/appointments/${declined.id}/payment/sync`).expect(200);
    await as(tech)
      .post(`/api/workshop/appointments/${declined.id}/decline`, { reason: 'No seal kit for this fork' })
      .expect(200);
    await app.get(PaymentsService).idle();
    const d = await until(rider, declined.id, (x) => x.payment?.refunds[0]?.status === 'succeeded', 'refund');
    expect(d.payment).toMatchObject({ paidMinor: 12000, refundedMinor: 12000, netMinor: 0 });
    expect(d.payment!.refunds[0]).toMatchObject({ kind: 'decline', amountMinor: 12000, by: 'staff' });
  });

  it('a move made inside the window does not buy a fresh one: the deposit stays kept', async () => {
    const rider = await createUser(app);
    const soon = await book(rider, deposit, 1); // inside the 48-hour window
    await browser.paymentIntents.confirm(intentOf(soon), { payment_method: 'pm_card_visa' });
    await as(rider).post(`/api/appointments/${soon.id}/payment/sync`).expect(200);
    const later = await freeStart(deposit, 20);
    await as(rider).post(`/api/appointments/${soon.id}/move`, { start: later }).expect(200);
    const moved = await mine(rider, soon.id);
    expect(moved).toMatchObject({ fullRefundIfCancelled: true, refundIfCancelledMinor: 0 });
    await as(rider).post(`/api/appointments/${soon.id}/cancel`, {}).expect(200);
    await app.get(PaymentsService).idle();
    expect((await mine(rider, soon.id)).payment).toMatchObject({ refundedMinor: 0, netMinor: 2000 });
  });

  it('the currency cannot change under prices and bookings', async () => {
    const res = await as(owner)
      .put('/api/workshop/settings', { ...settings(), currency: 'JPY' })
      .expect(409);
    expect(res.body.fields.currency).toMatch(/stays EUR/);
  });

  it('a rider cancelling an unpaid hold tells the shop nothing (it never reached them)', async () => {
    const rider = await createUser(app);
    const created = await book(rider);
    await as(rider).post(`/api/appointments/${created.id}/cancel`, {}).expect(200);
    await app.get(PaymentsService).idle();
    await waitForMail(rider.email, 1);
    const rows = await db.query<{ n: number }[]>(
      "SELECT COUNT(*) AS n FROM mail_outbox WHERE ref_id = ? AND kind = 'appointment-cancel'",
      [created.id],
    );
    expect(Number(rows[0].n)).toBe(1); // the rider's only
    expect((await browser.paymentIntents.retrieve(intentOf(created))).status).toBe('canceled');
  });

  it('a declined card leaves the hold, says why, and the time comes free when the hold ends; the intent is cancelled', async () => {
    const rider = await createUser(app);
    const created = await book(rider);
    await expect(
      browser.paymentIntents.confirm(intentOf(created), { payment_method: 'pm_card_chargeDeclined' }),
    ).rejects.toMatchObject({ type: 'StripeCardError', code: 'card_declined' });
    await as(rider).post(`/api/appointments/${created.id}/payment/sync`).expect(200);
    const a = await mine(rider, created.id);
    expect(a.status).toBe('held');
    expect(a.payment!.lastError).toMatch(/declined/i);
    await expect(
      browser.paymentIntents.confirm(intentOf(created), {
        payment_method: 'pm_card_chargeDeclinedInsufficientFunds',
      }),
    ).rejects.toMatchObject({ code: 'card_declined', decline_code: 'insufficient_funds' });
    await as(rider).post(`/api/appointments/${created.id}/payment/sync`).expect(200);
    // a second check within a second is answered from the database; the webhook brings the news
    await until(
      rider,
      created.id,
      (x) => /insufficient funds/i.test(x.payment!.lastError ?? ''),
      'the reason',
    );

    clock.advance(16 * 60_000);
    await app.get(AppointmentsService).expireDue();
    await app.get(PaymentsService).settle();
    expect((await mine(rider, created.id)).status).toBe('expired');
    const intent = await browser.paymentIntents.retrieve(intentOf(created));
    expect(intent.status).toBe('canceled');
    expect((await mine(rider, created.id)).payment!.status).toBe('canceled');
    await as(rider).get(`/api/appointments/${created.id}/payment`).expect(409);
    expect(await paidEvents(created.id)).toBe(0);
    // the mail says why it lapsed
    const lapsed = (await waitForMail(rider.email, 1)).find((m) => m.subject.startsWith('Not booked'));
    expect(lapsed?.text).toMatch(/The last payment attempt did not go through: .*insufficient funds/i);
    clock.set(new Date());
  });

  it('the authentication card needs the extra step, then succeeds; a failed authentication does not', async () => {
    const rider = await createUser(app);
    const created = await book(rider);
    const pending = await browser.paymentIntents.confirm(intentOf(created), {
      payment_method: 'pm_card_authenticationRequired',
    });
    expect(pending.status).toBe('requires_action');
    await as(rider).post(`/api/appointments/${created.id}/payment/sync`).expect(200);
    expect((await mine(rider, created.id)).status).toBe('held');
    await fake.authenticate(pending, 'complete');
    await as(rider).post(`/api/appointments/${created.id}/payment/sync`).expect(200);
    await until(rider, created.id, (x) => x.status === 'requested', 'requested after authentication');

    const second = await book(rider);
    const p2 = await browser.paymentIntents.confirm(intentOf(second), {
      payment_method: 'pm_card_authenticationRequired',
    });
    await fake.authenticate(p2, 'fail');
    await as(rider).post(`/api/appointments/${second.id}/payment/sync`).expect(200);
    const a2 = await until(rider, second.id, (x) => !!x.payment?.lastError, 'the failed authentication');
    expect(a2.status).toBe('held');
  });

  describe('the webhook', () => {
    it('refuses a forged, unsigned or stale signature with 400 and changes nothing', async () => {
      const rider = await createUser(app);
      const created = await book(rider);
      await fake.control('webhooks/pause');
      try {
        const intent = await browser.paymentIntents.confirm(intentOf(created), {
          payment_method: 'pm_card_visa',
        });
        const event = {
          id: `evt_forged_${Date.now()}`,
          object: 'event',
          type: 'payment_intent.succeeded',
          data: { object: intent },
        };
        // this intent's events only: other tests' deliveries may land meanwhile
        const count = async () =>
          Number(
            (await db.query('SELECT COUNT(*) AS n FROM payment_events WHERE intent_id = ?', [intent.id]))[0]
              .n,
          );
        const n = await count();
        await signed(event, { secret: 'whsec_someone_else' }).expect(400);
        await request(http)
          .post('/api/payments/webhook')
          .set('Content-Type', 'application/json')
          .send(event)
          .expect(400);
        await signed(event, { timestamp: Math.floor(Date.now() / 1000) - 3600 }).expect(400);
        expect(await count()).toBe(n);
        expect((await mine(rider, created.id)).status).toBe('held');
        // the real thing, signed now, is taken
        await signed(event).expect(200);
        expect((await mine(rider, created.id)).status).toBe('requested');
      } finally {
        await fake.control('webhooks/resume');
      }
    });

    it('twice and out of order: the success event three times at once, a stale payment_failed after it, then the success again, make one transition and one receipt', async () => {
      const rider = await createUser(app);
      const created = await book(rider);
      await fake.control('webhooks/pause');
      try {
        const failed = await browser.paymentIntents
          .confirm(intentOf(created), { payment_method: 'pm_card_chargeDeclined' })
          .catch((e: { raw?: { payment_intent?: Stripe.PaymentIntent } }) => e.raw?.payment_intent);
        const succeeded = await browser.paymentIntents.confirm(intentOf(created), {
          payment_method: 'pm_card_visa',
        });
        const ok = {
          id: `evt_ok_${Date.now()}`,
          object: 'event',
          type: 'payment_intent.succeeded',
          data: { object: succeeded },
        };
        const old = {
          id: `evt_old_${Date.now()}`,
          object: 'event',
          type: 'payment_intent.payment_failed',
          data: { object: failed ?? { ...succeeded, status: 'requires_payment_method' } },
        };
        const answers = await Promise.all([signed(ok), signed(ok), signed(ok)]);
        expect(answers.map((r) => r.status)).toEqual([200, 200, 200]);
        await signed(old).expect(200);
        await signed(ok).expect(200);
        const a = await mine(rider, created.id);
        expect(a.status).toBe('requested');
        expect(a.payment).toMatchObject({ status: 'succeeded', lastError: null });
        expect(await paidEvents(created.id)).toBe(1);
      } finally {
        await fake.control('webhooks/resume');
      }
      // the fake's own deliveries of the same news, once resumed, change nothing either
      await deliveredAll(intentOf(created));
      expect(await paidEvents(created.id)).toBe(1);
      const receipts = (await waitForMail(rider.email, 2)).filter((m) =>
        m.subject.startsWith('Payment received'),
      );
      expect(receipts).toHaveLength(1);
    });

    /*
     * Issue 12, fault tests: the service's own events, delivered out of order and twice. The
     * refund's events (refund.created, charge.refunded) come first, then the payment's own
     * success events, each twice, then the fake's own deliveries in its order; the hosted
     * service documents that events may arrive out of order and more than once (its webhook
     * guide: "Event ordering", "Handle duplicate events"), so every one must change nothing here.
     */
    it("out of order: a refund's events before the payment's own success event, each twice, change nothing after the decline", async () => {
      const rider = await createUser(app);
      const created = await book(rider, full);
      const intentId = intentOf(created);
      await fake.control('webhooks/pause');
      let events: Stripe.Event[];
      try {
        await browser.paymentIntents.confirm(intentId, { payment_method: 'pm_card_visa' });
        // the app learns of the payment from the rider's browser, not from the (held) events
        await as(rider).post(`/api/appointments/${created.id}/payment/sync`).expect(200);
        await as(tech)
          .post(`/api/workshop/appointments/${created.id}/decline`, { reason: 'No seal kit for this shock' })
          .expect(200);
        await app.get(PaymentsService).idle();
        await until(rider, created.id, (x) => x.payment?.refunds[0]?.status === 'succeeded', 'the refund');
        const ofIntent = (e: Stripe.Event) => {
          const o = e.data.object as { id?: string; payment_intent?: unknown };
          return o.id === intentId || o.payment_intent === intentId;
        };
        events = (await fake.state()).events.map((x) => x.event).filter(ofIntent);
        const types = events.map((e) => e.type);
        expect(types).toEqual(
          expect.arrayContaining([
            'payment_intent.succeeded',
            'charge.succeeded',
            'refund.created',
            'charge.refunded',
          ]),
        );
        // newest first: the refund's news before the payment's, each delivered twice
        for (const e of [...events].reverse()) {
          await signed(e).expect(200);
          await signed(e).expect(200);
        }
      } finally {
        await fake.control('webhooks/resume');
      }
      // and the fake's own deliveries of the same events, in its order, once it is resumed
      await deliveredAll(intentId);
      const a = await mine(rider, created.id);
      expect(a.status).toBe('declined');
      expect(a.payment).toMatchObject({
        status: 'succeeded',
        paidMinor: 12000,
        refundedMinor: 12000,
        netMinor: 0,
      });
      expect(a.payment!.refunds).toHaveLength(1);
      expect(a.payment!.refunds[0]).toMatchObject({
        kind: 'decline',
        amountMinor: 12000,
        status: 'succeeded',
      });
      expect(await paidEvents(created.id)).toBe(1);
      // each event recorded once, however often it came
      const recorded = await db.query<{ id: string; n: number }[]>(
        'SELECT id, COUNT(*) AS n FROM payment_events WHERE intent_id = ? GROUP BY id',
        [intentId],
      );
      expect(recorded.every((r) => Number(r.n) === 1)).toBe(true);
      // one receipt and one refund mail, no second of either
      // (the outbox sends them in no set order: wait until both are there)
      const mails = (
        await eventually('the receipt and the refund mail', async () => {
          const got = await waitForMail(rider.email, 1);
          const subjects = got.map((m) => m.subject);
          return subjects.some((t) => t.startsWith('Refund:')) &&
            subjects.some((t) => t.startsWith('Payment received'))
            ? got
            : null;
        })
      ).map((m) => m.subject);
      expect(mails.filter((t) => t.startsWith('Payment received'))).toHaveLength(1);
      expect(mails.filter((t) => t.startsWith('Refund:'))).toHaveLength(1);
    });

    it('a payment that succeeds after its hold expired is refunded at once, and the rider told', async () => {
      const rider = await createUser(app);
      const created = await book(rider);
      await fake.control('webhooks/pause');
      try {
        clock.advance(16 * 60_000);
        await app.get(AppointmentsService).expireDue();
        // the rider's card went through just as the hold ended (before the app cancelled the intent)
        await browser.paymentIntents.confirm(intentOf(created), { payment_method: 'pm_card_visa' });
        await app.get(PaymentsService).settle(); // cancelling is refused: it succeeded → refund
        await app.get(PaymentsService).settle();
        await app.get(PaymentsService).idle();
      } finally {
        await fake.control('webhooks/resume');
        clock.set(new Date());
      }
      const a = await until(
        rider,
        created.id,
        (x) => x.payment?.refunds[0]?.status === 'succeeded',
        'late refund',
      );
      expect(a.status).toBe('expired');
      expect(a.payment!.refunds[0]).toMatchObject({ kind: 'late-payment', amountMinor: 2000, by: 'system' });
      const mails = await waitForMail(rider.email, 3);
      expect(mails.map((m) => m.subject)).toContain(
        'Refunded: your payment for Fork air spring setup came after the hold ended',
      );
      expect(await paidEvents(created.id)).toBe(0);
    });
  });

  describe('Workshop → Payments', () => {
    let row: WorkshopPaymentRow;
    let rider: TestUser;
    let apptId: string;

    beforeAll(async () => {
      rider = await createUser(app);
      const created = await book(rider, full);
      apptId = created.id;
      await browser.paymentIntents.confirm(intentOf(created), { payment_method: 'pm_card_visa' });
      await as(rider).post(`/api/appointments/${created.id}/payment/sync`).expect(200);
      const list = (await as(owner).get('/api/workshop/payments').expect(200)).body as WorkshopPayments;
      row = list.rows.find((r) => r.appointmentId === created.id)!;
    });

    it('lists payments with totals by day, to the owner only', async () => {
      const list = (await as(owner).get('/api/workshop/payments').expect(200)).body as WorkshopPayments;
      expect(list.currency).toBe('EUR');
      expect(row).toMatchObject({ paidMinor: 12000, status: 'succeeded', rider: { email: rider.email } });
      const sum = list.days.reduce((s, d) => s + d.netMinor, 0);
      expect(list.totals.netMinor).toBe(sum);
      expect(list.totals.paidMinor - list.totals.refundedMinor).toBe(list.totals.netMinor);
      await as(tech).get('/api/workshop/payments').expect(403);
      await as(rider).get('/api/workshop/payments').expect(403);
      await as(otherOwner).get(`/api/workshop/payments/${row.id}`).expect(404);
      await as(owner).get('/api/workshop/payments?from=2027-13-01').expect(400);
    });

    it('an owner refunds part by hand, with who and why; the same form twice refunds once; never more than is left', async () => {
      const requestId = '7b0c7c2e-2f6b-4c55-9a55-2d7d1a0f0001';
      const body = { amountMinor: 2500, reason: 'Seal kit not needed', requestId };
      const [r1, r2] = await Promise.all([
        as(owner).post(`/api/workshop/payments/${row.id}/refunds`, body),
        as(owner).post(`/api/workshop/payments/${row.id}/refunds`, body),
      ]);
      expect([r1.status, r2.status]).toEqual([201, 201]);
      await app.get(PaymentsService).idle();
      const after = (await as(owner).get(`/api/workshop/payments/${row.id}`).expect(200))
        .body as WorkshopPaymentRow;
      expect(after.refunds).toHaveLength(1);
      expect(after.refunds[0]).toMatchObject({
        kind: 'manual',
        amountMinor: 2500,
        reason: 'Seal kit not needed',
        by: 'staff',
        byName: 'Olive Owner',
        status: 'succeeded',
      });
      expect(after).toMatchObject({ refundedMinor: 2500, netMinor: 9500 });
      const state = await fake.state();
      expect(state.refunds.filter((r) => r.payment_intent === row.intentId).map((r) => r.amount)).toEqual([
        2500,
      ]);

      const tooMuch = await as(owner)
        .post(`/api/workshop/payments/${row.id}/refunds`, {
          amountMinor: 9501,
          reason: 'All of it',
          requestId: '7b0c7c2e-2f6b-4c55-9a55-2d7d1a0f0002',
        })
        .expect(400);
      expect(tooMuch.body.fields.amountMinor).toMatch(/€95\.00/);
      await as(tech)
        .post(`/api/workshop/payments/${row.id}/refunds`, {
          ...body,
          requestId: '7b0c7c2e-2f6b-4c55-9a55-2d7d1a0f0003',
        })
        .expect(403);
      await as(otherOwner)
        .post(`/api/workshop/payments/${row.id}/refunds`, {
          ...body,
          requestId: '7b0c7c2e-2f6b-4c55-9a55-2d7d1a0f0004',
        })
        .expect(404);
      await as(owner)
        .post(`/api/workshop/payments/${row.id}/refunds`, { amountMinor: 0, reason: 'x', requestId: 'nope' })
        .expect(400);
      // a reason of spaces is no reason; the same form sent again with another amount is refused
      await as(owner)
        .post(`/api/workshop/payments/${row.id}/refunds`, {
          amountMinor: 100,
          reason: '     ',
          requestId: '7b0c7c2e-2f6b-4c55-9a55-2d7d1a0f0005',
        })
        .expect(400);
      await as(owner)
        .post(`/api/workshop/payments/${row.id}/refunds`, { ...body, amountMinor: 2600 })
        .expect(409);
      // the rider sees it on the receipt
      const a = await mine(rider, apptId);
      expect(a.payment).toMatchObject({ refundedMinor: 2500, netMinor: 9500 });
    });
  });
});
