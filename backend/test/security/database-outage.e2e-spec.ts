import { createServer, type Server, type Socket, connect } from 'node:net';
import type { AddressInfo } from 'node:net';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createUser } from '../factories/accounts';
import { createTestApp } from '../utils/test-app';

/** A TCP relay between the app and MariaDB that a test can cut (as a stopped server would). */
async function startRelay(targetPort: number): Promise<{ port: number; cut: () => Promise<void> }> {
  const sockets = new Set<Socket>();
  const server: Server = createServer((client) => {
    const upstream = connect(targetPort, '127.0.0.1');
    sockets.add(client).add(upstream);
    client.pipe(upstream).pipe(client);
    const drop = () => {
      client.destroy();
      upstream.destroy();
    };
    client.on('error', drop).on('close', drop);
    upstream.on('error', drop).on('close', drop);
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  return {
    port: (server.address() as AddressInfo).port,
    cut: () =>
      new Promise<void>((r) => {
        sockets.forEach((s) => s.destroy());
        server.close(() => r());
      }),
  };
}

/**
 * Finding 7: a database outage looked like being signed out (401) or a 500 on sign-in. Every route
 * that needs the database now answers 503 with a clear message.
 */
describe('security 7: database unreachable → 503, never 401', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let relay: Awaited<ReturnType<typeof startRelay>>;

  beforeAll(async () => {
    relay = await startRelay(Number(process.env.DB_PORT));
    app = await createTestApp({ DB_PORT: String(relay.port), MAIL_RELAY_INTERVAL_MS: '0' });
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close().catch(() => undefined);
  });

  it('answers 503 with one message on signed-in and public routes alike', async () => {
    const u = await createUser(app);
    await request(http).get('/api/auth/me').set('Cookie', u.cookie).expect(200);
    await relay.cut();
    const calls: [string, request.Test][] = [
      ['me', request(http).get('/api/auth/me').set('Cookie', u.cookie)],
      ['bikes', request(http).get('/api/bikes').set('Cookie', u.cookie)],
      ['sheets', request(http).get('/api/baseline-sheets').set('Authorization', `Bearer ${u.token}`)],
      ['sign-in', request(http).post('/api/auth/sign-in').send({ email: u.email, password: u.password })],
      [
        'register',
        request(http)
          .post('/api/auth/register')
          .send({ email: 'x@example.test', password: 'a-long-enough-secret', name: 'X' }),
      ],
      ['reset', request(http).post('/api/auth/password-reset').send({ email: u.email })],
      ['invitation', request(http).get(`/api/invitations/${'A'.repeat(43)}`)],
    ];
    for (const [what, call] of calls) {
      const res = await call;
      expect({ what, status: res.status }).toEqual({ what, status: 503 });
      expect(res.body).toEqual({
        statusCode: 503,
        error: 'Service Unavailable',
        message: expect.stringMatching(/can't reach its database/),
      });
      // the browser keeps its session: no cookie is cleared
      expect(res.headers['set-cookie']).toBeUndefined();
    }
    await request(http).get('/api/health').expect(503);
  });
});
