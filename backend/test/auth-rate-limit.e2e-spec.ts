import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { SIGN_IN_DELAYS } from '../src/auth/auth.constants';
import type { SignInDelays } from '../src/auth/sign-in-delays';
import { createUser, uniqueEmail } from './factories/accounts';
import { createTestApp } from './utils/test-app';

/**
 * The per-IP limit on the sign-in routes (AUTH_RATE_LIMIT a minute; 5 outside tests) and the
 * growing delay after repeated failures for one address (SIGN_IN_FAILURE_DELAY_MS steps).
 * Each test app counts in a scope of its own (test/utils/test-app.ts), so these limits do not reach
 * the other test files; shared-rate-limits.e2e-spec.ts shows two instances sharing one.
 */
describe('auth rate limits', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;

  beforeAll(async () => {
    app = await createTestApp({ AUTH_RATE_LIMIT: '3', SIGN_IN_FAILURE_DELAY_MS: '400' });
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  it('answers 429 on the 4th sign-in within a minute from one address, even with the right password', async () => {
    const u = await createUser(app);
    for (let i = 0; i < 3; i++) {
      await request(http)
        .post('/api/auth/sign-in')
        .send({ email: u.email, password: u.password })
        .expect(200);
    }
    const res = await request(http)
      .post('/api/auth/sign-in')
      .send({ email: u.email, password: u.password })
      .expect(429);
    expect(res.body).toEqual({
      statusCode: 429,
      error: 'Too Many Requests',
      message: expect.stringMatching(/too many/i),
    });
    expect(Number(res.headers['retry-after-auth'] ?? res.headers['retry-after'])).toBeGreaterThan(0);
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('limits register and both reset routes the same way (each route counts on its own)', async () => {
    for (const [path, body] of [
      [
        '/api/auth/register',
        () => ({ email: uniqueEmail('rl'), password: 'a-long-enough-secret', name: 'R' }),
      ],
      ['/api/auth/password-reset', () => ({ email: uniqueEmail('rl') })],
      [
        '/api/auth/password-reset/confirm',
        () => ({ token: 'x'.repeat(43), password: 'a-long-enough-secret' }),
      ],
    ] as const) {
      const codes: number[] = [];
      for (let i = 0; i < 4; i++) codes.push((await request(http).post(path).send(body())).status);
      expect(codes.slice(0, 3)).not.toContain(429);
      expect(codes[3]).toBe(429);
    }
  });

  it('does not limit routes that are not about signing in', async () => {
    const u = await createUser(app);
    for (let i = 0; i < 6; i++) await request(http).get('/api/auth/me').set('Cookie', u.cookie).expect(200);
  });
});

describe('repeated failed sign-ins for one address slow down', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;

  beforeAll(async () => {
    app = await createTestApp({ AUTH_RATE_LIMIT: '100', SIGN_IN_FAILURE_DELAY_MS: '400' });
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  const timed = async (email: string, password: string, expected: number): Promise<number> => {
    const t0 = performance.now();
    await request(http).post('/api/auth/sign-in').send({ email, password }).expect(expected);
    return performance.now() - t0;
  };

  it('waits 400 ms, then 800 ms after the three free failures; a success resets it', async () => {
    const u = await createUser(app);
    for (let i = 0; i < 3; i++) await timed(u.email, 'wrong-password', 401);
    expect(await timed(u.email, 'wrong-password', 401)).toBeGreaterThanOrEqual(400);
    expect(await timed(u.email, 'wrong-password', 401)).toBeGreaterThanOrEqual(800);
    // the right password still works (after its own wait), and clears the count
    const success = await timed(u.email, u.password, 200);
    expect(success).toBeGreaterThanOrEqual(1600);
    expect(await app.get<SignInDelays>(SIGN_IN_DELAYS).delayMs(u.email)).toBe(0);
    // another address is not slowed by this one's failures: no wait is due for it, and its sign-in
    // (the same password check, without the 1.6 s wait) is quicker than the one above. Not an absolute
    // bound: on a loaded machine one password check alone has taken 3 s.
    const other = await createUser(app);
    expect(await app.get<SignInDelays>(SIGN_IN_DELAYS).delayMs(other.email)).toBe(0);
    expect(await timed(other.email, other.password, 200)).toBeLessThan(success);
  });
});
