import type { INestApplication } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import request from 'supertest';
import { SESSION_COOKIE } from '@loamline/shared-types';
import { createUser } from '../factories/accounts';
import { sessionCookie } from '../utils/cookies';
import { createTestApp } from '../utils/test-app';

/**
 * Finding 5: signing out did not end the session — the old token still answered 200 and was even
 * renewed. Sign-out now revokes the session on the server; "sign out everywhere" ends them all.
 */
describe('security 5: sign-out ends the session on the server', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  const me = (token: string) => request(http).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${token}`);
  const signIn = async (email: string, password: string): Promise<string> => {
    const res = await request(http).post('/api/auth/sign-in').send({ email, password }).expect(200);
    return sessionCookie(res)!.value;
  };

  it('a token kept from before sign-out answers 401, as cookie and as Bearer', async () => {
    const u = await createUser(app);
    const token = await signIn(u.email, u.password);
    await me(token).expect(200);
    await request(http).post('/api/auth/sign-out').set('Cookie', `${SESSION_COOKIE}=${token}`).expect(204);
    await me(token).expect(401);
    await request(http).get('/api/auth/me').set('Authorization', `Bearer ${token}`).expect(401);
    // the other session of the same user (another browser) goes on
    await me(u.token).expect(200);
  });

  it('a Bearer client signs out the same way', async () => {
    const u = await createUser(app);
    await request(http).post('/api/auth/sign-out').set('Authorization', `Bearer ${u.token}`).expect(204);
    await me(u.token).expect(401);
  });

  it('a signed-out token past half its life is not renewed (401, no cookie)', async () => {
    const u = await createUser(app);
    const now = Math.floor(Date.now() / 1000);
    const ttl = 30 * 60;
    const old = new JwtService({ secret: process.env.JWT_SECRET }).sign(
      { sub: u.id, sid: u.sessionId, tv: 0, iat: now - ttl * 0.6, exp: now + ttl * 0.4 },
      { algorithm: 'HS256' },
    );
    // before sign-out it would be renewed …
    expect(sessionCookie(await me(old).expect(200))).toBeDefined();
    await request(http).post('/api/auth/sign-out').set('Cookie', `${SESSION_COOKIE}=${old}`).expect(204);
    // … after, it is refused and nothing new is handed out
    const res = await me(old).expect(401);
    expect(sessionCookie(res)).toBeUndefined();
  });

  it('"sign out everywhere" ends every session of the user, and only theirs', async () => {
    const u = await createUser(app);
    const other = await createUser(app);
    const phone = await signIn(u.email, u.password);
    const laptop = await signIn(u.email, u.password);
    await request(http)
      .post('/api/auth/sign-out-everywhere')
      .set('Cookie', `${SESSION_COOKIE}=${laptop}`)
      .expect(204);
    await me(phone).expect(401);
    await me(laptop).expect(401);
    await me(u.token).expect(401);
    await me(other.token).expect(200);
    // signing in again works
    await me(await signIn(u.email, u.password)).expect(200);
  });

  it('"sign out everywhere" needs a session (401 signed out)', async () => {
    await request(http).post('/api/auth/sign-out-everywhere').expect(401);
  });
});
