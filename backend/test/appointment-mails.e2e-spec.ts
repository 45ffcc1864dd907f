import type { INestApplication } from '@nestjs/common';
import ICAL from 'ical.js';
import { DateTime } from 'luxon';
import { simpleParser } from 'mailparser';
import request from 'supertest';
import type { AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { type InboxMessage, waitForMail } from './utils/mail-inbox';
import { createTestApp } from './utils/test-app';

/*
 * The booking mails as a rider and a shop receive them: sent by the real app over SMTP through the
 * outbox to the mail fake, read back raw and parsed with mailparser; the calendar file parsed with
 * ical.js (RFC 5545: METHOD, UID, SEQUENCE, DTSTART with the shop's TZID).
 */

const ZONE = 'America/Denver';
const settings: ShopSettings = {
  timeZone: ZONE,
  currency: 'USD',
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

async function raw(m: InboxMessage): Promise<string> {
  const res = await fetch(`${process.env.MAIL_URL!.replace(/\/+$/, '')}/api/messages/${m.id}/raw`);
  return res.text();
}

describe('booking mails (real SMTP to the mail fake, mailparser and ical.js)', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let owner: TestUser;
  let tech: TestUser;
  let rider: TestUser;
  let slug: string;
  let service: ShopService;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    const shop = await createShop(app, { timeZone: ZONE, currency: 'USD' });
    slug = shop.slug;
    owner = await createUser(app, { role: 'owner', shopId: shop.id });
    tech = await createUser(app, { role: 'technician', shopId: shop.id });
    rider = await createUser(app);
    await request(http).put('/api/workshop/settings').set('Cookie', owner.cookie).send(settings).expect(200);
    service = (
      await request(http)
        .post('/api/workshop/services')
        .set('Cookie', owner.cookie)
        .send({
          name: 'Bench curve check',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 0,
          depositMinor: 0,
        })
        .expect(201)
    ).body;
  });
  afterAll(async () => {
    await app.close();
  });

  it('request received (rider and shop), confirmed with METHOD:REQUEST, cancelled with METHOD:CANCEL', async () => {
    const day = DateTime.now().setZone(ZONE).plus({ weeks: 3 }).toISODate()!;
    const [slot] = (
      await request(http)
        .get(`/api/shops/${slug}/availability`)
        .query({ serviceId: service.id, from: day, to: day })
        .expect(200)
    ).body as AvailableStart[];
    const { id } = (
      await request(http)
        .post('/api/appointments')
        .set('Cookie', rider.cookie)
        .send({ shopSlug: slug, serviceId: service.id, start: slot.start })
        .expect(201)
    ).body as { id: string };

    const wall = DateTime.fromISO(slot.start, { zone: ZONE });
    const [received] = await waitForMail(rider.email);
    expect(received.subject).toBe('Request received: Bench curve check');
    expect(received.text).toContain(`${wall.toFormat('HH:mm')} (${ZONE}`);
    for (const staff of [owner, tech]) {
      const [m] = await waitForMail(staff.email);
      expect(m.subject).toMatch(/^New request: Bench curve check/);
      expect(m.links.some((l) => l.endsWith(`/workshop/appointments/${id}`))).toBe(true);
    }

    await request(http)
      .post(`/api/workshop/appointments/${id}/confirm`)
      .set('Cookie', tech.cookie)
      .expect(200);
    const confirmed = (await waitForMail(rider.email, 2)).find((m) => m.subject.startsWith('Confirmed'))!;
    const parsed = await simpleParser(await raw(confirmed));
    const ics = parsed.attachments.find((a) => a.contentType.startsWith('text/calendar'));
    expect(ics).toBeDefined();
    const cal = new ICAL.Component(ICAL.parse(ics!.content.toString('utf8')));
    for (const tz of cal.getAllSubcomponents('vtimezone')) ICAL.TimezoneService.register(tz);
    expect(cal.getFirstPropertyValue('method')).toBe('REQUEST');
    const event = new ICAL.Event(cal.getFirstSubcomponent('vevent')!);
    expect(event.uid.startsWith(`${id}@`)).toBe(true);
    expect(event.sequence).toBe(0);
    expect(event.startDate.zone?.tzid).toBe(ZONE);
    expect(event.startDate.toJSDate().getTime()).toBe(Date.parse(slot.start));
    expect(event.endDate.toJSDate().getTime()).toBe(Date.parse(slot.end));

    await request(http)
      .post(`/api/appointments/${id}/cancel`)
      .set('Cookie', rider.cookie)
      .send({})
      .expect(200);
    const cancelled = (await waitForMail(rider.email, 3)).find((m) => m.subject.startsWith('Cancelled'))!;
    const cancelIcs = (await simpleParser(await raw(cancelled))).attachments.find((a) =>
      a.contentType.startsWith('text/calendar'),
    )!;
    const cancelCal = new ICAL.Component(ICAL.parse(cancelIcs.content.toString('utf8')));
    expect(cancelCal.getFirstPropertyValue('method')).toBe('CANCEL');
    const cancelEvent = new ICAL.Event(cancelCal.getFirstSubcomponent('vevent')!);
    expect(cancelEvent.uid).toBe(event.uid);
    expect(cancelEvent.sequence).toBe(1); // raised on the change
  });
});
