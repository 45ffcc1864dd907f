import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createTestApp } from './utils/test-app';

/**
 * docs/api/openapi.json is the OpenAPI document the server serves at /api/docs-json, kept in the
 * repository so the API can be read without starting anything. This test fails when a route changes
 * and the file was not refreshed: `npm run docs:api` writes it anew.
 */
const FILE = join(__dirname, '..', '..', 'docs', 'api', 'openapi.json');

describe('docs/api/openapi.json', () => {
  let app: INestApplication;
  beforeAll(async () => {
    app = await createTestApp();
  });
  afterAll(async () => {
    await app.close();
  });

  it('is the document the server serves', async () => {
    const res = await request(app.getHttpServer()).get('/api/docs-json').expect(200);
    expect(res.body.openapi).toMatch(/^3\./); // OpenAPI 3.x
    const served = `${JSON.stringify(res.body, null, 2)}\n`;
    if (process.env.UPDATE_OPENAPI === '1') writeFileSync(FILE, served);
    expect(existsSync(FILE)).toBe(true);
    expect(readFileSync(FILE, 'utf8')).toBe(served);
  });
});
