import type { INestApplication } from '@nestjs/common';
import fc from 'fast-check';
import ICAL from 'ical.js';
import { DateTime } from 'luxon';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type { AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { createTestApp } from './utils/test-app';

/*
 * Booking against the real app and MariaDB: settings, availability (in the shop's zone, also on a
 * daylight-saving day), the whole lifecycle and its refusals, and capacity under 50 parallel
 * bookings for one time, run in rounds.
 */

const ZONE = 'Europe/Berlin';
const settings = (over: Partial<ShopSettings> = {}): ShopSettings => ({
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
  ...over,
});

/** A local date some weeks from now, in the shop's zone (so it is bookable whenever the test runs). */
const weeksAhead = (weeks: number, plusDays = 0): string =>
  DateTime.now().setZone(ZONE).plus({ weeks, days: plusDays }).toISODate()!;

describe('booking (real app, real MariaDB)', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let owner: TestUser;
  let tech: TestUser;
  let rider: TestUser;
  let other: TestUser;
  let otherShopTech: TestUser;
  let slug: string;
  let free: ShopService;
  let paid: ShopService;

  const as = (u: TestUser) => ({
    get: (url: string) => request(http).get(url).set('Cookie', u.cookie),
    post: (url: string, body: object = {}) => request(http).post(url).set('Cookie', u.cookie).send(body),
    put: (url: string, body: object) => request(http).put(url).set('Cookie', u.cookie).send(body),
  });
  const slots = async (serviceId: string, from: string, to = from): Promise<AvailableStart[]> =>
    (await request(http).get(`/api/shops/${slug}/availability`).query({ serviceId, from, to }).expect(200))
      .body as AvailableStart[];

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    const shop = await createShop(app, { timeZone: ZONE });
    slug = shop.slug;
    owner = await createUser(app, { role: 'owner', shopId: shop.id });
    tech = await createUser(app, { role: 'technician', shopId: shop.id });
    rider = await createUser(app);
    other = await createUser(app);
    otherShopTech = await createUser(app, { role: 'technician' });
    await as(owner).put('/api/workshop/settings', settings()).expect(200);
    free = (
      await as(owner)
        .post('/api/workshop/services', {
          name: 'Free check',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 0,
          depositMinor: 0,
        })
        .expect(201)
    ).body;
    paid = (
      await as(owner)
        .post('/api/workshop/services', {
          name: 'Air spring setup — fork',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 6900,
          depositMinor: 2000,
        })
        .expect(201)
    ).body;
  });
  afterAll(async () => {
    await app.close();
  });

  describe('settings', () => {
    it('are validated: an IANA zone, intervals on the grid that do not overlap, closures in order', async () => {
      const bad = settings({
        timeZone: 'Mars/Olympus',
        hours: [
          { weekday: 1, start: '09:00', end: '12:00' },
          { weekday: 1, start: '11:00', end: '13:00' },
          { weekday: 2, start: '09:07', end: '12:00' },
        ],
        closures: [{ from: '2027-05-02', to: '2027-05-01', reason: 'x' }],
      });
      const res = await as(owner).put('/api/workshop/settings', bad).expect(400);
      expect(Object.keys(res.body.fields).sort()).toEqual([
        'closures.0.to',
        'hours.1',
        'hours.2',
        'timeZone',
      ]);
    });

    it('only the owner changes them; a technician reads them; a rider is refused', async () => {
      await as(tech).put('/api/workshop/settings', settings()).expect(403);
      expect((await as(tech).get('/api/workshop/settings').expect(200)).body.timeZone).toBe(ZONE);
      await as(rider).get('/api/workshop/settings').expect(403);
    });

    it('a deposit above the price is refused', async () => {
      const res = await as(owner)
        .post('/api/workshop/services', {
          name: 'x',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 100,
          depositMinor: 200,
        })
        .expect(400);
      expect(res.body.fields).toHaveProperty('depositMinor');
    });
  });

  describe('public pages', () => {
    it('list the shop and its active services with the rules riders need', async () => {
      const list = (await request(http).get('/api/shops').expect(200)).body as { slug: string }[];
      expect(list.some((s) => s.slug === slug)).toBe(true);
      const detail = (await request(http).get(`/api/shops/${slug}`).expect(200)).body;
      expect(detail.timeZone).toBe(ZONE);
      expect(detail.services.map((s: ShopService) => s.name)).toEqual(
        expect.arrayContaining(['Free check', 'Air spring setup — fork']),
      );
      expect(detail.cancellationWindowHours).toBe(48);
    });

    it('availability across the EU spring change: 09:00 wall clock, +01:00 before, +02:00 after (IANA data via Intl)', async () => {
      const day = '2027-03-28'; // last Sunday of March 2027 (Directive 2000/84/EC)
      const got = await slots(free.id, '2027-03-27', day);
      const byDay = (d: string) => got.filter((s) => s.start.startsWith(d));
      expect(byDay('2027-03-27')[0].start).toBe('2027-03-27T09:00:00+01:00');
      expect(byDay(day)[0].start).toBe('2027-03-28T09:00:00+02:00');
      const wall = new Intl.DateTimeFormat('en-GB', { timeZone: ZONE, hour: '2-digit', minute: '2-digit' });
      for (const s of got) expect(wall.format(new Date(s.start))).toMatch(/^(09|1[0-6]):00$/);
      expect(byDay(day)).toHaveLength(8);
    });

    it('refuses a bad query with 400 and an unknown service with 404', async () => {
      await request(http)
        .get(`/api/shops/${slug}/availability`)
        .query({ serviceId: free.id, from: 'soon', to: '2027-01-01' })
        .expect(400);
      await request(http)
        .get(`/api/shops/${slug}/availability`)
        .query({ serviceId: '00000000-0000-4000-8000-000000000000', from: weeksAhead(3), to: weeksAhead(3) })
        .expect(404);
    });
  });

  describe('the lifecycle', () => {
    it('a free service is requested at once; staff confirm; a second confirm is 409; the rider cancels and the time is free again', async () => {
      const day = weeksAhead(3);
      const [first] = await slots(free.id, day);
      const created = await as(rider)
        .post('/api/appointments', { shopSlug: slug, serviceId: free.id, start: first.start })
        .expect(201);
      expect(created.body).toEqual({ id: expect.any(String), status: 'requested' });
      const id = created.body.id as string;
      expect((await slots(free.id, day)).map((s) => s.start)).not.toContain(first.start);
      // the same rider cannot hold two appointments at once (even where a second bench is free)
      const twice = await as(rider)
        .post('/api/appointments', { shopSlug: slug, serviceId: paid.id, start: first.start })
        .expect(409);
      expect(twice.body.message).toMatch(/already have an appointment/);

      await as(other).get(`/api/appointments/${id}`).expect(404);
      await as(otherShopTech).post(`/api/workshop/appointments/${id}/confirm`).expect(404);
      await as(rider).post(`/api/workshop/appointments/${id}/confirm`).expect(403);
      const confirmed = await as(tech).post(`/api/workshop/appointments/${id}/confirm`).expect(200);
      expect(confirmed.body.status).toBe('confirmed');
      await as(tech).post(`/api/workshop/appointments/${id}/confirm`).expect(409);
      await as(tech).post(`/api/workshop/appointments/${id}/complete`).expect(409); // not started yet

      const mine = (await as(rider).get('/api/appointments').expect(200)).body;
      expect(mine.find((a: { id: string }) => a.id === id)).toMatchObject({
        status: 'confirmed',
        canCancel: true,
        canMove: true,
      });
      const cancelled = await as(rider)
        .post(`/api/appointments/${id}/cancel`, { reason: 'Trip moved' })
        .expect(200);
      expect(cancelled.body).toMatchObject({
        status: 'cancelled',
        cancelReason: 'Trip moved',
        canCancel: false,
      });
      expect((await slots(free.id, day)).map((s) => s.start)).toContain(first.start);
      await as(rider).post(`/api/appointments/${id}/cancel`).expect(409);
    });

    it('a paid service is held while the rider pays, with its expiry', async () => {
      const day = weeksAhead(3, 1);
      const [first] = await slots(paid.id, day);
      const res = await as(rider)
        .post('/api/appointments', { shopSlug: slug, serviceId: paid.id, start: first.start })
        .expect(201);
      expect(res.body.status).toBe('held');
      const expires = Date.parse(res.body.holdExpiresAt);
      expect(expires - Date.now()).toBeGreaterThan(14 * 60_000);
      expect(expires - Date.now()).toBeLessThanOrEqual(15 * 60_000);
      expect((await slots(paid.id, day)).map((s) => s.start)).not.toContain(first.start);
      await as(tech).post(`/api/workshop/appointments/${res.body.id}/confirm`).expect(409); // not paid yet
    });

    it('decline needs a reason; propose, accept (moved and confirmed); move; the Workshop list filters and searches', async () => {
      const day = weeksAhead(4);
      const [a, b, c] = await slots(free.id, day);
      const id = (
        await as(rider)
          .post('/api/appointments', { shopSlug: slug, serviceId: free.id, start: a.start })
          .expect(201)
      ).body.id;
      await as(tech).post(`/api/workshop/appointments/${id}/decline`, {}).expect(400);
      const proposed = await as(tech)
        .post(`/api/workshop/appointments/${id}/propose`, { start: b.start })
        .expect(200);
      expect(proposed.body.proposedStart).toBe(b.start);
      const accepted = await as(rider).post(`/api/appointments/${id}/accept-proposal`).expect(200);
      expect(accepted.body).toMatchObject({ status: 'confirmed', start: b.start, proposedStart: null });
      const moved = await as(rider).post(`/api/appointments/${id}/move`, { start: c.start }).expect(200);
      expect(moved.body).toMatchObject({ status: 'requested', start: c.start });
      const list = (
        await as(tech).get(`/api/workshop/appointments?status=requested&from=${day}&to=${day}`).expect(200)
      ).body;
      expect(list.map((x: { id: string }) => x.id)).toContain(id);
      expect(list[0].rider.email).toBeDefined();
      const none = (
        await as(tech)
          .get(`/api/workshop/appointments?q=${encodeURIComponent('nobody-by-this-name')}`)
          .expect(200)
      ).body;
      expect(none).toEqual([]);
      const declined = await as(tech)
        .post(`/api/workshop/appointments/${id}/decline`, { reason: 'Bench out of order' })
        .expect(200);
      expect(declined.body).toMatchObject({ status: 'declined', declineReason: 'Bench out of order' });
      const one = (await as(tech).get(`/api/workshop/appointments/${id}`).expect(200)).body;
      expect(one.history.map((h: { event: string; by: string }) => `${h.event}:${h.by}`)).toEqual([
        'created:rider',
        'propose:staff',
        'accept-proposal:rider',
        'move:rider',
        'decline:staff',
      ]);
      expect(one.history[1].start).toBe(b.start);
      expect(one.history[4]).toMatchObject({ reason: 'Bench out of order', byName: expect.any(String) });
      expect((await as(otherShopTech).get('/api/workshop/appointments').expect(200)).body).toEqual([]);
    });

    it('refuses a time the shop does not offer and a bike or sheet that is not the rider’s', async () => {
      const day = weeksAhead(5);
      const odd = DateTime.fromISO(`${day}T09:30`, { zone: ZONE }).toISO()!;
      await as(rider)
        .post('/api/appointments', { shopSlug: slug, serviceId: free.id, start: odd })
        .expect(409);
      const night = DateTime.fromISO(`${day}T20:00`, { zone: ZONE }).toISO()!;
      await as(rider)
        .post('/api/appointments', { shopSlug: slug, serviceId: free.id, start: night })
        .expect(409);
      const [s] = await slots(free.id, day);
      const res = await as(rider)
        .post('/api/appointments', {
          shopSlug: slug,
          serviceId: free.id,
          start: s.start,
          bikeId: '00000000-0000-4000-8000-000000000000',
        })
        .expect(400);
      expect(res.body.fields).toHaveProperty('bikeId');
      await as(tech)
        .post('/api/appointments', { shopSlug: slug, serviceId: free.id, start: s.start })
        .expect(403);
    });

    it('never answers 500 to fuzzed booking bodies, and writes nothing for a refused one (fast-check)', async () => {
      const ds = app.get(DataSource);
      const count = async () =>
        Number(
          (await ds.query('SELECT COUNT(*) AS n FROM appointments WHERE rider_id = ?', [other.id]))[0].n,
        );
      const before = await count();
      await fc.assert(
        fc.asyncProperty(
          fc.record(
            {
              shopSlug: fc.oneof(fc.constant(slug), fc.string()),
              serviceId: fc.oneof(fc.constant(free.id), fc.uuid(), fc.string()),
              start: fc.oneof(
                fc.string(),
                fc.date({ noInvalidDate: true }).map((d) => d.toISOString()),
                fc.constant('2027-13-40T99:99+25:00'),
              ),
              bikeId: fc.oneof(fc.uuid(), fc.string(), fc.integer()),
              notes: fc.oneof(fc.string({ maxLength: 3000 }), fc.integer()),
              extra: fc.anything(),
            },
            { requiredKeys: [] },
          ),
          async (body) => {
            const res = await as(other).post('/api/appointments', body);
            expect(res.status).toBeLessThan(500);
            expect(res.status).not.toBe(201);
          },
        ),
        { numRuns: 150 },
      );
      expect(await count()).toBe(before);
    });
  });

  describe('the private calendar feed', () => {
    it('the owner makes a secret URL; it serves the schedule as ICS; renewing ends the old one', async () => {
      const [s] = await slots(free.id, weeksAhead(8));
      await as(rider)
        .post('/api/appointments', { shopSlug: slug, serviceId: free.id, start: s.start })
        .expect(201);
      await as(tech).post('/api/workshop/calendar-feed').expect(403);
      const first = (await as(owner).post('/api/workshop/calendar-feed').expect(200)).body.url as string;
      const path = new URL(first).pathname;
      const res = await request(http).get(path).expect(200);
      expect(res.headers['content-type']).toMatch(/^text\/calendar/);
      expect(res.headers['cache-control']).toContain('no-store');
      const comp = new ICAL.Component(ICAL.parse(res.text));
      expect(comp.getFirstSubcomponent('vtimezone')!.getFirstPropertyValue('tzid')).toBe(ZONE);
      expect(comp.getAllSubcomponents('vevent').length).toBeGreaterThan(0);
      const second = (await as(owner).post('/api/workshop/calendar-feed').expect(200)).body.url as string;
      await request(http).get(path).expect(404);
      await request(http).get(new URL(second).pathname).expect(200);
      await request(http)
        .get(path.replace(/[^/]+\.ics$/, 'x.ics'))
        .expect(404);
    });
  });

  describe('capacity under concurrency', () => {
    let riders: TestUser[];
    beforeAll(async () => {
      riders = await Promise.all(Array.from({ length: 50 }, () => createUser(app)));
    });

    const race = async (start: string): Promise<number[]> =>
      Promise.all(
        riders.map(
          async (r) =>
            (await as(r).post('/api/appointments', { shopSlug: slug, serviceId: free.id, start })).status,
        ),
      );

    it('50 parallel bookings for one time with one bench free: one 201 and 49 × 409, ten rounds', async () => {
      const day = weeksAhead(6);
      const starts = (await slots(free.id, day)).slice(0, 5);
      const day2 = (await slots(free.id, weeksAhead(6, 1))).slice(0, 5);
      const ds = app.get(DataSource);
      for (const s of [...starts, ...day2]) {
        const statuses = await race(s.start);
        expect(statuses.filter((x) => x === 201)).toHaveLength(1);
        expect(statuses.filter((x) => x === 409)).toHaveLength(49);
        const live = await ds.query(
          "SELECT COUNT(*) AS n FROM appointments WHERE shop_id = (SELECT id FROM shops WHERE slug = ?) AND start_at = ? AND status IN ('held','requested','confirmed')",
          [slug, new Date(s.start)],
        );
        expect(Number(live[0].n)).toBe(1);
      }
    });

    it('with two benches: exactly two', async () => {
      await as(owner)
        .put('/api/workshop/settings', settings({ benches: 2 }))
        .expect(200);
      try {
        for (const s of (await slots(free.id, weeksAhead(7))).slice(0, 3)) {
          const statuses = await race(s.start);
          expect(statuses.filter((x) => x === 201)).toHaveLength(2);
          expect(statuses.filter((x) => x === 409)).toHaveLength(48);
        }
      } finally {
        await as(owner).put('/api/workshop/settings', settings()).expect(200);
      }
    });
  });
});
