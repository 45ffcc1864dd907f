import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { INestApplication } from '@nestjs/common';
import sharp from 'sharp';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type { Attachment, ServiceReport, ShopService } from '@loamline/shared-types';
import { AppointmentEntity } from '../src/appointments/appointment.entity';
import { forkGeometry, modelCurve } from '../src/baselines/spring-model';
import { ShopServiceEntity } from '../src/shop-services/shop-service.entity';
import { DEFAULT_CHECKLIST } from '../src/service-reports/default-checklist';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { waitForMail } from './utils/mail-inbox';
import { createTestApp } from './utils/test-app';

/*
 * Service reports against the real app, MariaDB, the mail fake and a disk upload store in a temp
 * directory (UPLOADS_DIR): the draft, saves that race, completion (final + the rider's mail),
 * uploads refused with nothing stored, the curve's points, and who may see what.
 */

describe('service reports (real app, MariaDB, mail fake, disk upload store)', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let db: DataSource;
  let uploads: string;
  let shopId: string;
  let owner: TestUser;
  let tech: TestUser;
  let rider: TestUser;
  let otherRider: TestUser;
  let otherStaff: TestUser;
  let withList: ShopServiceEntity;
  let plain: ShopServiceEntity;
  let png: Buffer;

  const as = (u: TestUser) => ({
    get: (url: string) => request(http).get(url).set('Cookie', u.cookie),
    put: (url: string, body: object) => request(http).put(url).set('Cookie', u.cookie).send(body),
    post: (url: string) => request(http).post(url).set('Cookie', u.cookie),
    del: (url: string) => request(http).delete(url).set('Cookie', u.cookie),
  });
  const ws = (id: string) => `/api/workshop/appointments/${id}`;

  /** A confirmed appointment that started an hour ago (so it can be completed), straight in the database. */
  async function appointment(
    service = withList,
    riderId = rider.id,
    bikeId: string | null = null,
  ): Promise<string> {
    const start = new Date(Date.now() - 60 * 60_000);
    const a = db.getRepository(AppointmentEntity).create({
      shopId,
      serviceId: service.id,
      riderId,
      status: 'confirmed',
      startAt: start,
      endAt: new Date(start.getTime() + 60 * 60_000),
      keepUntil: new Date(start.getTime() + 60 * 60_000),
      bench: 1,
      priceMinor: 0,
      depositMinor: 0,
      currency: 'EUR',
      notes: '',
      bikeId,
      bikeSnapshot: bikeId ? { name: 'Trail bike', description: '150 mm air fork' } : null,
    });
    await db.getRepository(AppointmentEntity).insert(a);
    return a.id;
  }

  const upload = (
    u: TestUser,
    id: string,
    file: Buffer,
    filename: string,
    fields: Record<string, string>,
  ) => {
    let r = as(u).post(`${ws(id)}/attachments`);
    for (const [k, v] of Object.entries(fields)) r = r.field(k, v);
    return r.attach('file', file, { filename });
  };
  const photo = (id: string, file = png, filename = 'fork.png', u = tech) =>
    upload(u, id, file, filename, { kind: 'photo' });
  const curveFields = {
    kind: 'curve',
    label: 'Fork at 85 psi, 2 spacers',
    part: 'fork',
    mainPsi: '85',
    spacers: '2',
  };
  const curve = (id: string, text: string | Buffer, fields: Record<string, string> = curveFields) =>
    upload(tech, id, Buffer.isBuffer(text) ? text : Buffer.from(text), 'bench run.csv', fields);

  const storedFiles = () => readdirSync(uploads).sort();
  const rows = async (id: string) =>
    Number(
      (
        await db.query<{ n: number }[]>(
          'SELECT COUNT(*) AS n FROM appointment_attachments WHERE appointment_id = ?',
          [id],
        )
      )[0].n,
    );
  /** Runs `act`, expects the status and message, and that no row and no file was added. */
  async function refusedWithNothingStored(
    id: string,
    act: () => request.Test,
    status: number,
    message: RegExp,
  ) {
    const [filesBefore, rowsBefore] = [storedFiles(), await rows(id)];
    const res = await act();
    expect({ status: res.status, message: res.body.message }).toEqual({
      status,
      message: expect.stringMatching(message),
    });
    expect(storedFiles()).toEqual(filesBefore);
    expect(await rows(id)).toBe(rowsBefore);
    return res;
  }

  const draft = (version: number, over: Partial<ServiceReport> = {}) => ({
    version,
    checklist: [{ label: 'Dust wipers and foam rings replaced', done: true }],
    notes: 'Fork lowers serviced; shock air can serviced.',
    fork: {
      mainPsi: 82,
      endStrokePsi: null,
      spacers: 2,
      springRateLbPerIn: null,
      reboundClicks: 8,
      compressionClicks: 4,
      sagMm: 32,
    },
    shock: null,
    ...over,
  });

  beforeAll(async () => {
    uploads = mkdtempSync(join(tmpdir(), 'loamline-uploads-'));
    app = await createTestApp({ UPLOADS_STORE: 'disk', UPLOADS_DIR: uploads });
    http = app.getHttpServer();
    db = app.get(DataSource);
    const shop = await createShop(app);
    shopId = shop.id;
    owner = await createUser(app, { role: 'owner', shopId });
    tech = await createUser(app, { role: 'technician', shopId });
    rider = await createUser(app, { name: 'Test Rider' });
    otherRider = await createUser(app);
    otherStaff = await createUser(app, { role: 'owner' });
    const services = db.getRepository(ShopServiceEntity);
    const make = (name: string, checklist: string[] | null) =>
      services.save(
        services.create({
          shopId,
          name,
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 0,
          depositMinor: 0,
          checklist,
        }),
      );
    withList = await make('Fork lowers service', null);
    plain = await make('Shock air can service', null);
    png = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#3a6' } })
      .png()
      .toBuffer();
  });
  afterAll(async () => {
    await app.close();
    rmSync(uploads, { recursive: true, force: true });
  });

  it('an owner sets a service checklist; the first GET is an empty draft with it (else the default list)', async () => {
    const res = await request(http)
      .patch(`/api/workshop/services/${withList.id}`)
      .set('Cookie', owner.cookie)
      .send({ checklist: ['  Lowers off, fresh bath oil ', 'Sag measured on the bike'] })
      .expect(200);
    expect((res.body as ShopService).checklist).toEqual([
      'Lowers off, fresh bath oil',
      'Sag measured on the bike',
    ]);
    await request(http)
      .patch(`/api/workshop/services/${withList.id}`)
      .set('Cookie', owner.cookie)
      .send({ checklist: ['x'.repeat(121)] })
      .expect(400);

    const report = (
      await as(tech)
        .get(`${ws(await appointment())}/report`)
        .expect(200)
    ).body as ServiceReport;
    expect(report).toMatchObject({ status: 'draft', version: 0, notes: '', fork: null, shock: null });
    expect(report.checklist).toEqual([
      { label: 'Lowers off, fresh bath oil', done: false },
      { label: 'Sag measured on the bike', done: false },
    ]);
    const other = (
      await as(tech)
        .get(`${ws(await appointment(plain))}/report`)
        .expect(200)
    ).body as ServiceReport;
    expect(other.checklist.map((c) => c.label)).toEqual(DEFAULT_CHECKLIST);
  });

  it('saves the draft, refuses out-of-range values, and refuses the loser of two saves at once (409)', async () => {
    const id = await appointment();
    const saved = (
      await as(tech)
        .put(`${ws(id)}/report`, draft(0))
        .expect(200)
    ).body as ServiceReport;
    expect(saved).toMatchObject({
      version: 1,
      status: 'draft',
      notes: draft(0).notes,
      updatedBy: 'Test technician',
    });
    expect(saved.fork).toEqual(draft(0).fork);

    const bad = await as(tech)
      .put(`${ws(id)}/report`, {
        ...draft(1),
        notes: 'n'.repeat(4001),
        fork: { ...draft(1).fork, mainPsi: 1001, reboundClicks: 2.5, sagMm: -1 },
      })
      .expect(400);
    expect(Object.keys(bad.body.fields as object).sort()).toEqual(
      ['fork.mainPsi', 'fork.reboundClicks', 'fork.sagMm', 'notes'].sort(),
    );
    await as(tech)
      .put(`${ws(id)}/report`, {
        ...draft(1),
        checklist: Array.from({ length: 41 }, () => ({ label: 'x', done: false })),
      })
      .expect(400);

    // two technicians save from version 1 at once: one wins, the other is told, nothing is lost silently
    const [a, b] = await Promise.all([
      as(tech).put(`${ws(id)}/report`, draft(1, { notes: 'from the first technician' })),
      as(owner).put(`${ws(id)}/report`, draft(1, { notes: 'from the second technician' })),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.message).toMatch(/Someone else saved this report since you opened it/);
    const now = (
      await as(tech)
        .get(`${ws(id)}/report`)
        .expect(200)
    ).body as ServiceReport;
    expect(now.version).toBe(2);
    expect(now.notes).toBe((a.status === 200 ? a : b).body.notes);
    // a stale save later is refused too; two first saves at once as well
    await as(tech)
      .put(`${ws(id)}/report`, draft(1))
      .expect(409);
    const fresh = await appointment();
    const firsts = await Promise.all([
      as(tech).put(`${ws(fresh)}/report`, draft(0)),
      as(owner).put(`${ws(fresh)}/report`, draft(0)),
    ]);
    expect(firsts.map((r) => r.status).sort()).toEqual([200, 409]);
  });

  it('photos: checked by content, thumbnail, random stored names, the name cleaned; deleted with their bytes', async () => {
    const id = await appointment();
    const before = storedFiles();
    const res = await photo(id, png, 'C:\\Users\\x\\..\\fork.png').expect(201);
    const att = res.body as Attachment;
    expect(att).toMatchObject({
      kind: 'photo',
      name: 'fork.png',
      contentType: 'image/png',
      sizeBytes: png.length,
    });
    expect(att.thumbnailUrl).toBe(`${att.url}?thumb=1`);
    const added = storedFiles().filter((f) => !before.includes(f));
    expect(added).toHaveLength(2);
    for (const f of added) expect(f).toMatch(/^[0-9a-f-]{36}(-thumb)?\.(png|jpg)$/); // never the upload's name

    const file = await as(tech).get(att.url).expect(200);
    expect(file.headers['content-type']).toBe('image/png');
    expect(file.headers['x-content-type-options']).toBe('nosniff');
    expect(file.headers['content-disposition']).toBe('inline; filename="fork.png"');
    expect(Buffer.compare(file.body as Buffer, png)).toBe(0);
    const thumb = await as(tech).get(att.thumbnailUrl!).expect(200);
    expect(thumb.headers['content-type']).toBe('image/jpeg');
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(meta).toMatchObject({ format: 'jpeg', width: 320, height: 240 });

    // a path in the name (as a browser never sends, a script might): the base is kept
    const pathy = await photo(id, png, '../../x.png').expect(201);
    expect((pathy.body as Attachment).name).toBe('x.png');

    await as(tech)
      .del(`${ws(id)}/attachments/${att.id}`)
      .expect(204);
    await as(tech).get(att.url).expect(404);
    expect(storedFiles().filter((f) => added.includes(f))).toEqual([]);
  });

  it('refuses, with nothing stored: a text file named .jpg, a photo over 8 MB, the 7th photo (also two at once at 5)', async () => {
    const id = await appointment();
    await refusedWithNothingStored(
      id,
      () => photo(id, Buffer.from('just some text, not a picture\n'.repeat(20)), 'fork.jpg'),
      400,
      /^The photo was refused: this file is not a JPEG, PNG or WebP picture/,
    );
    // starts like a PNG but is not one
    await refusedWithNothingStored(
      id,
      () => photo(id, Buffer.concat([png.subarray(0, 40), Buffer.alloc(200)]), 'broken.png'),
      400,
      /^The photo was refused: this picture could not be read/,
    );
    await refusedWithNothingStored(
      id,
      () => photo(id, Buffer.concat([png, Buffer.alloc(8 * 1024 * 1024)]), 'huge.png'),
      413,
      /^The file is larger than 8 MB, the most a photo may be/,
    );

    for (let i = 0; i < 6; i++) await photo(id).expect(201);
    await refusedWithNothingStored(id, () => photo(id), 409, /already has 6 photos, the most it can hold/);

    const racing = await appointment();
    for (let i = 0; i < 5; i++) await photo(racing).expect(201);
    const files = storedFiles().length;
    const [a, b] = await Promise.all([photo(racing), photo(racing)]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    expect(await rows(racing)).toBe(6);
    expect(storedFiles().length).toBe(files + 2); // the winner's photo and thumbnail only
  });

  it('curves: the run holds the rows converted to mm and N; in/lbf converted with the exact factors', async () => {
    const id = await appointment();
    const rowsMm = [
      [0, 120],
      [20, 260.5],
      [40, 410],
      [60, 700],
      [50, 560],
      [30, 320],
      [10, 150],
    ];
    const text = `travel_mm,force_N\n${rowsMm.map((r) => r.join(',')).join('\n')}\n`;
    const att = (await curve(id, text).expect(201)).body as Attachment;
    expect(att).toMatchObject({
      kind: 'curve',
      name: 'bench run.csv',
      contentType: 'text/csv',
      thumbnailUrl: null,
    });
    expect(att.run).toMatchObject({
      label: 'Fork at 85 psi, 2 spacers',
      settings: { part: 'fork', mainPsi: 85, endStrokePsi: null, spacers: 2 },
      units: { travel: 'mm', force: 'N' },
      comparison: null,
    });
    expect(att.run!.points).toEqual(
      rowsMm.map(([t, f], i) => ({ travelMm: t, forceN: f, stroke: i <= 3 ? 'compression' : 'rebound' })),
    );
    const raw = await as(tech).get(att.url).expect(200);
    expect(raw.text).toBe(text);

    // 1 in = 25.4 mm and 1 lbf = 4.4482216152605 N exactly (NIST SP 811, appendix B.8)
    const inch = (
      await curve(
        id,
        'Travel (in),Force (lbf),Direction\n0,20,compression\n1.5,90,compression\n1.5,80,rebound\n0.25,25,rebound\n',
        {
          ...curveFields,
          label: 'Shock at 180 psi',
          part: 'shock',
          mainPsi: '180',
          endStrokePsi: '210',
          spacers: '0',
        },
      ).expect(201)
    ).body as Attachment;
    expect(inch.run!.units).toEqual({ travel: 'in', force: 'lbf' });
    expect(inch.run!.settings).toEqual({ part: 'shock', mainPsi: 180, endStrokePsi: 210, spacers: 0 });
    const expected = [
      [0, 20],
      [1.5, 90],
      [1.5, 80],
      [0.25, 25],
    ];
    inch.run!.points.forEach((p, i) => {
      expect(p.travelMm).toBeCloseTo(expected[i][0] * 25.4, 10);
      expect(p.forceN).toBeCloseTo(expected[i][1] * 4.4482216152605, 10);
    });
    // the report lists both, with their runs
    const report = (
      await as(tech)
        .get(`${ws(id)}/report`)
        .expect(200)
    ).body as ServiceReport;
    expect(report.attachments.map((a) => a.run?.label)).toEqual([
      'Fork at 85 psi, 2 spacers',
      'Shock at 180 psi',
    ]);
  });

  it("a curve on an appointment with the rider's bike is read against the model of that bike", async () => {
    const bike = (
      await request(http)
        .post('/api/bikes')
        .set('Cookie', rider.cookie)
        .send({ name: 'Trail bike', fork: { travelMm: 150, stanchionMm: 36, spring: 'air', spacers: 1 } })
        .expect(201)
    ).body as { id: string };
    const id = await appointment(withList, rider.id, bike.id);
    // the model's own curve for the default geometry, 20 N of friction, no noise: measured = model
    const travels = Array.from({ length: 29 }, (_, i) => i * 5);
    const m = modelCurve({
      part: 'fork',
      known: { travelMm: 150, stanchionMm: 36 },
      geometry: forkGeometry(36, 150, false).geometry,
      frictionN: 20,
      mainPsi: 85,
      endStrokePsi: null,
      spacers: 2,
      travelsMm: travels,
    });
    const lines = [
      ...m.map((p) => `${p.travelMm},${p.compressionN}`),
      ...[...m].reverse().map((p) => `${p.travelMm},${p.reboundN}`),
    ];
    await curve(id, `travel_mm,force_N\n${lines.join('\n')}\n`).expect(201);
    const report = (
      await as(tech)
        .get(`${ws(id)}/report`)
        .expect(200)
    ).body as ServiceReport;
    const c = report.attachments[0].run!.comparison!;
    expect(c).not.toBeNull();
    expect(Math.abs(c.measuredAtSagN - c.modelAtSagN)).toBeLessThan(1);
    expect(Math.abs(c.measuredAtEndN - c.modelAtEndN)).toBeLessThan(1);
    expect(c.frictionBandN).toBeCloseTo(20, 6);
    expect(c.bumpStopMm).toBeNull();
    expect(c.model.map((p) => p.travelMm)).toEqual(travels);
  });

  it('refuses bad curves with the line and nothing stored: text in a number, travel backwards, over 1 MB, unknown header, no settings', async () => {
    const id = await appointment();
    await refusedWithNothingStored(
      id,
      () => curve(id, 'travel_mm,force_N\n0,100\n10,200\n20,3OO\n'),
      400,
      /^The curve file was refused: line 4: force is not a number \("3OO"\)/,
    );
    await refusedWithNothingStored(
      id,
      () => curve(id, 'travel_mm,force_N\n0,100\n20,300\n40,500\n30,420\n35,450\n'),
      400,
      /^The curve file was refused: line 6: travel goes backwards within the rebound stroke that began on line 5/,
    );
    const big = `travel_mm,force_N\n${Array.from({ length: 100_000 }, (_, i) => `${(i / 1000).toFixed(3)},${i}`).join('\n')}\n`;
    expect(big.length).toBeGreaterThan(1024 * 1024);
    await refusedWithNothingStored(id, () => curve(id, big), 413, /^The curve file is larger than 1 MB/);
    await refusedWithNothingStored(
      id,
      () => curve(id, 'position,load\n0,1\n1,2\n'),
      400,
      /^The curve file was refused: line 1: unknown column "position"; the first line must name the columns with their units/,
    );
    const res = await refusedWithNothingStored(
      id,
      () => curve(id, 'travel_mm,force_N\n0,1\n1,2\n', { kind: 'curve' }),
      400,
      /label: .*part: .*mainPsi: .*spacers: /,
    );
    expect(Object.keys(res.body.fields as object).sort()).toEqual(['label', 'mainPsi', 'part', 'spacers']);
    await refusedWithNothingStored(
      id,
      () => curve(id, 'travel_mm,force_N\n0,1\n1,2\n', { ...curveFields, mainPsi: '1001', spacers: 'two' }),
      400,
      /mainPsi|spacers/,
    );
  });

  it('multipart only on the upload route, and still same-origin only', async () => {
    const id = await appointment();
    await refusedWithNothingStored(
      id,
      () => photo(id).set('Origin', 'https://elsewhere.example').set('Sec-Fetch-Site', 'cross-site'),
      403,
      /came from another site/,
    );
    await refusedWithNothingStored(
      id,
      () => photo(id).set('Sec-Fetch-Site', 'same-site'),
      403,
      /another site/,
    );
    // the report's PUT takes JSON only
    await request(http)
      .put(`${ws(id)}/report`)
      .set('Cookie', tech.cookie)
      .field('version', '0')
      .expect(415);
    await request(http)
      .post(`${ws(id)}/attachments`)
      .set('Cookie', tech.cookie)
      .set('Content-Type', 'text/plain')
      .send('kind=photo')
      .expect(415);
  });

  it('completing makes the report final and mails the rider the link; then the rider sees it and its files', async () => {
    const id = await appointment();
    await as(tech)
      .put(`${ws(id)}/report`, draft(0))
      .expect(200);
    const pic = (await photo(id).expect(201)).body as Attachment;
    const run = (await curve(id, 'travel_mm,force_N\n0,100\n10,200\n5,150\n').expect(201)).body as Attachment;

    // while a draft: the rider (and everyone but the shop's staff) gets 404
    await as(rider).get(`/api/appointments/${id}/report`).expect(404);
    await as(rider).get(`/api/appointments/${id}/attachments/${pic.id}`).expect(404);

    await as(tech)
      .post(`${ws(id)}/complete`)
      .expect(200);
    const final = (
      await as(tech)
        .get(`${ws(id)}/report`)
        .expect(200)
    ).body as ServiceReport;
    expect(final.status).toBe('final');
    expect(final.completedAt).not.toBeNull();
    await as(tech)
      .put(`${ws(id)}/report`, draft(final.version))
      .expect(409);
    const late = await refusedWithNothingStored(id, () => photo(id), 409, /This report is final/);
    expect(late.body.message).toMatch(/can no longer be changed/);
    await as(tech)
      .del(`${ws(id)}/attachments/${pic.id}`)
      .expect(409);

    const [mail] = await waitForMail(rider.email);
    expect(mail.subject).toMatch(/^Your service report from Test Shop/);
    const link = mail.links.find((l) => new URL(l).pathname === `/appointments/${id}`);
    expect(link).toBe(`${process.env.APP_URL}/appointments/${id}`);
    expect(mail.text).toContain(`/appointments/${id}`);

    const mine = (await as(rider).get(`/api/appointments/${id}/report`).expect(200)).body as ServiceReport;
    expect(mine).toMatchObject({ status: 'final', notes: draft(0).notes, fork: draft(0).fork });
    const riderPic = mine.attachments.find((a) => a.id === pic.id)!;
    expect(riderPic.url).toBe(`/api/appointments/${id}/attachments/${pic.id}`);
    expect(mine.attachments.find((a) => a.id === run.id)!.run!.points).toHaveLength(3);
    const bytes = await as(rider).get(riderPic.url).expect(200);
    expect(bytes.headers['content-type']).toBe('image/png');
    expect(bytes.headers['x-content-type-options']).toBe('nosniff');
    await as(rider).get(riderPic.thumbnailUrl!).expect(200).expect('Content-Type', 'image/jpeg');

    // another rider and another shop's staff: 404 on the report and the files, as for nothing
    await as(otherRider).get(`/api/appointments/${id}/report`).expect(404);
    await as(otherRider).get(riderPic.url).expect(404);
    await as(otherStaff)
      .get(`${ws(id)}/report`)
      .expect(404);
    await as(otherStaff)
      .get(`${ws(id)}/attachments/${pic.id}`)
      .expect(404);
    await as(otherStaff)
      .get(`${ws(id)}/attachments/${pic.id}?thumb=1`)
      .expect(404);
  });

  it("another shop's staff get 404 on a draft's report, saves, uploads and deletes", async () => {
    const id = await appointment();
    const pic = (await photo(id).expect(201)).body as Attachment;
    await as(otherStaff)
      .get(`${ws(id)}/report`)
      .expect(404);
    await as(otherStaff)
      .put(`${ws(id)}/report`, draft(0))
      .expect(404);
    await refusedWithNothingStored(id, () => photo(id, png, 'x.png', otherStaff), 404, /No such appointment/);
    await as(otherStaff)
      .del(`${ws(id)}/attachments/${pic.id}`)
      .expect(404);
    await as(otherStaff).get(pic.url).expect(404);
    await as(otherRider).get(`/api/appointments/${id}/report`).expect(404);
    expect(await rows(id)).toBe(1);
  });
});
