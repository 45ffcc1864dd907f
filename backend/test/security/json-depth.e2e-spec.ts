import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createTestApp } from '../utils/test-app';

/**
 * Finding 8: JSON nested a few thousand levels deep answered 500 and flooded the log with a
 * stack. It is now refused with 400 before validation touches it, and logs nothing.
 */
describe('security 8: deeply nested JSON', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  /** Counts what the process writes to stdout and stderr while `fn` runs. */
  async function logLines(fn: () => Promise<unknown>): Promise<number> {
    let lines = 0;
    const count = (chunk: unknown): boolean => {
      lines += String(chunk).split('\n').filter(Boolean).length;
      return true;
    };
    const out = jest.spyOn(process.stdout, 'write').mockImplementation(count);
    const err = jest.spyOn(process.stderr, 'write').mockImplementation(count);
    try {
      await fn();
    } finally {
      out.mockRestore();
      err.mockRestore();
    }
    return lines;
  }

  it.each([
    ['arrays', (n: number) => `${'['.repeat(n)}${']'.repeat(n)}`],
    ['objects', (n: number) => `${'{"a":'.repeat(n)}1${'}'.repeat(n)}`],
  ])('answers 400 for %s nested 5000 deep, with at most one log line', async (_what, body) => {
    for (const path of ['/api/baselines/compute', '/api/auth/sign-in']) {
      const lines = await logLines(async () => {
        const res = await request(http)
          .post(path)
          .set('Content-Type', 'application/json')
          .send(body(5000))
          .expect(400);
        expect(res.body).toEqual({
          statusCode: 400,
          error: 'Bad Request',
          message: expect.stringMatching(/nests deeper than 32/),
        });
      });
      expect(lines).toBeLessThanOrEqual(1);
    }
  });

  it('still takes ordinary nesting, and answers malformed or oversized JSON in the error shape', async () => {
    // 32 levels is fine as JSON (the DTO then refuses the unknown field, as for any body)
    const ok = await request(http)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send(`{"email":"a@example.test","password":"x","x":${'['.repeat(31)}${']'.repeat(31)}}`)
      .expect(400);
    expect(ok.body.fields).toHaveProperty('x');
    const bad = await request(http)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send('{"email":')
      .expect(400);
    expect(bad.body).toEqual({
      statusCode: 400,
      error: 'Bad Request',
      message: 'The body is not valid JSON.',
    });
    const big = await request(http)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@example.test', password: 'x'.repeat(200_000) }))
      .expect(413);
    expect(big.body.statusCode).toBe(413);
  });
});
