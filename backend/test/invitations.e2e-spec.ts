import { createServer } from 'node:net';
import type { AddressInfo } from 'node:net';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { MailOutboxEntry } from '../src/mail/outbox/mail-outbox.entity';
import { Invitation } from '../src/shops/invitation.entity';
import { createShop, createUser, uniqueEmail, type TestUser } from './factories/accounts';
import { sessionCookie } from './utils/cookies';
import { tokenFromLink, waitForMail } from './utils/mail-inbox';
import { createTestApp } from './utils/test-app';

describe('Workshop team and invitations', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let owner: TestUser;
  let tech: TestUser;
  let rider: TestUser;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    const shop = await createShop(app, { name: 'Testwick Suspension Bench' });
    owner = await createUser(app, { role: 'owner', shopId: shop.id, name: 'Olive Owner' });
    tech = await createUser(app, { role: 'technician', shopId: shop.id });
    rider = await createUser(app);
  });
  afterAll(async () => {
    await app.close();
  });

  const invite = (u: TestUser | null, body: object) => {
    const req = request(http).post('/api/workshop/team/invitations').send(body);
    return u ? req.set('Cookie', u.cookie) : req;
  };

  it('end to end: the owner invites, the mail carries /join?token=…, the invitee joins signed in as staff', async () => {
    const email = uniqueEmail('newtech');
    const created = await invite(owner, { email: email.toUpperCase(), role: 'technician' }).expect(201);
    expect(created.body).toEqual({
      id: expect.any(String),
      email,
      role: 'technician',
      createdAt: expect.any(String),
      expiresAt: expect.any(String),
      invitedByName: 'Olive Owner',
    });
    // INVITATION_TTL_HOURS defaults to 168 (7 days)
    const ttlMs = Date.parse(created.body.expiresAt) - Date.parse(created.body.createdAt);
    expect(ttlMs / 3_600_000).toBeCloseTo(168, 1);

    const [mail] = await waitForMail(email);
    expect(mail.subject).toContain('Testwick Suspension Bench');
    const { link, token } = tokenFromLink(mail, '/join');
    expect(link.startsWith(`${process.env.APP_URL}/join?token=`)).toBe(true);
    expect(mail.text).toContain(link);
    expect(mail.html).toContain(link);

    const lookup = await request(http).get(`/api/invitations/${token}`).expect(200);
    expect(lookup.body).toEqual({ shopName: 'Testwick Suspension Bench', email, role: 'technician' });

    const team0 = await request(http).get('/api/workshop/team').set('Cookie', owner.cookie).expect(200);
    expect(team0.body.invitations.map((i: { email: string }) => i.email)).toContain(email);

    const accepted = await request(http)
      .post('/api/invitations/accept')
      .send({ token, name: 'Nova Tech', password: 'a-long-enough-secret' })
      .expect(201);
    expect(accepted.body).toEqual({
      user: { id: expect.any(String), email, name: 'Nova Tech', role: 'technician', shopId: owner.shopId },
    });
    const cookie = sessionCookie(accepted)!;
    const team = await request(http).get('/api/workshop/team').set('Cookie', cookie.pair).expect(200);
    expect(team.body.shop).toMatchObject({ id: owner.shopId, name: 'Testwick Suspension Bench' });
    expect(team.body.members).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ email, role: 'technician', name: 'Nova Tech' }),
        expect.objectContaining({ email: owner.email, role: 'owner' }),
      ]),
    );
    expect(team.body.invitations.map((i: { email: string }) => i.email)).not.toContain(email);

    // the link works once
    await request(http).get(`/api/invitations/${token}`).expect(404);
    await request(http)
      .post('/api/invitations/accept')
      .send({ token, name: 'Again', password: 'a-long-enough-secret' })
      .expect(404);
    // and the new account signs in with its password
    await request(http)
      .post('/api/auth/sign-in')
      .send({ email, password: 'a-long-enough-secret' })
      .expect(200);
  });

  it('an owner may invite another owner', async () => {
    const email = uniqueEmail('coowner');
    await invite(owner, { email, role: 'owner' }).expect(201);
    const { token } = tokenFromLink((await waitForMail(email))[0], '/join');
    const res = await request(http)
      .post('/api/invitations/accept')
      .send({ token, name: 'Co Owner', password: 'a-long-enough-secret' })
      .expect(201);
    expect(res.body.user.role).toBe('owner');
  });

  it('a newer invitation to the same address replaces the older one', async () => {
    const email = uniqueEmail('twice');
    await invite(owner, { email, role: 'technician' }).expect(201);
    await invite(owner, { email, role: 'owner' }).expect(201);
    const [newer, older] = await waitForMail(email, 2);
    // the older one ends when the newer mail has gone out (the relay marks it sent a moment after)
    const olderToken = tokenFromLink(older, '/join').token;
    for (let i = 0; i < 50; i++) {
      if ((await request(http).get(`/api/invitations/${olderToken}`)).status === 404) break;
      await new Promise((r) => setTimeout(r, 50));
    }
    await request(http).get(`/api/invitations/${olderToken}`).expect(404);
    const ok = await request(http)
      .get(`/api/invitations/${tokenFromLink(newer, '/join').token}`)
      .expect(200);
    expect(ok.body.role).toBe('owner');
  });

  it('refuses an expired invitation (404)', async () => {
    const email = uniqueEmail('late');
    await invite(owner, { email, role: 'technician' }).expect(201);
    const { token } = tokenFromLink((await waitForMail(email))[0], '/join');
    await app
      .get(DataSource)
      .getRepository(Invitation)
      .update({ email }, { expiresAt: new Date(Date.now() - 1000) });
    await request(http).get(`/api/invitations/${token}`).expect(404);
    await request(http)
      .post('/api/invitations/accept')
      .send({ token, name: 'Late', password: 'a-long-enough-secret' })
      .expect(404);
  });

  it('answers 409 when the address already has an account', async () => {
    await invite(owner, { email: rider.email, role: 'technician' }).expect(409);
  });

  it('answers 401 signed out, 403 for a technician or a rider', async () => {
    const body = { email: uniqueEmail('x'), role: 'technician' };
    await invite(null, body).expect(401);
    const asTech = await invite(tech, body).expect(403);
    expect(asTech.body).toMatchObject({ statusCode: 403, error: 'Forbidden' });
    await invite(rider, body).expect(403);
  });

  it.each([
    ['no e-mail', { role: 'technician' }, 'email'],
    ['a malformed e-mail', { email: 'x@', role: 'technician' }, 'email'],
    ['the rider role', { email: 'r@example.test', role: 'rider' }, 'role'],
    ['an unknown field', { email: 'r@example.test', role: 'owner', shopId: 'x' }, 'shopId'],
  ])('answers 400 for %s', async (_what, body, field) => {
    const res = await invite(owner, body).expect(400);
    expect(res.body.fields).toHaveProperty(field);
  });

  describe('GET /api/workshop/team', () => {
    it('lists the shop for any of its staff (technician: 200)', async () => {
      const res = await request(http).get('/api/workshop/team').set('Cookie', tech.cookie).expect(200);
      expect(res.body.shop.id).toBe(tech.shopId);
      expect(res.body.members.map((m: { id: string }) => m.id)).toEqual(
        expect.arrayContaining([owner.id, tech.id]),
      );
    });

    it('shows nothing of another shop', async () => {
      const other = await createUser(app, { role: 'owner' });
      const res = await request(http).get('/api/workshop/team').set('Cookie', other.cookie).expect(200);
      expect(res.body.members.map((m: { id: string }) => m.id)).toEqual([other.id]);
      expect(res.body.invitations).toEqual([]);
    });

    it('answers 401 signed out and 403 for a rider', async () => {
      await request(http).get('/api/workshop/team').expect(401);
      const res = await request(http).get('/api/workshop/team').set('Cookie', rider.cookie).expect(403);
      expect(res.body.message).toMatch(/staff/i);
    });
  });

  describe('POST /api/invitations/accept', () => {
    it.each([
      ['a malformed token', { token: 'short', name: 'N', password: 'a-long-enough-secret' }, 'token'],
      ['a short password', { token: 'A'.repeat(43), name: 'N', password: 'short' }, 'password'],
      ['no name', { token: 'A'.repeat(43), password: 'a-long-enough-secret' }, 'name'],
    ])('answers 400 for %s', async (_what, body, field) => {
      const res = await request(http).post('/api/invitations/accept').send(body).expect(400);
      expect(res.body.fields).toHaveProperty(field);
    });

    it('answers 404 for an unknown token', async () => {
      await request(http)
        .post('/api/invitations/accept')
        .send({ token: 'A'.repeat(43), name: 'N', password: 'a-long-enough-secret' })
        .expect(404);
      await request(http).get('/api/invitations/not-a-token').expect(404);
    });
  });

  describe('with the mail server down', () => {
    /** A port nothing listens on (bound, read, closed). */
    const closedPort = () =>
      new Promise<number>((resolve) => {
        const srv = createServer().listen(0, '127.0.0.1', () => {
          const { port } = srv.address() as AddressInfo;
          srv.close(() => resolve(port));
        });
      });

    it('accepts the invitation (201) and keeps it with its mail waiting in the outbox; a reset answers 202', async () => {
      const down = await createTestApp({
        SMTP_PORT: String(await closedPort()),
        MAIL_RELAY_INTERVAL_MS: '0',
      });
      try {
        const email = uniqueEmail('nomail');
        const res = await request(down.getHttpServer())
          .post('/api/workshop/team/invitations')
          .set('Cookie', owner.cookie)
          .send({ email, role: 'technician' })
          .expect(201);
        expect(res.body.email).toBe(email);
        const db = down.get(DataSource);
        expect(await db.getRepository(Invitation).countBy({ email })).toBe(1);
        expect(
          await db.getRepository(MailOutboxEntry).countBy({ kind: 'invitation', refId: res.body.id }),
        ).toBe(1);
        await request(down.getHttpServer())
          .post('/api/auth/password-reset')
          .send({ email: rider.email })
          .expect(202);
      } finally {
        await down.close();
      }
    });
  });
});
