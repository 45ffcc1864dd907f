import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createServedApp } from './utils/test-app';

/*
 * The built app's files: hashed assets are kept a year and never revalidated (`immutable`,
 * RFC 8246); index.html is revalidated every time (`no-cache`, RFC 9111 §5.2.2.4), so a release
 * shows at once. API answers stay `no-store`.
 */
describe('static files', () => {
  let app: INestApplication;
  let dist: string;

  beforeAll(async () => {
    dist = mkdtempSync(join(tmpdir(), 'loamline-dist-'));
    mkdirSync(join(dist, 'assets'));
    writeFileSync(join(dist, 'index.html'), '<!doctype html><title>Loamline</title>');
    writeFileSync(join(dist, 'assets', 'index-3f9a1c2b.js'), 'console.log(1)');
    app = await createServedApp({ NODE_ENV: 'production', FRONTEND_DIST: dist });
  });
  afterAll(async () => {
    await app.close();
    rmSync(dist, { recursive: true, force: true });
  });

  it('keeps hashed assets a year, immutable', async () => {
    const res = await request(app.getHttpServer()).get('/assets/index-3f9a1c2b.js').expect(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('revalidates index.html, also for a deep link', async () => {
    const root = await request(app.getHttpServer()).get('/').expect(200);
    expect(root.headers['cache-control']).toBe('no-cache');
    const deep = await request(app.getHttpServer()).get('/appointments/x').expect(200);
    expect(deep.text).toContain('<title>Loamline</title>');
    expect(deep.headers['cache-control']).toBe('no-cache');
  });

  it('leaves API answers no-store', async () => {
    const res = await request(app.getHttpServer()).get('/api/health');
    expect(res.headers['cache-control']).toBe('no-store');
  });
});
