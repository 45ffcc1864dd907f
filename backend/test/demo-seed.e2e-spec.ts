import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { seedDemo } from '../src/database/seeds/run-seed';
import { DEMO_RIDERS, DEMO_SHOPS } from '../src/database/seeds/demo-data';
import { createTestApp } from './utils/test-app';

/**
 * The demo seed that `npm start` runs, here against the test database: it creates the two shops,
 * their staff and two riders with a bike and a sheet, prints working sign-ins, and runs once.
 * (Its addresses and slugs are fixed; no other test uses them.)
 */
// the whole demo (shops, riders with real password hashes, payments at the fake) in one test:
// seconds on a quiet machine, more on a loaded one
jest.setTimeout(90_000);

describe('demo seed', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let dir: string;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    dir = mkdtempSync(join(tmpdir(), 'loamline-seed-'));
  });
  afterAll(async () => {
    await app.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('seeds once, writes sign-ins that work, and each rider has a bike and a sheet from the real model', async () => {
    const file = join(dir, 'demo-accounts.txt');
    const signIns = await seedDemo(app, file);
    expect(signIns).not.toBeNull();
    expect(signIns!.map((s) => s.role).sort()).toEqual([
      'owner',
      'owner',
      'rider',
      'rider',
      'technician',
      'technician',
    ]);
    expect(signIns!.every((s) => s.email.endsWith('example.test'))).toBe(true);
    expect(statSync(file).mode & 0o077).toBe(0); // readable by its owner only

    const text = readFileSync(file, 'utf8');
    const lines = text.trim().split('\n');
    expect(lines).toHaveLength(6);
    for (const s of signIns!) expect(text).toContain(`${s.email}`);

    // every printed sign-in works; staff land in their shop
    for (const line of lines) {
      const [role, email, password] = line.trim().split(/\s+/);
      const res = await request(http).post('/api/auth/sign-in').send({ email, password }).expect(200);
      expect(res.body.user.role).toBe(role);
      if (role !== 'rider') {
        const team = await request(http)
          .get('/api/workshop/team')
          .set('Authorization', `Bearer ${res.body.accessToken}`)
          .expect(200);
        const shop = DEMO_SHOPS.find((d) => d.staff.some((p) => p.email === email))!.shop;
        expect(team.body.shop).toMatchObject({ ...shop, id: expect.any(String) });
        if (role === 'owner') {
          // the demo's money was made at the payment fake: paid, a decline refunded in full, an expired hold cancelled
          const pay = await request(http)
            .get('/api/workshop/payments')
            .set('Authorization', `Bearer ${res.body.accessToken}`)
            .expect(200);
          const rows = pay.body.rows as {
            status: string;
            appointmentStatus: string;
            paidMinor: number;
            refundedMinor: number;
          }[];
          expect(rows.filter((r) => r.status === 'succeeded').length).toBeGreaterThanOrEqual(5);
          const declined = rows.find((r) => r.appointmentStatus === 'declined');
          if (declined) expect(declined.refundedMinor).toBe(declined.paidMinor);
          for (const r of rows.filter((x) =>
            ['requested', 'confirmed', 'completed'].includes(x.appointmentStatus),
          ))
            expect(r).toMatchObject({ status: 'succeeded', refundedMinor: 0 });
          expect(pay.body.totals.netMinor).toBe(pay.body.totals.paidMinor - pay.body.totals.refundedMinor);
        }
      } else {
        const auth = `Bearer ${res.body.accessToken}`;
        const rider = DEMO_RIDERS.find((r) => r.email === email)!;
        const bikes = await request(http).get('/api/bikes').set('Authorization', auth).expect(200);
        expect(bikes.body).toEqual([expect.objectContaining(rider.bike)]);
        const list = await request(http).get('/api/baseline-sheets').set('Authorization', auth).expect(200);
        expect(list.body).toHaveLength(1);
        const sheet = await request(http)
          .get(`/api/baseline-sheets/${list.body[0].id}`)
          .set('Authorization', auth);
        const computed = await request(http)
          .post('/api/baselines/compute')
          .send(rider.sheet.input)
          .expect(200);
        expect(sheet.body.result).toEqual(computed.body);
      }
    }

    // the second run finds everything and changes nothing
    expect(await seedDemo(app, file)).toBeNull();
    expect(readFileSync(file, 'utf8')).toBe(text);
    // without the file (passwords unknown) it hands out fresh passwords but makes no second copies
    rmSync(file);
    const again = await seedDemo(app, file);
    expect(again).toHaveLength(6);
    const rider = again!.find((s) => s.role === 'rider')!;
    const res = await request(http)
      .post('/api/auth/sign-in')
      .send({ email: rider.email, password: rider.password });
    expect(res.status).toBe(200);
    const list = await request(http)
      .get('/api/baseline-sheets')
      .set('Authorization', `Bearer ${res.body.accessToken}`)
      .expect(200);
    expect(list.body).toHaveLength(1);
  });
});
