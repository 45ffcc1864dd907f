import { createHash, randomUUID } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { SIGN_IN_DELAYS } from '../src/auth/auth.constants';
import { RateLimitSweep } from '../src/auth/rate-limits/rate-limit-sweep';
import { SharedThrottlerStorage } from '../src/auth/rate-limits/shared-throttler-storage';
import { SignInFailureTable } from '../src/auth/rate-limits/sign-in-failure-table';
import type { SignInDelays } from '../src/auth/sign-in-delays';
import { emailHash } from '../src/auth/sign-in-delays';
import { ManualClock } from '../src/common/clock/clock';
import { createUser } from './factories/accounts';
import { createTestApp } from './utils/test-app';

/**
 * The auth routes' protections are kept in MariaDB (rate_limit_hits, sign_in_failures), so two app
 * instances on one database — two INestApplications here, each with its own connection pool — count
 * against one limit (docs/scaling.md). Before, each process counted in its own memory and a client
 * spreading requests over N instances got N times the allowance.
 */
describe('two app instances share the per-IP limit of the auth routes', () => {
  let a: INestApplication;
  let b: INestApplication;

  beforeAll(async () => {
    const shared = { rateLimitScope: randomUUID() };
    const env = { AUTH_RATE_LIMIT: '3', PASSWORD_RESET_MIN_MS: '0' };
    a = await createTestApp(env, shared);
    b = await createTestApp(env, shared);
  });
  afterAll(async () => {
    await a.close();
    await b.close();
  });

  it('answers 429 to the 4th sign-in within a minute spread over both instances', async () => {
    const u = await createUser(a);
    const signIn = (app: INestApplication) =>
      request(app.getHttpServer()).post('/api/auth/sign-in').send({ email: u.email, password: u.password });
    const codes: number[] = [];
    for (const app of [a, b, a]) codes.push((await signIn(app)).status);
    expect(codes).toEqual([200, 200, 200]);
    const over = await signIn(b);
    expect(over.status).toBe(429);
    expect(Number(over.headers['retry-after-auth'])).toBeGreaterThan(0);
    expect(over.headers['set-cookie']).toBeUndefined();
    expect((await signIn(a)).status).toBe(429);
  });

  it('counts each route on its own, over both instances', async () => {
    const reset = (app: INestApplication) =>
      request(app.getHttpServer()).post('/api/auth/password-reset').send({ email: 'nobody@example.test' });
    const codes: number[] = [];
    for (const app of [b, a, b, a]) codes.push((await reset(app)).status);
    expect(codes).toEqual([202, 202, 202, 429]);
  });

  it('another scope (another deployment, another test app) has its own budget', async () => {
    const other = await createTestApp({ AUTH_RATE_LIMIT: '3', PASSWORD_RESET_MIN_MS: '0' });
    try {
      await request(other.getHttpServer())
        .post('/api/auth/password-reset')
        .send({ email: 'nobody@example.test' })
        .expect(202);
    } finally {
      await other.close();
    }
  });
});

describe('failed sign-ins made through either instance count for the delay', () => {
  let a: INestApplication;
  let b: INestApplication;

  beforeAll(async () => {
    const shared = { rateLimitScope: randomUUID() };
    const env = { AUTH_RATE_LIMIT: '100', SIGN_IN_FAILURE_DELAY_MS: '300' };
    a = await createTestApp(env, shared);
    b = await createTestApp(env, shared);
  });
  afterAll(async () => {
    await a.close();
    await b.close();
  });

  const timed = async (app: INestApplication, email: string, password: string, expected: number) => {
    const t0 = performance.now();
    await request(app.getHttpServer()).post('/api/auth/sign-in').send({ email, password }).expect(expected);
    return performance.now() - t0;
  };

  it('three free failures over both, then the 4th waits on either; a success on one clears both', async () => {
    const u = await createUser(a);
    await timed(a, u.email, 'wrong-password', 401);
    await timed(b, u.email, 'wrong-password', 401);
    await timed(a, u.email, 'wrong-password', 401);
    // the 4th attempt, on the other instance, waits the base delay (failures made on both count)
    expect(await timed(b, u.email, 'wrong-password', 401)).toBeGreaterThanOrEqual(300);
    const delaysA = a.get<SignInDelays>(SIGN_IN_DELAYS);
    const delaysB = b.get<SignInDelays>(SIGN_IN_DELAYS);
    expect(await delaysA.delayMs(u.email)).toBe(600);
    expect(await delaysB.delayMs(u.email.toUpperCase())).toBe(600);
    // only a hash of the address is stored
    const rows = await a
      .get(DataSource)
      .query<{ email_hash: string; failures: number }[]>(
        'SELECT `email_hash`, `failures` FROM `sign_in_failures` WHERE `email_hash` = ?',
        [emailHash(u.email)],
      );
    expect(rows).toEqual([{ email_hash: createHash('sha256').update(u.email).digest('hex'), failures: 4 }]);
    // the right password on one instance (after its wait) clears the count for both
    expect(await timed(a, u.email, u.password, 200)).toBeGreaterThanOrEqual(600);
    expect(await delaysB.delayMs(u.email)).toBe(0);
  });
});

describe('the shared storage under concurrency, time and the sweep', () => {
  let a: INestApplication;
  let b: INestApplication;
  const scope = randomUUID();

  beforeAll(async () => {
    a = await createTestApp({}, { rateLimitScope: scope });
    b = await createTestApp({}, { rateLimitScope: scope });
  });
  afterAll(async () => {
    await a.close();
    await b.close();
  });

  /** Two storages on the two apps' DataSources (two pools), one clock. */
  const storages = (clock: ManualClock) => [
    new SharedThrottlerStorage(a.get(DataSource), clock, scope),
    new SharedThrottlerStorage(b.get(DataSource), clock, scope),
  ];

  it('counts 24 hits at once over two connection pools exactly: 10 pass, 14 are blocked', async () => {
    const [s1, s2] = storages(new ManualClock());
    const key = randomUUID();
    const records = await Promise.all(
      Array.from({ length: 24 }, (_, i) => (i % 2 ? s1 : s2).increment(key, 60_000, 10, 60_000, 'auth')),
    );
    const passed = records.filter((r) => !r.isBlocked);
    expect(passed).toHaveLength(10);
    expect(passed.map((r) => r.totalHits).sort((x, y) => x - y)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    for (const r of records.filter((r) => r.isBlocked)) {
      expect(r.timeToBlockExpire).toBeGreaterThan(0);
      expect(r.timeToBlockExpire).toBeLessThanOrEqual(60);
    }
  });

  it('starts again after the window; a block lasts its own duration and its hits do not count', async () => {
    const clock = new ManualClock();
    const [s1, s2] = storages(clock);
    const key = randomUUID();
    expect(await s1.increment(key, 1000, 2, 5000, 'auth')).toEqual({
      totalHits: 1,
      timeToExpire: 1,
      isBlocked: false,
      timeToBlockExpire: 0,
    });
    expect((await s2.increment(key, 1000, 2, 5000, 'auth')).isBlocked).toBe(false);
    expect(await s1.increment(key, 1000, 2, 5000, 'auth')).toEqual({
      totalHits: 3,
      timeToExpire: 1,
      isBlocked: true,
      timeToBlockExpire: 5,
    });
    clock.advance(1500); // the window is over, the block is not
    expect(await s2.increment(key, 1000, 2, 5000, 'auth')).toMatchObject({
      totalHits: 3,
      isBlocked: true,
      timeToBlockExpire: 4,
    });
    clock.advance(3501); // the block is over: a fresh window
    expect(await s1.increment(key, 1000, 2, 5000, 'auth')).toEqual({
      totalHits: 1,
      timeToExpire: 1,
      isBlocked: false,
      timeToBlockExpire: 0,
    });
    // without a block, a window that ends simply starts again
    const other = randomUUID();
    for (let i = 0; i < 2; i++) await s2.increment(other, 1000, 5, 1000, 'auth');
    clock.advance(1000);
    expect((await s1.increment(other, 1000, 5, 1000, 'auth')).totalHits).toBe(1);
  });

  it('stores the SHA-256 of the throttler name and key, never the key', async () => {
    const [s1] = storages(new ManualClock());
    const key = `203.0.113.9-${randomUUID()}`;
    await s1.increment(key, 60_000, 5, 60_000, 'auth');
    const hash = createHash('sha256').update(`${scope}\nauth\n${key}`).digest('hex');
    const ds = a.get(DataSource);
    const rows = await ds.query<
      {
        hits: number;
      }[]
    >('SELECT `hits` FROM `rate_limit_hits` WHERE `key_hash` = ?', [hash]);
    expect(rows).toEqual([{ hits: 1 }]);
  });

  it('counts failed sign-ins made at once through two pools exactly', async () => {
    const t1 = new SignInFailureTable(a.get(DataSource));
    const t2 = new SignInFailureTable(b.get(DataSource));
    const hash = emailHash(`${randomUUID()}@example.test`);
    const now = new Date();
    const stale = new Date(now.getTime() - 15 * 60 * 1000);
    await Promise.all(Array.from({ length: 12 }, (_, i) => (i % 2 ? t1 : t2).addFailure(hash, now, stale)));
    expect((await t1.get(hash))?.failures).toBe(12);
    // a failure after 15 quiet minutes starts a new count
    const later = new Date(now.getTime() + 15 * 60 * 1000 + 1);
    await t2.addFailure(hash, later, new Date(later.getTime() - 15 * 60 * 1000));
    expect(await t1.get(hash)).toEqual({ failures: 1, lastAt: later });
  });

  it('the sweep deletes the rows whose window, block or quiet time is over, and only those', async () => {
    // rows written a day ago (nothing else in the shared database is that old and still needed)
    const dayAgo = new ManualClock(new Date(Date.now() - 24 * 3600 * 1000));
    const [s1] = storages(dayAgo);
    const done = randomUUID();
    const blocked = randomUUID();
    await s1.increment(done, 1000, 5, 1000, 'auth');
    // blocked from a day ago until an hour from now
    for (let i = 0; i < 2; i++) await s1.increment(blocked, 1000, 1, 25 * 3600 * 1000, 'auth');
    const failures = new SignInFailureTable(a.get(DataSource));
    const oldAddress = emailHash(`${randomUUID()}@example.test`);
    const newAddress = emailHash(`${randomUUID()}@example.test`);
    await failures.addFailure(oldAddress, dayAgo.now(), new Date(0));
    await failures.addFailure(newAddress, new Date(), new Date(0));

    dayAgo.advance(16 * 60 * 1000); // the sweep runs 16 minutes after those rows were written
    const swept = await new RateLimitSweep(a.get(DataSource), dayAgo).sweep();
    expect(swept.hits).toBeGreaterThanOrEqual(1);
    expect(swept.failures).toBeGreaterThanOrEqual(1);
    const left = await a
      .get(DataSource)
      .query<{ key_hash: string }[]>('SELECT `key_hash` FROM `rate_limit_hits` WHERE `key_hash` IN (?, ?)', [
        s1.keyHash(done, 'auth'),
        s1.keyHash(blocked, 'auth'),
      ]);
    expect(left.map((r) => r.key_hash)).toEqual([s1.keyHash(blocked, 'auth')]);
    expect(await failures.get(oldAddress)).toBeNull();
    expect((await failures.get(newAddress))?.failures).toBe(1);
  });
});
