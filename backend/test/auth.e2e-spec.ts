import type { INestApplication } from '@nestjs/common';
import type { Application } from 'express';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { SESSION_COOKIE } from '@loamline/shared-types';
import { User } from '../src/users/user.entity';
import { createUser, uniqueEmail } from './factories/accounts';
import { sessionCookie, setCookies } from './utils/cookies';
import { createTestApp } from './utils/test-app';

describe('auth: register, sign in, sign out, me', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  describe('POST /api/auth/register', () => {
    it('creates a rider, answers 201 {user} and signs them in with an httpOnly, SameSite=Lax cookie', async () => {
      const email = uniqueEmail('Register');
      const res = await request(http)
        .post('/api/auth/register')
        .send({ email: `  ${email.toUpperCase()} `, password: 'a-long-enough-secret', name: ' Sam ' })
        .expect(201);
      expect(res.body).toEqual({
        user: {
          id: expect.any(String),
          email: email.toLowerCase(),
          name: 'Sam',
          role: 'rider',
          shopId: null,
        },
      });
      const cookie = sessionCookie(res);
      expect(cookie).toBeDefined();
      expect(cookie!.flags).toEqual(expect.arrayContaining(['HttpOnly', 'SameSite=Lax', 'Path=/']));
      expect(cookie!.flags).not.toContain('Secure'); // plain http here
      const me = await request(http).get('/api/auth/me').set('Cookie', cookie!.pair).expect(200);
      expect(me.body).toEqual(res.body.user);
      // stored lower-cased, so the same address in other letters is the same account
      await request(http)
        .post('/api/auth/register')
        .send({ email: email.toLowerCase(), password: 'another-long-secret', name: 'Other' })
        .expect(409);
    });

    it.each([
      ['no e-mail', { password: 'a-long-enough-secret', name: 'Sam' }, 'email'],
      [
        'a malformed e-mail',
        { email: 'not-an-address', password: 'a-long-enough-secret', name: 'Sam' },
        'email',
      ],
      ['a short password', { email: 'short@example.test', password: 'short', name: 'Sam' }, 'password'],
      [
        'an empty name',
        { email: 'noname@example.test', password: 'a-long-enough-secret', name: '   ' },
        'name',
      ],
      ['a numeric password', { email: 'num@example.test', password: 12345678901, name: 'Sam' }, 'password'],
    ])('answers 400 for %s, naming the field', async (_what, body, field) => {
      const res = await request(http).post('/api/auth/register').send(body).expect(400);
      expect(res.body).toMatchObject({ statusCode: 400, error: 'Bad Request' });
      expect(res.body.fields).toHaveProperty(field);
      expect(res.headers['set-cookie']).toBeUndefined();
    });

    it('answers 400 for unknown fields (a rider cannot make themselves an owner)', async () => {
      const res = await request(http)
        .post('/api/auth/register')
        .send({ email: uniqueEmail(), password: 'a-long-enough-secret', name: 'Sam', role: 'owner' })
        .expect(400);
      expect(res.body.fields).toHaveProperty('role');
    });

    it('sets the cookie Secure when the request came over https (behind a trusted proxy)', async () => {
      (app.getHttpAdapter().getInstance() as Application).set('trust proxy', 'loopback');
      try {
        const res = await request(http)
          .post('/api/auth/register')
          .set('X-Forwarded-Proto', 'https')
          .send({ email: uniqueEmail('secure'), password: 'a-long-enough-secret', name: 'Sam' })
          .expect(201);
        expect(sessionCookie(res)!.flags).toContain('Secure');
      } finally {
        (app.getHttpAdapter().getInstance() as Application).set('trust proxy', false);
      }
    });
  });

  describe('POST /api/auth/sign-in', () => {
    it('answers 200 {user, accessToken} and a cookie; the token works as Bearer too', async () => {
      const u = await createUser(app);
      const res = await request(http)
        .post('/api/auth/sign-in')
        .send({ email: u.email.toUpperCase(), password: u.password })
        .expect(200);
      expect(res.body).toEqual({
        user: { id: u.id, email: u.email, name: u.name, role: 'rider', shopId: null },
        accessToken: expect.stringMatching(/^[\w-]+\.[\w-]+\.[\w-]+$/),
      });
      expect(sessionCookie(res)!.value).toBe(res.body.accessToken);
      const me = await request(http)
        .get('/api/auth/me')
        .set('Authorization', `Bearer ${res.body.accessToken}`)
        .expect(200);
      expect(me.body.id).toBe(u.id);
    });

    it('answers 401 with one message for a wrong password and for an unknown address', async () => {
      const u = await createUser(app);
      const wrong = await request(http)
        .post('/api/auth/sign-in')
        .send({ email: u.email, password: 'not-the-password' })
        .expect(401);
      const unknown = await request(http)
        .post('/api/auth/sign-in')
        .send({ email: uniqueEmail('nobody'), password: 'not-the-password' })
        .expect(401);
      expect(wrong.body).toEqual(unknown.body);
      expect(wrong.body).toMatchObject({ statusCode: 401, error: 'Unauthorized' });
      expect(wrong.headers['set-cookie']).toBeUndefined();
    });

    it.each([
      ['no password', { email: 'a@example.test' }],
      ['a malformed e-mail', { email: 'a@', password: 'x' }],
      ['an unknown field', { email: 'a@example.test', password: 'x', remember: true }],
    ])('answers 400 for %s', async (_what, body) => {
      await request(http).post('/api/auth/sign-in').send(body).expect(400);
    });
  });

  describe('GET /api/auth/me', () => {
    it('answers 401 signed out, and for a garbage cookie or header', async () => {
      const res = await request(http).get('/api/auth/me').expect(401);
      expect(res.body).toMatchObject({ statusCode: 401, error: 'Unauthorized' });
      await request(http).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=garbage`).expect(401);
      await request(http).get('/api/auth/me').set('Authorization', 'Bearer garbage').expect(401);
    });

    it('answers {id,email,name,role,shopId} for staff, with their shop', async () => {
      const owner = await createUser(app, { role: 'owner' });
      const res = await request(http).get('/api/auth/me').set('Cookie', owner.cookie).expect(200);
      expect(res.body).toEqual({
        id: owner.id,
        email: owner.email,
        name: owner.name,
        role: 'owner',
        shopId: owner.shopId,
      });
    });

    it('loads the user on every request: a deleted user is signed out at once (401)', async () => {
      const u = await createUser(app);
      await request(http).get('/api/auth/me').set('Cookie', u.cookie).expect(200);
      await app.get(DataSource).getRepository(User).delete({ id: u.id });
      await request(http).get('/api/auth/me').set('Cookie', u.cookie).expect(401);
    });
  });

  describe('POST /api/auth/sign-out', () => {
    it('answers 204 and clears the cookie with the same flags', async () => {
      const u = await createUser(app);
      const res = await request(http).post('/api/auth/sign-out').set('Cookie', u.cookie).expect(204);
      const cleared = setCookies(res).find((c) => c.name === SESSION_COOKIE);
      expect(cleared).toBeDefined();
      expect(cleared!.value).toBe('');
      expect(cleared!.flags).toEqual(expect.arrayContaining(['HttpOnly', 'SameSite=Lax', 'Path=/']));
      expect(cleared!.flags.some((f) => /^Expires=Thu, 01 Jan 1970/.test(f))).toBe(true);
    });

    it('works signed out too (204)', async () => {
      await request(http).post('/api/auth/sign-out').expect(204);
    });
  });

  it('describes every auth route in the OpenAPI document, with cookie and bearer security on /me', async () => {
    const res = await request(http).get('/api/docs-json').expect(200);
    const paths = res.body.paths as Record<string, Record<string, { security?: unknown[] }>>;
    for (const p of [
      '/api/auth/register',
      '/api/auth/sign-in',
      '/api/auth/sign-out',
      '/api/auth/password-reset',
      '/api/auth/password-reset/confirm',
    ]) {
      expect(paths[p]?.post).toBeDefined();
    }
    expect(paths['/api/auth/me'].get.security).toEqual(
      expect.arrayContaining([{ cookie: [] }, { bearer: [] }]),
    );
  });
});
