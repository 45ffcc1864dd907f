import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createServedApp } from '../utils/test-app';
import { createUser } from '../factories/accounts';

/**
 * The app as main.ts builds it (NestFactory, not the testing module: the static file server picks
 * its Express loader only when the HTTP adapter exists while the modules are made).
 */
describe('security 9: security headers', () => {
  let dist: string;
  beforeAll(() => {
    dist = mkdtempSync(join(tmpdir(), 'loamline-dist-'));
    mkdirSync(join(dist, 'assets'));
    writeFileSync(join(dist, 'index.html'), '<!doctype html><title>Loamline</title><div id="root"></div>');
    writeFileSync(join(dist, 'assets', 'app.js'), 'console.log(1)');
    writeFileSync(join(dist, 'assets', 'app.js.map'), '{"version":3}');
  });
  afterAll(() => rmSync(dist, { recursive: true, force: true }));

  describe('in production', () => {
    let app: INestApplication;
    let http: ReturnType<INestApplication['getHttpServer']>;
    beforeAll(async () => {
      app = await createServedApp({ NODE_ENV: 'production', FRONTEND_DIST: dist });
      http = app.getHttpServer();
    });
    afterAll(async () => {
      await app.close();
    });

    it('sends a CSP that fits the app, frame-ancestors none, nosniff, a referrer policy, no X-Powered-By', async () => {
      for (const path of ['/', '/garage', '/api/health']) {
        const res = await request(http).get(path).expect(200);
        const csp = res.headers['content-security-policy'];
        expect(csp).toContain("default-src 'self'");
        expect(csp).toContain("script-src 'self'");
        expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
        expect(csp).toContain("style-src 'self' 'unsafe-inline'");
        expect(csp).toContain("font-src 'self'");
        expect(csp).toContain("frame-ancestors 'none'");
        expect(csp).toContain("object-src 'none'");
        expect(res.headers['x-content-type-options']).toBe('nosniff');
        expect(res.headers['referrer-policy']).toBe('no-referrer');
        expect(res.headers['x-frame-options']).toBe('DENY');
        expect(res.headers['x-powered-by']).toBeUndefined();
        // plain http on loopback: no HSTS, no upgrade of requests
        expect(res.headers['strict-transport-security']).toBeUndefined();
        expect(csp).not.toContain('upgrade-insecure-requests');
      }
    });

    it('marks API answers Cache-Control: no-store (personal data stays out of caches)', async () => {
      const u = await createUser(app);
      const me = await request(http).get('/api/auth/me').set('Cookie', u.cookie).expect(200);
      expect(me.headers['cache-control']).toBe('no-store');
      const bikes = await request(http).get('/api/bikes').set('Cookie', u.cookie).expect(200);
      expect(bikes.headers['cache-control']).toBe('no-store');
      const refused = await request(http).get('/api/bikes').expect(401);
      expect(refused.headers['cache-control']).toBe('no-store');
    });

    it('serves no source maps and no OpenAPI page', async () => {
      await request(http).get('/assets/app.js').expect(200);
      await request(http).get('/assets/app.js.map').expect(404);
      await request(http).get('/api/docs-json').expect(404);
      await request(http).get('/api/docs').expect(404);
    });
  });

  it('in production with API_DOCS=true and SERVE_SOURCE_MAPS=true both are served', async () => {
    const app = await createServedApp({
      NODE_ENV: 'production',
      FRONTEND_DIST: dist,
      API_DOCS: 'true',
      SERVE_SOURCE_MAPS: 'true',
    });
    try {
      await request(app.getHttpServer()).get('/assets/app.js.map').expect(200);
      await request(app.getHttpServer()).get('/api/docs-json').expect(200);
      const page = await request(app.getHttpServer()).get('/api/docs/').expect(200);
      expect(page.headers['content-security-policy']).toContain("frame-ancestors 'none'");
    } finally {
      await app.close();
    }
  });
});
