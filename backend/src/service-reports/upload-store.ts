import { mkdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';

/**
 * Where uploaded bytes live, by generated key. The disk store below is the one we run; an object
 * store (S3 and the like) implements the same three calls.
 */
export interface UploadStore {
  /** Stores the bytes under a new key (never overwrites). */
  put(key: string, bytes: Buffer): Promise<void>;
  /** The bytes, or null when there is nothing under the key. */
  get(key: string): Promise<Buffer | null>;
  /** Removes the key; nothing under it is not an error. */
  delete(key: string): Promise<void>;
}

export const UPLOAD_STORE = Symbol('UPLOAD_STORE');

/** A key the app makes: random, lower-case, no path parts (`<uuid>.jpg`, `<uuid>-thumb.jpg`). */
const KEY = /^[a-z0-9][a-z0-9-]{0,150}\.[a-z0-9]{1,8}$/;

export function newStorageKey(ext: string, suffix = ''): string {
  return `${randomUUID()}${suffix}.${ext}`;
}

function checkKey(key: string): string {
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

  async put(key: string, bytes: Buffer): Promise<void> {
    const path = this.path(key);
    await (this.ready ??= mkdir(this.dir, { recursive: true, mode: 0o700 }));
    const tmp = join(this.dir, `.${randomUUID()}.part`);
    await writeFile(tmp, bytes, { flag: 'wx', mode: 0o600 });
    try {
      await rename(tmp, path);
    } catch (e) {
      await rm(tmp, { force: true });
      throw e;
    }
  }

  async get(key: string): Promise<Buffer | null> {
    try {
      return await readFile(this.path(key));
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw e;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.path(key), { force: true });
  }
}
