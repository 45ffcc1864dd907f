import { get, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliCompressSync, brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createServedApp } from './utils/test-app';

/** A GET that keeps the body as it came over the wire (supertest would gunzip it). */
function rawGet(
  app: INestApplication,
  path: string,
  acceptEncoding: string,
): Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }> {
  const { port } = (app.getHttpServer() as Server).address() as AddressInfo;
  return new Promise((resolve, reject) => {
    get({ host: '127.0.0.1', port, path, headers: { 'accept-encoding': acceptEncoding } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () =>
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }),
      );
    }).on('error', reject);
  });
}

/*
 * The built app's files, as the server sends them (backend/src/common/security/static-files.ts):
 * hashed assets are kept a year and never revalidated (`immutable`, RFC 8246); index.html is
 * revalidated every time (`no-cache`, RFC 9111 §5.2.2.4), so a release shows at once; every text file
 * goes out as its build-time brotli or gzip twin when the client accepts one (RFC 9110 §8.4
 * Content-Encoding, §12.5.3 Accept-Encoding), else as itself, and says it varies with
 * Accept-Encoding (RFC 9110 §12.5.5). API answers stay `no-store`.
 */
describe('static files', () => {
  let app: INestApplication;
  let dist: string;
  const html = '<!doctype html><title>Loamline</title>' + '<p>first screen</p>'.repeat(50);
  const js = 'console.log("Loamline");'.repeat(100);

  beforeAll(async () => {
    dist = mkdtempSync(join(tmpdir(), 'loamline-dist-'));
    mkdirSync(join(dist, 'assets'));
    // what vite build + vite-plugin-compression2 leave: each text file with a .br and a .gz beside it
    for (const [file, text] of [
      ['index.html', html],
      [join('assets', 'index-3f9a1c2b.js'), js],
    ]) {
      writeFileSync(join(dist, file), text);
      writeFileSync(join(dist, `${file}.br`), brotliCompressSync(text));
      writeFileSync(join(dist, `${file}.gz`), gzipSync(text, { level: 9 }));
    }
    writeFileSync(join(dist, 'assets', 'plain-0a1b2c3d.js'), 'console.log(2)');
    app = await createServedApp({ NODE_ENV: 'production', FRONTEND_DIST: dist });
    await app.listen(0, '127.0.0.1');
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

  describe('precompressed', () => {
    const asset = '/assets/index-3f9a1c2b.js';

    it('sends brotli to a client that accepts it, preferred over gzip; the bytes decode to the file', async () => {
      const res = await rawGet(app, asset, 'gzip, deflate, br');
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBe('br');
      expect(res.headers['content-type']).toMatch(/^text\/javascript; charset=utf-8$/i);
      expect(res.headers.vary).toMatch(/Accept-Encoding/i);
      expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
      const body = res.body;
      expect(body.length).toBeLessThan(js.length);
      expect(brotliDecompressSync(body).toString()).toBe(js);
    });

    it('sends gzip to a client that accepts only gzip', async () => {
      const res = await rawGet(app, asset, 'gzip');
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBe('gzip');
      expect(res.headers.vary).toMatch(/Accept-Encoding/i);
      expect(gunzipSync(res.body).toString()).toBe(js);
    });

    it('sends the file itself (identity) to a client that accepts neither', async () => {
      for (const accept of ['identity', '']) {
        const res = await rawGet(app, asset, accept);
        expect(res.status).toBe(200);
        expect(res.headers['content-encoding']).toBeUndefined();
        expect(res.headers.vary).toMatch(/Accept-Encoding/i);
        expect(res.body.toString()).toBe(js);
      }
    });

    it('sends index.html compressed at / and for a deep link, with the security headers and no-cache', async () => {
      for (const path of ['/', '/shops/kettle-ridge', '/workshop/requests?state=requested']) {
        const res = await rawGet(app, path, 'br');
        expect(res.status).toBe(200);
        expect(res.headers['content-encoding']).toBe('br');
        expect(res.headers['content-type']).toMatch(/^text\/html; charset=utf-8$/i);
        expect(res.headers.vary).toMatch(/Accept-Encoding/i);
        expect(res.headers['cache-control']).toBe('no-cache');
        expect(res.headers['content-security-policy']).toContain("default-src 'self'");
        expect(brotliDecompressSync(res.body).toString()).toBe(html);
      }
      const gz = await rawGet(app, '/appointments/x', 'gzip');
      expect(gz.status).toBe(200);
      expect(gz.headers['content-encoding']).toBe('gzip');
      expect(gunzipSync(gz.body).toString()).toBe(html);
    });

    it('sends a file without a compressed twin as it is', async () => {
      const res = await request(app.getHttpServer())
        .get('/assets/plain-0a1b2c3d.js')
        .set('Accept-Encoding', 'br, gzip')
        .expect(200);
      expect(res.headers['content-encoding']).toBeUndefined();
      expect(res.text).toBe('console.log(2)');
    });

    it('answers 404 for a missing asset, not index.html', async () => {
      const res = await request(app.getHttpServer()).get('/assets/gone-00000000.js').expect(404);
      expect(res.text).not.toContain('<title>Loamline</title>');
    });
  });
});
