import { createReadStream } from 'node:fs';
import { mkdir, open, readFile, rename, rm, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';

/** An object as a reader gets it: its bytes as a stream, their count and (where kept) its type. */
export interface StoredObject {
  body: Readable;
  length: number;
  contentType: string | null;
}

/**
 * Where uploaded bytes live, by generated key: on a local disk (`DiskUploadStore`, the default)
 * or in an S3-compatible object store (`S3UploadStore`, s3-upload-store.ts), chosen by
 * UPLOADS_STORE. A store that cannot be reached throws `UploadStoreError`, which the service
 * answers with a 503 (docs/service-reports.md).
 */
export interface UploadStore {
  /** Stores the bytes under a new key (never overwrites), with their type where the store keeps one. */
  put(key: string, bytes: Buffer, contentType?: string): Promise<void>;
  /** The bytes, or null when there is nothing under the key. */
  get(key: string): Promise<Buffer | null>;
  /** The object as a stream (to send on without holding it in memory), or null when there is none. */
  open(key: string): Promise<StoredObject | null>;
  /** Removes the key; nothing under it is not an error. */
  delete(key: string): Promise<void>;
}

export const UPLOAD_STORE = Symbol('UPLOAD_STORE');

/** The store could not do what was asked (unreachable, refused, out of space); `cause` says why. */
export class UploadStoreError extends Error {
  override readonly name = 'UploadStoreError';
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
  }
}

/** A key the app makes: random, lower-case, no path parts (`<uuid>.jpg`, `<uuid>-thumb.jpg`). */
const KEY = /^[a-z0-9][a-z0-9-]{0,150}\.[a-z0-9]{1,8}$/;

export function newStorageKey(ext: string, suffix = ''): string {
  return `${randomUUID()}${suffix}.${ext}`;
}

export function checkKey(key: string): string {
  if (!KEY.test(key)) throw new Error(`not a storage key: ${JSON.stringify(key)}`);
  return key;
}

/**
 * The upload store on a local disk (UPLOADS_DIR, outside the web root): one file per key, written
 * to a temporary name first and renamed, so a reader never sees half a file.
 */
export class DiskUploadStore implements UploadStore {
  private ready: Promise<unknown> | null = null;

  constructor(private readonly dir: string) {}

  private path(key: string): string {
    return join(this.dir, checkKey(key));
  }

  /** The type is not kept on disk: the attachment's row has it. */
  async put(key: string, bytes: Buffer): Promise<void> {
    const path = this.path(key);
    try {
      await (this.ready ??= mkdir(this.dir, { recursive: true, mode: 0o700 }));
      const tmp = join(this.dir, `.${randomUUID()}.part`);
      await writeFile(tmp, bytes, { flag: 'wx', mode: 0o600 });
      try {
        await rename(tmp, path);
      } catch (e) {
        await rm(tmp, { force: true });
        throw e;
      }
    } catch (e) {
      this.ready = null; // the folder may have gone: make it again next time
      throw new UploadStoreError(`could not write ${key} to ${this.dir}`, { cause: e });
    }
  }

  async get(key: string): Promise<Buffer | null> {
    const path = this.path(key);
    try {
      return await readFile(path);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw new UploadStoreError(`could not read ${key} from ${this.dir}`, { cause: e });
    }
  }

  async open(key: string): Promise<StoredObject | null> {
    const path = this.path(key);
    try {
      const handle = await open(path, 'r');
      const size = await handle.stat().then(
        (st) => st.size,
        async (e: unknown) => {
          await handle.close();
          throw e;
        },
      );
      // the stream owns the handle from here (closes it at the end or on an error)
      return { body: createReadStream(path, { fd: handle }), length: size, contentType: null };
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw new UploadStoreError(`could not read ${key} from ${this.dir}`, { cause: e });
    }
  }

  async delete(key: string): Promise<void> {
    const path = this.path(key);
    try {
      await rm(path, { force: true });
    } catch (e) {
      throw new UploadStoreError(`could not remove ${key} from ${this.dir}`, { cause: e });
    }
  }
}
