import { createServer, type Server, type Socket, connect } from 'node:net';
import type { AddressInfo } from 'node:net';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createTestApp } from './utils/test-app';

/**
 * A TCP relay between the app and MariaDB, so a test can take the database away from the app
 * (as a stopped server would) without stopping the MariaDB the other tests use.
 */
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

describe('GET /api/health', () => {
  it('answers ok with the database up (real MariaDB, migrated)', async () => {
    const app = await createTestApp();
    await request(app.getHttpServer()).get('/api/health').expect(200).expect({ status: 'ok', db: 'up' });
    await app.close();
  });

  it('answers 503 with db down once the database is unreachable', async () => {
    const relay = await startRelay(Number(process.env.DB_PORT));
    const app: INestApplication = await createTestApp({ DB_PORT: String(relay.port) });
    await request(app.getHttpServer()).get('/api/health').expect(200);
    await relay.cut();
    const res = await request(app.getHttpServer()).get('/api/health').expect(503);
    expect(res.body).toEqual({ status: 'degraded', db: 'down' });
    await app.close().catch(() => undefined);
  });

  it('is described in the OpenAPI document', async () => {
    const app = await createTestApp();
    const res = await request(app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(res.body.paths).toHaveProperty('/api/health');
    await app.close();
  });
});
