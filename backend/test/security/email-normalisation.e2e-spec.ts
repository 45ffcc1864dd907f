import { randomBytes } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { normaliseEmail } from '../../src/common/email';
import { User } from '../../src/users/user.entity';
import { messagesTo, waitForMail } from '../utils/mail-inbox';
import { createTestApp } from '../utils/test-app';

/**
 * Finding 2: e-mail matching followed an accent-insensitive collation: `rîder@…` signed in as
 * `rider@…`, an IDN look-alike blocked the real person's registration and received their reset
 * mail. Addresses are now stored in one normalised form and compared byte for byte.
 */
describe('security 2: e-mail addresses are compared exactly, in one normalised form', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  const password = 'a-long-enough-secret';

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  const tag = () => randomBytes(4).toString('hex');
  const register = (email: string) =>
    request(http).post('/api/auth/register').send({ email, password, name: 'Sam' });

  it('normalises: NFC, trim, lower case, IDNA domain', () => {
    expect(normaliseEmail('  Rider@Example.TEST ')).toBe('rider@example.test');
    expect(normaliseEmail('rider@exämple.test')).toBe('rider@xn--exmple-cua.test');
    // decomposed "i" + combining circumflex and the precomposed "î" are one address
    expect(normaliseEmail('ri\u0302der@example.test')).toBe(normaliseEmail('rîder@example.test'));
    expect(normaliseEmail('no-at-sign')).toBe('');
    expect(normaliseEmail('a@bad domain')).toBe('');
  });

  it('an accented address does not sign in as the plain one', async () => {
    const plain = `rider-${tag()}@example.test`;
    await register(plain).expect(201);
    const accented = plain.replace('rider', 'rîder');
    await request(http).post('/api/auth/sign-in').send({ email: accented, password }).expect(401);
    await request(http).post('/api/auth/sign-in').send({ email: plain, password }).expect(200);
  });

  it('an IDN look-alike neither blocks the real registration nor receives its reset mail', async () => {
    const t = tag();
    const lookAlike = `rider@ex${t}ämple.test`;
    const real = `rider@ex${t}ample.test`;
    const created = await register(lookAlike).expect(201);
    expect(created.body.user.email).toBe(normaliseEmail(lookAlike));
    expect(created.body.user.email).toMatch(/@xn--/);
    await register(real).expect(201); // not a 409 any more
    await request(http).post('/api/auth/password-reset').send({ email: real }).expect(202);
    const [mail] = await waitForMail(real);
    expect(mail.to).toEqual([real]);
    expect(await messagesTo(normaliseEmail(lookAlike))).toEqual([]);
  });

  it('an address in other letters or decomposed is the same account (409), stored once', async () => {
    const email = `forêt-${tag()}@example.test`;
    await register(email).expect(201);
    await register(email.toUpperCase()).expect(409);
    await register(` ${email.normalize('NFD')} `).expect(409);
    const rows = await app
      .get(DataSource)
      .getRepository(User)
      .findBy({ email: email.normalize('NFC') });
    expect(rows).toHaveLength(1);
  });

  it('the column compares bytes (utf8mb4_bin), for users and invitations', async () => {
    const rows = await app.get(DataSource).query<{ t: string; c: string }[]>(
      `SELECT TABLE_NAME AS t, COLLATION_NAME AS c FROM information_schema.COLUMNS
        WHERE TABLE_SCHEMA = DATABASE() AND COLUMN_NAME = 'email' ORDER BY TABLE_NAME`,
    );
    expect(rows).toEqual([
      { t: 'invitations', c: 'utf8mb4_bin' },
      { t: 'users', c: 'utf8mb4_bin' },
    ]);
  });
});
