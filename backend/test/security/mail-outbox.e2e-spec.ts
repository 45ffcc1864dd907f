import type { INestApplication } from '@nestjs/common';
import { DateTime } from 'luxon';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { ManualClock } from '../../src/common/clock/clock';
import { MailOutboxEntry } from '../../src/mail/outbox/mail-outbox.entity';
import { MailRelay } from '../../src/mail/outbox/mail-relay';
import { Shop } from '../../src/shops/shop.entity';
import type { AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { createUser, uniqueEmail, type TestUser } from '../factories/accounts';
import { MailFakeProcess } from '../utils/mail-fake-process';
import { tokenFromLink } from '../utils/mail-inbox';
import { createTestApp } from '../utils/test-app';

/**
 * The mail outbox (issue 8 groundwork) and findings 6 and 11: a reset mail was lost when the mail
 * server was down (finding 11); a re-invite that failed to send revoked the working invitation
 * (finding 6). Every mail is now an outbox row written with its change, and a relay sends it with
 * retries, once, even with two app instances on one database.
 *
 * The two app instances here run on a clock set in the year 2100 and moved by hand, so the rows
 * they write are not yet due for the app process `npm test` runs beside (its relay shares the
 * database) and every retry happens when the test says.
 */
describe('mail outbox: nothing is lost while the mail server is down, nothing is sent twice', () => {
  const clock = new ManualClock(new Date('2100-01-01T00:00:00Z'));
  let mail: MailFakeProcess;
  let a: INestApplication;
  let b: INestApplication;
  let owner: TestUser;
  const RETRY_MS = 60_000;

  beforeAll(async () => {
    mail = await MailFakeProcess.onFreePorts();
    const env = {
      SMTP_PORT: String(mail.smtpPort),
      MAIL_RELAY_INTERVAL_MS: '0',
      MAIL_RETRY_BASE_MS: String(RETRY_MS),
      PASSWORD_RESET_MIN_MS: '0',
    };
    a = await createTestApp(env, { clock });
    b = await createTestApp(env, { clock });
    owner = await createUser(a, { role: 'owner' });
  });
  afterAll(async () => {
    await a.close();
    await b.close();
    await mail.stop();
  });

  const outbox = () => a.get(DataSource).getRepository(MailOutboxEntry);
  /** Waits until the request's own immediate attempt has been made (and failed) for these rows. */
  async function attempted(kind: string, refIds: string[], attempts = 1): Promise<MailOutboxEntry[]> {
    const until = Date.now() + 10_000;
    for (;;) {
      const rows = await outbox()
        .createQueryBuilder('o')
        .where('o.kind = :kind AND o.ref_id IN (:...refIds)', { kind, refIds })
        .getMany();
      if (rows.length === refIds.length && rows.every((r) => r.attempts >= attempts && !r.claimedBy))
        return rows;
      if (Date.now() > until) throw new Error(`outbox rows not attempted: ${JSON.stringify(rows)}`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }
  const invite = (app: INestApplication, email: string) =>
    request(app.getHttpServer())
      .post('/api/workshop/team/invitations')
      .set('Cookie', owner.cookie)
      .send({ email, role: 'technician' });
  const runBoth = async (): Promise<void> => {
    await Promise.all([
      a.get(MailRelay).runOnce(),
      b.get(MailRelay).runOnce(),
      a.get(MailRelay).runOnce(),
      b.get(MailRelay).runOnce(),
    ]);
  };

  it('with the mail fake stopped, resets and an invitation are accepted, wait, and arrive once when it is back', async () => {
    const riders = await Promise.all([1, 2, 3, 4, 5].map(() => createUser(a)));
    for (const [i, r] of riders.entries()) {
      await request((i % 2 ? b : a).getHttpServer())
        .post('/api/auth/password-reset')
        .send({ email: r.email })
        .expect(202);
    }
    const invitee = uniqueEmail('outbox');
    const created = await invite(a, invitee).expect(201);

    // each request tried at once, failed, and left its row waiting (no link in clear text)
    const resets = await attempted(
      'password-reset',
      riders.map((r) => r.id),
    );
    const [inv] = await attempted('invitation', [created.body.id]);
    for (const row of [...resets, inv]) {
      expect(row.sentAt).toBeNull();
      expect(row.failedAt).toBeNull();
      expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
      expect(row.nextAttemptAt.getTime()).toBe(clock.now().getTime() + RETRY_MS);
      expect(row.payload!.toString('latin1')).not.toMatch(/token=|Reset your|Join /);
    }

    await mail.start();
    // not due yet: nothing goes out before the back-off has passed
    await runBoth();
    for (const r of riders) expect(await mail.messagesTo(r.email)).toHaveLength(0);

    clock.advance(RETRY_MS);
    await runBoth(); // two instances, each twice, at the same moment
    await runBoth(); // and again: nothing is left to send
    for (const r of riders) {
      const got = await mail.messagesTo(r.email);
      expect(got).toHaveLength(1);
      expect(got[0].subject).toMatch(/reset/i);
    }
    const invitations = await mail.messagesTo(invitee);
    expect(invitations).toHaveLength(1);
    // the link in the delayed mail works
    const { token } = tokenFromLink(invitations[0], '/join');
    await request(a.getHttpServer()).get(`/api/invitations/${token}`).expect(200);

    const sent = await outbox().findBy({ id: inv.id });
    expect(sent[0].sentAt).not.toBeNull();
    expect(sent[0].payload).toBeNull(); // wiped once sent
  });

  it('finding 6: a re-invite whose mail cannot go out leaves the working invitation working', async () => {
    const email = uniqueEmail('reinvite');
    await mail.start();
    const first = await invite(a, email).expect(201);
    await attempted('invitation', [first.body.id]);
    await a.get(MailRelay).runOnce();
    const [firstMail] = await mail.messagesTo(email);
    const firstToken = tokenFromLink(firstMail, '/join').token;

    await mail.stop();
    const second = await invite(a, email).expect(201);
    await attempted('invitation', [second.body.id]);
    // the first link still works while the second mail waits
    await request(a.getHttpServer()).get(`/api/invitations/${firstToken}`).expect(200);

    await mail.start();
    clock.advance(RETRY_MS);
    await runBoth();
    const mails = await mail.messagesTo(email);
    expect(mails).toHaveLength(1); // this fake process started empty: only the second mail
    const secondToken = tokenFromLink(mails[0], '/join').token;
    // once the newer mail is out, it replaces the older invitation
    await request(a.getHttpServer()).get(`/api/invitations/${secondToken}`).expect(200);
    await request(a.getHttpServer()).get(`/api/invitations/${firstToken}`).expect(404);
  });

  /*
   * Issue 12, fault tests: the mail fake down while riders book. The booking's mails (the rider's
   * "request received" and the shop's new request) wait in the outbox, each failed attempt
   * pushing the next one out by a doubling wait (mail-relay.ts: MAIL_RETRY_BASE_MS, 2×, 4× …;
   * exponential back-off is common practice, no source), and once the fake is back on the same
   * port each mail arrives exactly once, however often the two relays run.
   */
  it('booking mails wait with a doubling back-off while the mail fake is down, then arrive exactly once', async () => {
    await mail.stop();
    const http = a.getHttpServer();
    const settings: ShopSettings = {
      timeZone: 'Europe/Berlin',
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
    await request(http).put('/api/workshop/settings').set('Cookie', owner.cookie).send(settings).expect(200);
    const service = (
      await request(http)
        .post('/api/workshop/services')
        .set('Cookie', owner.cookie)
        .send({
          name: 'Free sag check',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 0,
          depositMinor: 0,
        })
        .expect(201)
    ).body as ShopService;
    const { slug } = await a.get(DataSource).getRepository(Shop).findOneByOrFail({ id: owner.shopId! });
    const day = DateTime.fromJSDate(clock.now()).setZone('Europe/Berlin').plus({ days: 3 }).toISODate()!;
    const slots = (
      await request(http)
        .get(`/api/shops/${slug}/availability`)
        .query({ serviceId: service.id, from: day, to: day })
        .expect(200)
    ).body as AvailableStart[];
    const riders = await Promise.all([1, 2, 3].map(() => createUser(a)));
    const booked: string[] = [];
    for (const [i, r] of riders.entries()) {
      const res = await request(http)
        .post('/api/appointments')
        .set('Cookie', r.cookie)
        .send({ shopSlug: slug, serviceId: service.id, start: slots[i].start })
        .expect(201);
      booked.push(res.body.id);
    }
    // the rider's and the shop's mail per booking, each tried once at once and left waiting
    const rows = async (attempts: number) => {
      const until = Date.now() + 10_000;
      for (;;) {
        const found = await outbox()
          .createQueryBuilder('o')
          .where("o.kind = 'appointment-created' AND o.ref_id IN (:...booked)", { booked })
          .getMany();
        if (found.length === 2 * booked.length && found.every((r) => r.attempts >= attempts && !r.claimedBy))
          return found;
        if (Date.now() > until)
          throw new Error(`booking mails not attempted ${attempts}×: ${JSON.stringify(found)}`);
        await new Promise((r) => setTimeout(r, 50));
      }
    };
    const waits: number[] = [];
    for (let attempt = 1; attempt <= 3; attempt++) {
      const waiting = await rows(attempt);
      for (const row of waiting) {
        expect(row.sentAt).toBeNull();
        expect(row.failedAt).toBeNull();
        expect(row.attempts).toBe(attempt);
        expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
      }
      const next = new Set(waiting.map((r) => r.nextAttemptAt.getTime() - clock.now().getTime()));
      expect(next.size).toBe(1); // all due together
      const [wait] = [...next];
      waits.push(wait);
      // not due a moment before: a run changes nothing
      clock.advance(wait - 1);
      await runBoth();
      expect((await rows(attempt)).every((r) => r.attempts === attempt)).toBe(true);
      clock.advance(1);
      if (attempt < 3) await runBoth(); // due: tried again, fails again
    }
    expect(waits).toEqual([RETRY_MS, 2 * RETRY_MS, 4 * RETRY_MS]);

    // the fake back on the same port: the due rows go out, once, whatever runs at the same moment
    await mail.start();
    await runBoth();
    await runBoth();
    clock.advance(10 * RETRY_MS);
    await runBoth();
    for (const r of riders) {
      const got = await mail.messagesTo(r.email);
      expect(got.map((m) => m.subject)).toEqual(['Request received: Free sag check']);
    }
    const toShop = (await mail.messagesTo(owner.email)).filter((m) =>
      /^New request: Free sag check/.test(m.subject),
    );
    expect(toShop).toHaveLength(booked.length);
    const sent = await rows(4);
    expect(sent.every((r) => r.sentAt !== null && r.payload === null)).toBe(true);
  });

  it('gives up after MAIL_MAX_ATTEMPTS with one error, and wipes the payload', async () => {
    await mail.stop();
    const app = await createTestApp(
      {
        SMTP_PORT: String(mail.smtpPort),
        MAIL_RELAY_INTERVAL_MS: '0',
        MAIL_RETRY_BASE_MS: '1000',
        MAIL_MAX_ATTEMPTS: '2',
        PASSWORD_RESET_MIN_MS: '0',
      },
      { clock },
    );
    try {
      const r = await createUser(app);
      await request(app.getHttpServer())
        .post('/api/auth/password-reset')
        .send({ email: r.email })
        .expect(202);
      await attempted('password-reset', [r.id]);
      clock.advance(1000);
      await app.get(MailRelay).runOnce();
      const [row] = await outbox().findBy({ kind: 'password-reset', refId: r.id });
      expect(row.attempts).toBe(2);
      expect(row.failedAt).not.toBeNull();
      expect(row.payload).toBeNull();
    } finally {
      await app.close();
    }
  });
});
