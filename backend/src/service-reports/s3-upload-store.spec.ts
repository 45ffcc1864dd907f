import { Readable } from 'node:stream';
import { HeadObjectCommand } from '@aws-sdk/client-s3';
import { S3ServerProcess } from '../../test/utils/s3-server-process';
import { S3UploadStore, type S3StoreSettings } from './s3-upload-store';
import { newStorageKey, UploadStoreError } from './upload-store';

/*
 * The S3 upload store against a real S3-compatible server (@20minutes/s3rver, its own process on a
 * free loopback port, signature V4 checked). Expected behaviour from the Amazon S3 API Reference:
 * PutObject stores Content-Type as the object's metadata and GetObject/HeadObject return it;
 * GetObject on a missing key is 404 NoSuchKey; DeleteObject on a missing key is 204 (no error);
 * a wrong secret is 403 SignatureDoesNotMatch; HeadBucket on a missing bucket is 404.
 */

const BUCKET = 'loamline-store-spec';

describe('S3UploadStore (real S3-compatible server)', () => {
  let server: S3ServerProcess;
  let store: S3UploadStore;
  const settings = (over: Partial<S3StoreSettings> = {}): S3StoreSettings => ({
    endpoint: server.endpoint,
    region: 'us-east-1',
    bucket: BUCKET,
    accessKeyId: server.accessKeyId,
    secretAccessKey: server.secretAccessKey,
    forcePathStyle: true,
    createBucket: false,
    timeoutMs: 3000,
    ...over,
  });
  const made: S3UploadStore[] = [];
  const storeWith = (over: Partial<S3StoreSettings> = {}) => {
    const s = new S3UploadStore(settings(over));
    made.push(s);
    return s;
  };

  beforeAll(async () => {
    server = await S3ServerProcess.onFreePort([BUCKET]);
    await server.start();
    store = storeWith();
  });
  afterAll(async () => {
    for (const s of made) s.onModuleDestroy();
    await server.dispose();
  });

  it('put, then get and open give the bytes back; the content type is stored with the object', async () => {
    const key = newStorageKey('png');
    const bytes = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 1, 2, 3, 255]);
    await store.put(key, bytes, 'image/png');
    expect(await server.keys(BUCKET)).toContain(key);

    expect(Buffer.compare((await store.get(key))!, bytes)).toBe(0);
    const o = (await store.open(key))!;
    expect(o.body).toBeInstanceOf(Readable); // streamed, not buffered by the store
    expect(o.length).toBe(bytes.length);
    expect(o.contentType).toBe('image/png');
    const chunks: Buffer[] = [];
    for await (const c of o.body) chunks.push(c as Buffer);
    expect(Buffer.compare(Buffer.concat(chunks), bytes)).toBe(0);

    // S3 API Reference, HeadObject: Content-Type as stored by PutObject
    const client = server.client();
    const head = await client.send(new HeadObjectCommand({ Bucket: BUCKET, Key: key }));
    client.destroy();
    expect(head).toMatchObject({ ContentType: 'image/png', ContentLength: bytes.length });
  });

  it('a missing key: get and open give null (NoSuchKey); delete is no error (204)', async () => {
    const key = newStorageKey('jpg');
    expect(await store.get(key)).toBeNull();
    expect(await store.open(key)).toBeNull();
    await expect(store.delete(key)).resolves.toBeUndefined();
  });

  it('delete removes the object', async () => {
    const key = newStorageKey('csv');
    await store.put(key, Buffer.from('travel_mm,force_N\n0,1\n'), 'text/csv');
    await store.delete(key);
    expect(await store.get(key)).toBeNull();
    expect(await server.keys(BUCKET)).not.toContain(key);
  });

  it('refuses a key the app does not make, before any request', async () => {
    await expect(store.put('../etc/passwd', Buffer.from('x'))).rejects.toThrow(/not a storage key/);
    await expect(store.open('Photo.JPG')).rejects.toThrow(/not a storage key/);
    await expect(store.delete('a/b.jpg')).rejects.toThrow(/not a storage key/);
  });

  it('a wrong secret is the store error (403 SignatureDoesNotMatch), for every call and the startup check', async () => {
    const wrong = storeWith({ secretAccessKey: 'not-the-secret' });
    const key = newStorageKey('jpg');
    await expect(wrong.put(key, Buffer.from('x'))).rejects.toThrow(UploadStoreError);
    await expect(wrong.put(key, Buffer.from('x'))).rejects.toThrow(/SignatureDoesNotMatch/);
    await expect(wrong.open(key)).rejects.toThrow(UploadStoreError);
    await expect(wrong.delete(key)).rejects.toThrow(UploadStoreError);
    await expect(wrong.checkBucket()).rejects.toThrow(/refused these credentials/);
    expect(await server.keys(BUCKET)).not.toContain(key);
  });

  it('startup check: ready; a missing bucket stops the boot unless S3_CREATE_BUCKET, which creates it', async () => {
    expect(await store.checkBucket()).toBe('ready');
    await expect(storeWith({ bucket: 'loamline-missing' }).checkBucket()).rejects.toThrow(
      /The upload bucket "loamline-missing" does not exist .* S3_CREATE_BUCKET=true/,
    );
    const creating = storeWith({ bucket: 'loamline-created', createBucket: true });
    expect(await creating.checkBucket()).toBe('created');
    expect(await creating.checkBucket()).toBe('ready');
    const key = newStorageKey('jpg');
    await creating.put(key, Buffer.from('x'), 'image/jpeg');
    expect(await server.keys('loamline-created')).toEqual([key]);
  });

  it('server down: every call is the store error, within the timeout; back up, the objects are still there', async () => {
    const key = newStorageKey('webp');
    await store.put(key, Buffer.from('kept across a restart'), 'image/webp');
    await server.stop();
    try {
      const started = Date.now();
      for (const call of [
        () => store.put(newStorageKey('jpg'), Buffer.from('x'), 'image/jpeg'),
        () => store.get(key),
        () => store.open(key),
        () => store.delete(key),
      ])
        await expect(call()).rejects.toThrow(UploadStoreError);
      expect(Date.now() - started).toBeLessThan(4 * 2 * 3000);
      expect(await store.checkBucket()).toBe('unreachable'); // the app boots, uploads answer 503
    } finally {
      await server.start();
    }
    expect((await store.get(key))!.toString()).toBe('kept across a restart');
    expect(await store.checkBucket()).toBe('ready');
  });
});
