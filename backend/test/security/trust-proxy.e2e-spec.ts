import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { parseTrustProxy } from '../../src/config/app.config';
import { uniqueEmail } from '../factories/accounts';
import { createTestApp } from '../utils/test-app';

/**
 * Finding 3: every auth rate limit fell to a spoofed X-Forwarded-For (the server trusted it from
 * any client). Proxy headers count only when TRUST_PROXY names the proxy; off by default.
 */
describe('security 3: rate limits key on the real client', () => {
  const attempt = (app: INestApplication, forwardedFor: string) =>
    request(app.getHttpServer())
      .post('/api/auth/password-reset')
      .set('X-Forwarded-For', forwardedFor)
      .send({ email: uniqueEmail('xff') });

  it('by default a fresh X-Forwarded-For on every request does not buy a fresh budget (429)', async () => {
    const app = await createTestApp({ AUTH_RATE_LIMIT: '3', PASSWORD_RESET_MIN_MS: '0' });
    try {
      const codes: number[] = [];
      for (let i = 0; i < 5; i++) codes.push((await attempt(app, `203.0.113.${i + 1}`)).status);
      expect(codes).toEqual([202, 202, 202, 429, 429]);
    } finally {
      await app.close();
    }
  });

  it('with TRUST_PROXY=loopback (a proxy on this host) the forwarded client is the key', async () => {
    const app = await createTestApp({
      AUTH_RATE_LIMIT: '3',
      PASSWORD_RESET_MIN_MS: '0',
      TRUST_PROXY: 'loopback',
    });
    try {
      const codes: number[] = [];
      for (let i = 0; i < 4; i++) codes.push((await attempt(app, '203.0.113.50')).status);
      expect(codes).toEqual([202, 202, 202, 429]);
      // another client behind the proxy has its own budget
      expect((await attempt(app, '203.0.113.51')).status).toBe(202);
    } finally {
      await app.close();
    }
  });

  it('reads TRUST_PROXY strictly: unset/false is off, a hop count or a list as given', () => {
    expect(parseTrustProxy(undefined)).toBe(false);
    expect(parseTrustProxy('false')).toBe(false);
    expect(parseTrustProxy('1')).toBe(1);
    expect(parseTrustProxy('loopback, 10.0.0.1')).toEqual(['loopback', '10.0.0.1']);
  });

  it('refuses TRUST_PROXY=true at boot (it would believe any client)', async () => {
    await expect(createTestApp({ TRUST_PROXY: 'true' })).rejects.toThrow(/TRUST_PROXY/);
  });
});
