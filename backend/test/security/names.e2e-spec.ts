import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { nameProblem } from '../../src/common/dto/fields';
import { createUser, uniqueEmail } from '../factories/accounts';
import { createTestApp } from '../utils/test-app';

/**
 * Finding 13: names could be only zero-width characters, or hold NUL and direction overrides.
 * They are refused now wherever a name is given (account, bike, sheet).
 */
describe('security 13: names with nothing visible or with control characters', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
  });
  afterAll(async () => {
    await app.close();
  });

  const bad: [string, string][] = [
    ['only zero-width spaces', '\u200B\u200B\u200B'],
    ['only a zero-width joiner and a BOM', '\u200D\uFEFF\u200D'],
    ['a NUL', 'Sam\u0000'],
    ['a right-to-left override', 'Sam\u202Egnp.exe'],
    ['a direction isolate', '\u2067Sam\u2069'],
    ['a line break', 'Sam\nSmith'],
    ['a bell', 'Sam\u0007'],
  ];

  it.each(bad)('register refuses a name with %s (400, fields.name)', async (_what, name) => {
    const res = await request(http)
      .post('/api/auth/register')
      .send({ email: uniqueEmail('name'), password: 'a-long-enough-secret', name })
      .expect(400);
    expect(res.body.fields).toHaveProperty('name');
  });

  it.each(bad)('a bike name with %s is refused too', async (_what, name) => {
    const u = await createUser(app);
    const res = await request(http).post('/api/bikes').set('Cookie', u.cookie).send({ name }).expect(400);
    expect(res.body.fields).toHaveProperty('name');
  });

  it.each([
    ['accents', 'Crème brûlée crew'],
    ['a script that needs a zero-width non-joiner', 'می\u200Cخواهم'],
    ['an emoji with joiners', 'Trail crew 👩\u200D🔧'],
    ['Hangul', '산악자전거'],
  ])('takes names with %s', async (_what, name) => {
    expect(nameProblem(name)).toBeNull();
    const res = await request(http)
      .post('/api/auth/register')
      .send({ email: uniqueEmail('name'), password: 'a-long-enough-secret', name })
      .expect(201);
    expect(res.body.user.name).toBe(name.normalize('NFC'));
  });
});
