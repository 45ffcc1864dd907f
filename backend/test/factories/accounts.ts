import { randomBytes } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type { Role } from '@loamline/shared-types';
import { SESSION_COOKIE } from '@loamline/shared-types';
import { PasswordHasher } from '../../src/auth/password-hasher';
import { SessionService } from '../../src/auth/session.service';
import { Shop } from '../../src/shops/shop.entity';
import { User } from '../../src/users/user.entity';

/** The database is shared by the whole run: every test makes its own addresses and slugs. */
export function uniqueEmail(label = 'user'): string {
  return `${label}-${Date.now().toString(36)}-${randomBytes(4).toString('hex')}@example.test`;
}

/** The password every factory user gets (hashed once per test file with the real OWASP hasher). */
export const FACTORY_PASSWORD = 'factory-password-7Qm!';
let factoryHash: Promise<string> | null = null;
const hashOnce = (): Promise<string> => (factoryHash ??= new PasswordHasher().hash(FACTORY_PASSWORD));

export async function createShop(app: INestApplication, overrides: Partial<Shop> = {}): Promise<Shop> {
  const repo = app.get(DataSource).getRepository(Shop);
  const suffix = randomBytes(4).toString('hex');
  const shop = repo.create({
    slug: `test-shop-${suffix}`,
    name: `Test Shop ${suffix}`,
    town: 'Testwick',
    timeZone: 'Europe/Berlin',
    currency: 'EUR',
    ...overrides,
  });
  await repo.insert(shop);
  return repo.findOneByOrFail({ id: shop.id });
}

export interface TestUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  shopId: string | null;
  password: string;
  /** a session token from the app's own SessionService, as sign-in would give */
  token: string;
  /** the session row the token names (its `sid` claim) */
  sessionId: string;
  /** `Cookie` header value carrying the session */
  cookie: string;
}

/** A user straight in the database (no scrypt per user), with a session ready to use. */
export async function createUser(
  app: INestApplication,
  opts: { role?: Role; shopId?: string | null; email?: string; name?: string } = {},
): Promise<TestUser> {
  const role = opts.role ?? 'rider';
  let shopId = opts.shopId ?? null;
  if (role !== 'rider' && !shopId) shopId = (await createShop(app)).id;
  const repo = app.get(DataSource).getRepository(User);
  const user = repo.create({
    email: opts.email ?? uniqueEmail(role),
    name: opts.name ?? `Test ${role}`,
    role,
    shopId,
    passwordHash: await hashOnce(),
    tokenVersion: 0,
  });
  await repo.insert(user);
  const { token, sessionId } = await app.get(SessionService).start({ id: user.id, tokenVersion: 0 });
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role,
    shopId,
    password: FACTORY_PASSWORD,
    token,
    sessionId,
    cookie: `${SESSION_COOKIE}=${token}`,
  };
}

/** Requests on behalf of a signed-in test user (their session cookie on every call). */
export function signedInAs(http: Parameters<typeof request>[0], u: TestUser) {
  return {
    get: (path: string) => request(http).get(path).set('Cookie', u.cookie),
    post: (path: string, body: object) => request(http).post(path).set('Cookie', u.cookie).send(body),
    patch: (path: string, body: object) => request(http).patch(path).set('Cookie', u.cookie).send(body),
    del: (path: string) => request(http).delete(path).set('Cookie', u.cookie),
  };
}
