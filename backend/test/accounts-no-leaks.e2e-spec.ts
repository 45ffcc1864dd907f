import type { INestApplication } from '@nestjs/common';
import request, { type Response } from 'supertest';
import { DataSource } from 'typeorm';
import { User } from '../src/users/user.entity';
import { createShop, createUser, uniqueEmail } from './factories/accounts';
import { baselineInput, enduroBike } from './factories/bikes';
import { sessionCookie } from './utils/cookies';
import { tokenFromLink, waitForMail } from './utils/mail-inbox';
import { createTestApp } from './utils/test-app';

/**
 * Walks every accounts route as real users would, keeps every answer (status line, headers and
 * body), and checks that no password and no password hash shows up anywhere in them.
 */
describe('no password or hash in any response', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  const seen: string[] = [];
  const keep = (res: Response): Response => {
    seen.push(`${res.status} ${JSON.stringify(res.headers)} ${res.text ?? ''}`);
    return res;
  };

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  it('holds for register, sign-in, me, garage, sheets, reset, team and invitations', async () => {
    const riderPassword = 'rider-secret-Xk9-pass';
    const email = uniqueEmail('leak');
    const reg = keep(
      await request(http).post('/api/auth/register').send({ email, password: riderPassword, name: 'L' }),
    );
    expect(reg.status).toBe(201);
    const cookie = sessionCookie(reg)!.pair;
    keep(await request(http).post('/api/auth/register').send({ email, password: riderPassword, name: 'L' })); // 409
    keep(
      await request(http).post('/api/auth/register').send({ email: 'x', password: riderPassword, name: 'L' }),
    ); // 400
    keep(await request(http).post('/api/auth/sign-in').send({ email, password: riderPassword }));
    keep(
      await request(http)
        .post('/api/auth/sign-in')
        .send({ email, password: `${riderPassword}-wrong` }),
    );
    keep(await request(http).get('/api/auth/me').set('Cookie', cookie));

    const bike = keep(await request(http).post('/api/bikes').set('Cookie', cookie).send(enduroBike()));
    keep(await request(http).get('/api/bikes').set('Cookie', cookie));
    keep(await request(http).get(`/api/bikes/${bike.body.id}`).set('Cookie', cookie));
    keep(await request(http).patch(`/api/bikes/${bike.body.id}`).set('Cookie', cookie).send({ name: 'B' }));
    const sheet = keep(
      await request(http)
        .post('/api/baseline-sheets')
        .set('Cookie', cookie)
        .send({ name: 'S', input: baselineInput() }),
    );
    keep(await request(http).get('/api/baseline-sheets').set('Cookie', cookie));
    keep(await request(http).get(`/api/baseline-sheets/${sheet.body.id}`).set('Cookie', cookie));

    // staff: an owner invites, the invitee joins with a password of their own
    const shop = await createShop(app);
    const owner = await createUser(app, { role: 'owner', shopId: shop.id });
    const staffEmail = uniqueEmail('leak-staff');
    const staffPassword = 'staff-secret-Qp4-pass';
    keep(
      await request(http)
        .post('/api/workshop/team/invitations')
        .set('Cookie', owner.cookie)
        .send({ email: staffEmail, role: 'technician' }),
    );
    const { token } = tokenFromLink((await waitForMail(staffEmail))[0], '/join');
    keep(await request(http).get(`/api/invitations/${token}`));
    const joined = keep(
      await request(http).post('/api/invitations/accept').send({ token, name: 'T', password: staffPassword }),
    );
    keep(await request(http).get('/api/workshop/team').set('Cookie', owner.cookie));
    keep(await request(http).get('/api/workshop/team').set('Cookie', sessionCookie(joined)!.pair));

    // reset: request, confirm with a new password, sign in with it
    const newPassword = 'rider-new-secret-Zt2';
    keep(await request(http).post('/api/auth/password-reset').send({ email }));
    const reset = tokenFromLink((await waitForMail(email))[0], '/reset-password');
    keep(
      await request(http)
        .post('/api/auth/password-reset/confirm')
        .send({ token: reset.token, password: newPassword }),
    );
    keep(await request(http).post('/api/auth/sign-in').send({ email, password: newPassword }));
    keep(await request(http).post('/api/auth/sign-out').set('Cookie', cookie));

    const hashes = (
      await app
        .get(DataSource)
        .getRepository(User)
        .createQueryBuilder('u')
        .addSelect('u.passwordHash')
        .where('u.email IN (:...emails)', { emails: [email, staffEmail, owner.email] })
        .getMany()
    ).map((u) => u.passwordHash);
    expect(hashes).toHaveLength(3);

    const all = seen.join('\n');
    expect(seen.length).toBeGreaterThan(20);
    for (const secret of [riderPassword, staffPassword, newPassword, owner.password, ...hashes]) {
      expect(all).not.toContain(secret);
    }
    // nor any piece of a hash (its salt or key), nor the field itself
    for (const h of hashes) for (const part of h.split('$').slice(3)) expect(all).not.toContain(part);
    expect(all).not.toMatch(/\$scrypt\$|passwordHash|password_hash|tokenVersion|token_version|tokenHash/);
  });
});

describe('OpenAPI: every accounts route is documented, protected ones with cookie and bearer security', () => {
  it('lists them', async () => {
    const app = await createTestApp();
    const res = await request(app.getHttpServer()).get('/api/docs-json').expect(200);
    await app.close();
    type Op = { security?: Record<string, string[]>[] };
    const paths = res.body.paths as Record<string, Record<string, Op>>;
    const protectedRoutes: [string, string][] = [
      ['/api/auth/me', 'get'],
      ['/api/bikes', 'get'],
      ['/api/bikes', 'post'],
      ['/api/bikes/{id}', 'get'],
      ['/api/bikes/{id}', 'patch'],
      ['/api/bikes/{id}', 'delete'],
      ['/api/baseline-sheets', 'get'],
      ['/api/baseline-sheets', 'post'],
      ['/api/baseline-sheets/{id}', 'get'],
      ['/api/baseline-sheets/{id}', 'patch'],
      ['/api/baseline-sheets/{id}', 'delete'],
      ['/api/workshop/team', 'get'],
      ['/api/workshop/team/invitations', 'post'],
    ];
    for (const [path, method] of protectedRoutes) {
      expect({ path, method, security: paths[path]?.[method]?.security }).toEqual({
        path,
        method,
        security: expect.arrayContaining([{ cookie: [] }, { bearer: [] }]),
      });
    }
    for (const [path, method] of [
      ['/api/invitations/{token}', 'get'],
      ['/api/invitations/accept', 'post'],
    ]) {
      expect(paths[path]?.[method]).toBeDefined();
    }
  });
});
