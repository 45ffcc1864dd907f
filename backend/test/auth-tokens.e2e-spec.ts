import { createHmac } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { SESSION_COOKIE } from '@loamline/shared-types';
import { User } from '../src/users/user.entity';
import { createUser, type TestUser } from './factories/accounts';
import { sessionCookie } from './utils/cookies';
import { createTestApp } from './utils/test-app';

/** The secret the test app signs with: the JWT_SECRET `npm test` passes. */
const secret = (): string => {
  const s = process.env.JWT_SECRET;
  if (!s) throw new Error('JWT_SECRET is not set');
  return s;
};

const b64url = (v: object | string): string =>
  Buffer.from(typeof v === 'string' ? v : JSON.stringify(v)).toString('base64url');

/** A compact JWS built by hand (RFC 7515 §7.1), so the tests control every byte of it. */
function forge(header: object, payload: object, key: string | null, hmac = 'sha256'): string {
  const signingInput = `${b64url(header)}.${b64url(payload)}`;
  const sig = key === null ? '' : createHmac(hmac, key).update(signingInput).digest('base64url');
  return `${signingInput}.${sig}`;
}

const now = (): number => Math.floor(Date.now() / 1000);

describe('session tokens: only our HS256, unexpired, for the current password', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let u: TestUser;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    u = await createUser(app);
  });
  afterAll(async () => {
    await app.close();
  });

  const me = (token: string) => request(http).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${token}`);
  const meBearer = (token: string) =>
    request(http).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
  const claims = () => ({ sub: u.id, sid: u.sessionId, tv: 0, iat: now(), exp: now() + 600 });

  it('accepts a token built by hand with HS256 and the right secret (so the refusals below mean something)', async () => {
    const token = forge({ alg: 'HS256', typ: 'JWT' }, claims(), secret());
    await me(token).expect(200);
    await meBearer(token).expect(200);
  });

  it('refuses alg "none" (RFC 7519 §6.1 unsecured JWT), with and without a signature part', async () => {
    const unsigned = forge({ alg: 'none', typ: 'JWT' }, claims(), null);
    await me(unsigned).expect(401);
    await meBearer(unsigned).expect(401);
    const withSig = forge({ alg: 'none', typ: 'JWT' }, claims(), secret());
    await me(withSig).expect(401);
  });

  it('refuses a changed payload (another user id, or a higher role claim) under the old signature', async () => {
    const other = await createUser(app);
    const good = forge({ alg: 'HS256', typ: 'JWT' }, claims(), secret());
    const [h, , s] = good.split('.');
    const tampered = `${h}.${b64url({ ...claims(), sub: other.id })}.${s}`;
    await me(tampered).expect(401);
    const elevated = `${h}.${b64url({ ...claims(), role: 'owner' })}.${s}`;
    await me(elevated).expect(401);
  });

  it('refuses a token signed with another secret', async () => {
    await me(
      forge({ alg: 'HS256', typ: 'JWT' }, claims(), 'another-secret-of-at-least-32-characters!'),
    ).expect(401);
  });

  it('refuses other algorithms even with our secret (HS384, HS512): HS256 is pinned', async () => {
    await me(forge({ alg: 'HS384', typ: 'JWT' }, claims(), secret(), 'sha384')).expect(401);
    await me(forge({ alg: 'HS512', typ: 'JWT' }, claims(), secret(), 'sha512')).expect(401);
  });

  it('refuses an expired token (exp in the past) signed with our secret by @nestjs/jwt', async () => {
    const jwt = new JwtService({ secret: secret() });
    const claims = { sub: u.id, sid: u.sessionId, tv: 0, iat: now() - 3600, exp: now() - 60 };
    const expired = jwt.sign(claims, { algorithm: 'HS256' });
    await me(expired).expect(401);
    await meBearer(expired).expect(401);
    // the same claims one hour later in time are fine: it is only the expiry that is refused
    await me(jwt.sign({ ...claims, iat: now(), exp: now() + 600 }, { algorithm: 'HS256' })).expect(200);
  });

  it('refuses a token without the claims we issue (no token version, no session id)', async () => {
    await me(
      forge(
        { alg: 'HS256', typ: 'JWT' },
        { sub: u.id, sid: u.sessionId, iat: now(), exp: now() + 600 },
        secret(),
      ),
    ).expect(401);
    await me(
      forge({ alg: 'HS256', typ: 'JWT' }, { sub: u.id, tv: 0, iat: now(), exp: now() + 600 }, secret()),
    ).expect(401);
  });

  it('refuses a token signed before the password changed (token version bumped)', async () => {
    const v = await createUser(app);
    await me(v.token).expect(200);
    await app.get(DataSource).getRepository(User).increment({ id: v.id }, 'tokenVersion', 1);
    await me(v.token).expect(401);
  });

  describe('silent renewal', () => {
    it('re-issues the cookie when more than half the lifetime has passed', async () => {
      const ttl = 30 * 60;
      const old = forge(
        { alg: 'HS256', typ: 'JWT' },
        { sub: u.id, sid: u.sessionId, tv: 0, iat: now() - ttl * 0.6, exp: now() + ttl * 0.4 },
        secret(),
      );
      const res = await me(old).expect(200);
      const fresh = sessionCookie(res);
      expect(fresh).toBeDefined();
      expect(fresh!.value).not.toBe(old);
      expect(fresh!.flags).toEqual(expect.arrayContaining(['HttpOnly', 'SameSite=Lax']));
      const payload = app.get(JwtService).verify<{ iat: number; exp: number }>(fresh!.value);
      expect(payload.exp - payload.iat).toBe(ttl); // SESSION_TTL_MINUTES defaults to 30
      await me(fresh!.value).expect(200);
    });

    it('leaves a young cookie alone, and never sets a cookie for a Bearer client', async () => {
      const young = forge({ alg: 'HS256', typ: 'JWT' }, claims(), secret());
      expect((await me(young).expect(200)).headers['set-cookie']).toBeUndefined();
      const old = forge(
        { alg: 'HS256', typ: 'JWT' },
        { sub: u.id, sid: u.sessionId, tv: 0, iat: now() - 1200, exp: now() + 600 },
        secret(),
      );
      expect((await meBearer(old).expect(200)).headers['set-cookie']).toBeUndefined();
    });
  });
});
