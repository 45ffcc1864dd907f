import type { INestApplication } from '@nestjs/common';
import { GetObjectCommand, HeadObjectCommand } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import request from 'supertest';
import { DataSource, EntityManager } from 'typeorm';
import type { Attachment } from '@loamline/shared-types';
import { AppointmentEntity } from '../src/appointments/appointment.entity';
import { ShopServiceEntity } from '../src/shop-services/shop-service.entity';
import { createShop, createUser, type TestUser } from './factories/accounts';
import { S3ServerProcess } from './utils/s3-server-process';
import { createTestApp } from './utils/test-app';

/*
 * The upload journey of service-reports.e2e-spec.ts once more with UPLOADS_STORE=s3: the real app
 * and MariaDB, and a real S3-compatible server (@20minutes/s3rver, its own process on a free
 * loopback port) in place of the disk. What S3 itself does is from the Amazon S3 API Reference
 * (PutObject keeps Content-Type; GetObject/HeadObject return it; a missing key is 404 NoSuchKey).
 */

const BUCKET = 'loamline-e2e-uploads';
const KEY = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}(-thumb)?\.(png|jpg|csv)$/;

describe('service-report uploads in an S3-compatible object store (UPLOADS_STORE=s3)', () => {
  let s3: S3ServerProcess;
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let db: DataSource;
  let shopId: string;
  let tech: TestUser;
  let rider: TestUser;
  let otherRider: TestUser;
  let otherStaff: TestUser;
  let service: ShopServiceEntity;
  let jpegWithExif: Buffer;

  const ws = (id: string) => `/api/workshop/appointments/${id}`;
  const get = (u: TestUser, url: string) =>
    request(http)
      .get(url)
      .set('Cookie', u.cookie)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
  const upload = (id: string, file: Buffer, filename: string, fields: Record<string, string>) => {
    let r = request(http)
      .post(`${ws(id)}/attachments`)
      .set('Cookie', tech.cookie);
    for (const [k, v] of Object.entries(fields)) r = r.field(k, v);
    return r.attach('file', file, { filename });
  };
  const photo = (id: string, file = jpegWithExif, name = 'fork.jpg') =>
    upload(id, file, name, { kind: 'photo' });
  const CSV = 'travel_mm,force_N\n0,100\n10,200\n5,150\n';
  const curve = (id: string) =>
    upload(id, Buffer.from(CSV), 'bench run.csv', {
      kind: 'curve',
      label: 'Fork at 85 psi, 2 spacers',
      part: 'fork',
      mainPsi: '85',
      spacers: '2',
    });
  const object = async (key: string) => {
    const client = s3.client();
    try {
      const res = await client.send(new GetObjectCommand({ Bucket: BUCKET, Key: key }));
      return { bytes: Buffer.from(await res.Body!.transformToByteArray()), contentType: res.ContentType };
    } finally {
      client.destroy();
    }
  };
  const keysOf = async (attachmentId: string) =>
    (
      await db.query<{ storage_key: string; thumbnail_key: string | null }[]>(
        'SELECT storage_key, thumbnail_key FROM appointment_attachments WHERE id = ?',
        [attachmentId],
      )
    ).flatMap((r) => [r.storage_key, ...(r.thumbnail_key ? [r.thumbnail_key] : [])]);
  const rows = async (id: string) =>
    Number(
      (
        await db.query<{ n: number }[]>(
          'SELECT COUNT(*) AS n FROM appointment_attachments WHERE appointment_id = ?',
          [id],
        )
      )[0].n,
    );

  async function appointment(): Promise<string> {
    const start = new Date(Date.now() - 60 * 60_000);
    const a = db.getRepository(AppointmentEntity).create({
      shopId,
      serviceId: service.id,
      riderId: rider.id,
      status: 'confirmed',
      startAt: start,
      endAt: new Date(start.getTime() + 60 * 60_000),
      keepUntil: new Date(start.getTime() + 60 * 60_000),
      bench: 1,
      priceMinor: 0,
      depositMinor: 0,
      currency: 'EUR',
      notes: '',
      bikeId: null,
      bikeSnapshot: null,
    });
    await db.getRepository(AppointmentEntity).insert(a);
    return a.id;
  }

  beforeAll(async () => {
    s3 = await S3ServerProcess.onFreePort(); // no bucket yet: the app creates it (S3_CREATE_BUCKET)
    await s3.start();
    app = await createTestApp(s3.appEnv(BUCKET, { S3_CREATE_BUCKET: 'true', UPLOADS_DIR: '/nonexistent' }));
    http = app.getHttpServer();
    db = app.get(DataSource);
    shopId = (await createShop(app)).id;
    tech = await createUser(app, { role: 'technician', shopId });
    rider = await createUser(app);
    otherRider = await createUser(app);
    otherStaff = await createUser(app, { role: 'owner' });
    const services = db.getRepository(ShopServiceEntity);
    service = await services.save(
      services.create({
        shopId,
        name: 'Fork lowers service',
        durationMinutes: 60,
        bufferAfterMinutes: 0,
        priceMinor: 0,
        depositMinor: 0,
        checklist: null,
      }),
    );
    // EXIF 2.32 (CIPA DC-008) tags, as a phone writes them; sharp reads them back as `exif`
    jpegWithExif = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#3a6' } })
      .jpeg()
      .withExif({ IFD0: { Copyright: 'a test camera owner', Make: 'TestCam' } })
      .toBuffer();
    expect((await sharp(jpegWithExif).metadata()).exif).toBeDefined();
  });
  afterAll(async () => {
    jest.restoreAllMocks();
    await app?.close();
    await s3?.dispose();
  });

  it('the app made the bucket at startup; a photo and a curve go into it under random keys, with their types, EXIF stripped', async () => {
    expect(await s3.keys(BUCKET)).toEqual([]);
    const id = await appointment();
    const pic = (await photo(id).expect(201)).body as Attachment;
    const run = (await curve(id).expect(201)).body as Attachment;
    const [key, thumbKey] = await keysOf(pic.id);
    const [csvKey] = await keysOf(run.id);
    for (const k of [key, thumbKey, csvKey]) expect(k).toMatch(KEY); // never the upload's name
    expect(await s3.keys(BUCKET)).toEqual([key, thumbKey, csvKey].sort());

    const stored = await object(key);
    expect(stored.contentType).toBe('image/jpeg');
    expect((await sharp(stored.bytes).metadata()).exif).toBeUndefined();
    expect((await object(thumbKey)).contentType).toBe('image/jpeg');
    const csv = await object(csvKey);
    expect(csv).toEqual({ bytes: Buffer.from(CSV), contentType: 'text/csv' });
    const client = s3.client();
    const head = await client.send(new HeadObjectCommand({ Bucket: BUCKET, Key: key }));
    client.destroy();
    expect(head.ContentLength).toBe(pic.sizeBytes);
  });

  it('staff and (once final) the rider read the files through the app, streamed from the bucket; others get 404', async () => {
    const id = await appointment();
    const pic = (await photo(id).expect(201)).body as Attachment;
    const run = (await curve(id).expect(201)).body as Attachment;
    const [key, thumbKey] = await keysOf(pic.id);

    const staffPic = await get(tech, pic.url).expect(200);
    expect(staffPic.headers['content-type']).toBe('image/jpeg');
    expect(staffPic.headers['x-content-type-options']).toBe('nosniff');
    expect(staffPic.headers['content-disposition']).toBe('inline; filename="fork.jpg"');
    expect(Number(staffPic.headers['content-length'])).toBe(pic.sizeBytes);
    expect(Buffer.compare(staffPic.body as Buffer, (await object(key)).bytes)).toBe(0);
    expect((await sharp(staffPic.body as Buffer).metadata()).exif).toBeUndefined();
    const thumb = await get(tech, pic.thumbnailUrl!).expect(200);
    expect(Buffer.compare(thumb.body as Buffer, (await object(thumbKey)).bytes)).toBe(0);
    expect((await get(tech, run.url).expect(200)).body.toString()).toBe(CSV);

    // while a draft: the rider gets 404; another shop's staff always
    await get(rider, `/api/appointments/${id}/attachments/${pic.id}`).expect(404);
    await get(otherStaff, pic.url).expect(404);

    await request(http)
      .post(`${ws(id)}/complete`)
      .set('Cookie', tech.cookie)
      .expect(200);
    const riderUrl = `/api/appointments/${id}/attachments/${pic.id}`;
    const mine = await get(rider, riderUrl).expect(200);
    expect(Buffer.compare(mine.body as Buffer, staffPic.body as Buffer)).toBe(0);
    await get(rider, `${riderUrl}?thumb=1`).expect(200).expect('Content-Type', 'image/jpeg');
    expect(
      (await get(rider, `/api/appointments/${id}/attachments/${run.id}`).expect(200)).body.toString(),
    ).toBe(CSV);
    await get(otherRider, riderUrl).expect(404);
    await get(otherStaff, pic.url).expect(404);
    await get(otherStaff, `${pic.url}?thumb=1`).expect(404);
  });

  it('a delete removes the objects; a refused upload leaves none, also when the row cannot be written after the put', async () => {
    const id = await appointment();
    const pic = (await photo(id).expect(201)).body as Attachment;
    const keys = await keysOf(pic.id);
    await request(http)
      .delete(`${ws(id)}/attachments/${pic.id}`)
      .set('Cookie', tech.cookie)
      .expect(204);
    const left = await s3.keys(BUCKET);
    for (const k of keys) expect(left).not.toContain(k);
    await get(tech, pic.url).expect(404);

    const before = await s3.keys(BUCKET);
    await photo(id, Buffer.from('just some text, not a picture\n'.repeat(20)), 'fork.jpg').expect(400);
    // the objects are put, then the row's INSERT fails (as a database that goes away would):
    // the upload fails and what was put is removed again
    const insert = jest
      .spyOn(EntityManager.prototype, 'insert')
      .mockRejectedValueOnce(new Error('the row could not be written'));
    await photo(id).expect(500);
    expect(insert).toHaveBeenCalled();
    insert.mockRestore();
    expect(await s3.keys(BUCKET)).toEqual(before);
    expect(await rows(id)).toBe(0);
  });

  it('store down: 503 "storage unavailable, nothing was saved", no row; reads and deletes 503 with nothing changed; back up, all works', async () => {
    const id = await appointment();
    const pic = (await photo(id).expect(201)).body as Attachment;
    const before = await s3.keys(BUCKET);
    await s3.stop();
    try {
      const res = await photo(id).expect(503);
      expect(res.body).toMatchObject({
        statusCode: 503,
        message:
          'Storage is unavailable right now. The file could not be stored, so nothing was saved. Try again in a few minutes.',
      });
      await curve(id).expect(503);
      expect(await rows(id)).toBe(1);
      const read = await get(tech, pic.url).expect(503);
      expect(JSON.parse(read.body.toString()).message).toMatch(
        /^Storage is unavailable right now\. The file cannot be shown/,
      );
      const del = await request(http)
        .delete(`${ws(id)}/attachments/${pic.id}`)
        .set('Cookie', tech.cookie)
        .expect(503);
      expect(del.body.message).toMatch(/could not be removed: it is still on the report/);
      expect(await rows(id)).toBe(1);
    } finally {
      await s3.start();
    }
    expect(await s3.keys(BUCKET)).toEqual(before);
    await get(tech, pic.url).expect(200);
    await request(http)
      .delete(`${ws(id)}/attachments/${pic.id}`)
      .set('Cookie', tech.cookie)
      .expect(204);
    await photo(id).expect(201);
    expect(await rows(id)).toBe(1);
  });
});
