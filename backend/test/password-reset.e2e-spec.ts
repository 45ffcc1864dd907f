import { createHash } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { PasswordResetToken } from '../src/auth/password-reset-token.entity';
import { createUser, uniqueEmail, type TestUser } from './factories/accounts';
import { messagesTo, tokenFromLink, waitForMail } from './utils/mail-inbox';
import { createTestApp } from './utils/test-app';

/** Password reset end to end: the app mails through SMTP to the mail fake; the test reads its JSON inbox. */
describe('password reset', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  const askReset = (email: string) =>
    request(http).post('/api/auth/password-reset').send({ email }).expect(202);
  const confirm = (token: string, password: string) =>
    request(http).post('/api/auth/password-reset/confirm').send({ token, password });
  const signIn = (u: TestUser, password: string) =>
    request(http).post('/api/auth/sign-in').send({ email: u.email, password });

  async function resetToken(u: TestUser, count = 1): Promise<{ link: string; token: string }> {
    const [mail] = await waitForMail(u.email, count);
    return tokenFromLink(mail, '/reset-password');
  }

  it('mails a single-use link; it sets the password once, not twice, and ends older sessions', async () => {
    const u = await createUser(app);
    await askReset(u.email.toUpperCase()).expect((res) => expect(res.body).toEqual({}));
    const [mail] = await waitForMail(u.email);
    expect(mail.subject).toMatch(/reset/i);
    expect(mail.to).toEqual([u.email]);
    const { link, token } = tokenFromLink(mail, '/reset-password');
    expect(link.startsWith(`${process.env.APP_URL}/reset-password?token=`)).toBe(true);
    expect(mail.text).toContain(link); // plain text and HTML both carry the link
    expect(mail.html).toContain(link);

    // only the token's SHA-256 is stored
    const rows = await app.get(DataSource).getRepository(PasswordResetToken).findBy({ userId: u.id });
    expect(rows).toHaveLength(1);
    expect(rows[0].tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(rows)).not.toContain(token);

    await confirm(token, 'a-brand-new-password').expect(204);
    await signIn(u, 'a-brand-new-password').expect(200);
    await signIn(u, u.password).expect(401);
    // the session from before the reset no longer works
    await request(http).get('/api/auth/me').set('Cookie', u.cookie).expect(401);

    const again = await confirm(token, 'yet-another-password').expect(400);
    expect(again.body.fields).toHaveProperty('token');
    await signIn(u, 'yet-another-password').expect(401);
  });

  it('answers 202 for an address without an account, and sends nothing', async () => {
    const email = uniqueEmail('ghost');
    await askReset(email);
    await new Promise((r) => setTimeout(r, 500));
    expect(await messagesTo(email)).toEqual([]);
  });

  it('refuses an expired link', async () => {
    const u = await createUser(app);
    await askReset(u.email);
    const { token } = await resetToken(u);
    await app
      .get(DataSource)
      .getRepository(PasswordResetToken)
      .update({ userId: u.id }, { expiresAt: new Date(Date.now() - 1000) });
    await confirm(token, 'a-brand-new-password').expect(400);
    await signIn(u, u.password).expect(200);
  });

  it('using one of two links burns the other as well', async () => {
    const u = await createUser(app);
    await askReset(u.email);
    const first = await resetToken(u, 1);
    await askReset(u.email);
    const second = await resetToken(u, 2); // newest first
    expect(second.token).not.toBe(first.token);
    await confirm(second.token, 'a-brand-new-password').expect(204);
    await confirm(first.token, 'another-new-password').expect(400);
  });

  it('refuses an unknown token, and two confirmations at once set the password only once', async () => {
    await confirm('A'.repeat(43), 'a-brand-new-password').expect(400);
    const u = await createUser(app);
    await askReset(u.email);
    const { token } = await resetToken(u);
    const codes = (
      await Promise.all([confirm(token, 'parallel-password-1'), confirm(token, 'parallel-password-2')])
    )
      .map((r) => r.status)
      .sort();
    expect(codes).toEqual([204, 400]);
  });

  it.each([
    ['/api/auth/password-reset', {}, 'email'],
    ['/api/auth/password-reset', { email: 'nope' }, 'email'],
    ['/api/auth/password-reset/confirm', { token: 'short', password: 'a-brand-new-password' }, 'token'],
    ['/api/auth/password-reset/confirm', { token: 'A'.repeat(43), password: 'short' }, 'password'],
    ['/api/auth/password-reset/confirm', { token: 'A'.repeat(43) }, 'password'],
  ])('answers 400 on a bad body for %s (%j)', async (path, body, field) => {
    const res = await request(http).post(path).send(body).expect(400);
    expect(res.body.fields).toHaveProperty(field);
  });
});
