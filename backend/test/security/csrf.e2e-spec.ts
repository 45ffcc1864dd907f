import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { Invitation } from '../../src/shops/invitation.entity';
import { createUser, uniqueEmail, type TestUser } from '../factories/accounts';
import { createTestApp } from '../utils/test-app';

/**
 * Finding 1: a form on another port of the same host made a signed-in owner's browser create an
 * owner invitation. State-changing routes now take JSON only (415) and refuse requests whose
 * Origin / Sec-Fetch-Site is not the app's own (403).
 */
describe('security 1: cross-site request forgery', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let owner: TestUser;
  const appOrigin = new URL(process.env.APP_URL ?? 'http://127.0.0.1:3000').origin;
  const sameSiteOtherPort = appOrigin.replace(/:\d+$/, ':4444');

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    owner = await createUser(app, { role: 'owner' });
  });
  afterAll(async () => {
    await app.close();
  });

  const invitationsFor = (email: string) => app.get(DataSource).getRepository(Invitation).countBy({ email });

  it('refuses the attack as a browser sends it: a urlencoded form from another port of the host (415)', async () => {
    const email = uniqueEmail('csrf');
    const res = await request(http)
      .post('/api/workshop/team/invitations')
      .set('Cookie', owner.cookie)
      .set('Origin', sameSiteOtherPort)
      .set('Sec-Fetch-Site', 'same-site')
      .type('form')
      .send(`email=${encodeURIComponent(email)}&role=owner`)
      .expect(415);
    expect(res.body).toMatchObject({ statusCode: 415, message: expect.stringMatching(/JSON/) });
    expect(await invitationsFor(email)).toBe(0);
  });

  it.each([
    ['text/plain (a form with enctype=text/plain)', 'text/plain'],
    ['multipart/form-data', 'multipart/form-data; boundary=x'],
    ['urlencoded without Origin', 'application/x-www-form-urlencoded'],
  ])('refuses %s with 415, even from the app itself', async (_what, type) => {
    const email = uniqueEmail('csrf');
    await request(http)
      .post('/api/workshop/team/invitations')
      .set('Cookie', owner.cookie)
      .set('Content-Type', type)
      .send(JSON.stringify({ email, role: 'owner' }))
      .expect(415);
    expect(await invitationsFor(email)).toBe(0);
  });

  it.each([
    ['another port of the same host', { Origin: sameSiteOtherPort }],
    ['another site', { Origin: 'http://attacker.example.test' }],
    ['an opaque origin (sandboxed frame)', { Origin: 'null' }],
    ['Sec-Fetch-Site: same-site', { 'Sec-Fetch-Site': 'same-site' }],
    ['Sec-Fetch-Site: cross-site', { 'Sec-Fetch-Site': 'cross-site' }],
  ])('refuses JSON from %s with 403', async (_what, headers) => {
    const email = uniqueEmail('csrf');
    const res = await request(http)
      .post('/api/workshop/team/invitations')
      .set('Cookie', owner.cookie)
      .set(headers)
      .send({ email, role: 'owner' })
      .expect(403);
    expect(res.body.message).toMatch(/another site/);
    expect(await invitationsFor(email)).toBe(0);
  });

  it('refuses a cross-site sign-out, sign-in and DELETE as well', async () => {
    const headers = { Origin: sameSiteOtherPort, 'Sec-Fetch-Site': 'same-site' };
    await request(http).post('/api/auth/sign-out').set('Cookie', owner.cookie).set(headers).expect(403);
    await request(http).get('/api/auth/me').set('Cookie', owner.cookie).expect(200);
    await request(http)
      .post('/api/auth/sign-in')
      .set(headers)
      .send({ email: owner.email, password: owner.password })
      .expect(403);
    await request(http)
      .delete('/api/bikes/00000000-0000-4000-8000-000000000000')
      .set('Cookie', owner.cookie)
      .set(headers)
      .expect(403);
  });

  it("lets the app's own pages through: JSON from its origin, same-origin fetch metadata", async () => {
    const email = uniqueEmail('own');
    await request(http)
      .post('/api/workshop/team/invitations')
      .set('Cookie', owner.cookie)
      .set('Origin', appOrigin)
      .set('Sec-Fetch-Site', 'same-origin')
      .send({ email, role: 'technician' })
      .expect(201);
    // a body-less POST from the app (sign-out) needs no Content-Type
    await request(http).post('/api/auth/sign-out').set('Origin', appOrigin).expect(204);
  });

  it('lets a request with neither header through (curl, another server: no browser cookie to ride)', async () => {
    await request(http)
      .post('/api/workshop/team/invitations')
      .set('Cookie', owner.cookie)
      .send({ email: uniqueEmail('curl'), role: 'technician' })
      .expect(201);
  });

  it('leaves reading alone: a cross-site GET is answered (it changes nothing)', async () => {
    await request(http)
      .get('/api/auth/me')
      .set('Cookie', owner.cookie)
      .set('Sec-Fetch-Site', 'cross-site')
      .expect(200);
  });
});

describe('security 1: TRUSTED_ORIGINS adds origins (the Vite dev server)', () => {
  it('accepts a configured extra origin and still refuses others', async () => {
    const app = await createTestApp({ TRUSTED_ORIGINS: 'http://127.0.0.1:5173' });
    try {
      const body = { email: 'nobody@example.test', password: 'x' };
      await request(app.getHttpServer())
        .post('/api/auth/sign-in')
        .set('Origin', 'http://127.0.0.1:5173')
        .send(body)
        .expect(401);
      await request(app.getHttpServer())
        .post('/api/auth/sign-in')
        .set('Origin', 'http://127.0.0.1:5174')
        .send(body)
        .expect(403);
    } finally {
      await app.close();
    }
  });
});
