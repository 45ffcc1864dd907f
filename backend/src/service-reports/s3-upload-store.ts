import { Readable } from 'node:stream';
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { checkKey, type StoredObject, type UploadStore, UploadStoreError } from './upload-store';

/** Where the S3 upload store keeps its objects and how it signs in (S3_* in env.validation.ts). */
export interface S3StoreSettings {
  /** An S3-compatible server's address; null: the provider's own endpoint for the region. */
  endpoint: string | null;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  /** `http://host/bucket/key` instead of `http://bucket.host/key` (most self-hosted servers want it). */
  forcePathStyle: boolean;
  /** Create the bucket at startup when it is not there (else a missing bucket stops the boot). */
  createBucket: boolean;
  /** How long one call to the store may take before it counts as down (ms). */
  timeoutMs: number;
}

/** What the startup check found (`checkBucket`). */
export type BucketCheck = 'ready' | 'created' | 'unreachable';

/**
 * The upload store in an S3-compatible object store (the S3 REST API: PutObject, GetObject,
 * DeleteObject, HeadBucket, CreateBucket), one object per generated key in one bucket. The
 * app's key pair needs s3:PutObject, s3:GetObject, s3:DeleteObject and s3:ListBucket on it
 * (without ListBucket, S3 answers a missing key with 403 instead of 404), s3:CreateBucket only
 * with S3_CREATE_BUCKET=true.
 *
 * - Objects are private: no ACL is sent, so the bucket's default (owner only) applies, and the app
 *   hands out no object URLs: every read goes through the app's own access checks and is streamed
 *   on from here.
 * - The content type is stored with the object (`Content-Type`).
 * - `put` sends `If-None-Match: *` (conditional write), so an existing key is never overwritten by
 *   a server that supports it; keys are random UUIDs in any case.
 * - Every failure but "no such key" becomes an `UploadStoreError` (the service's 503).
 */
export class S3UploadStore implements UploadStore {
  private readonly client: S3Client;

  constructor(private readonly settings: S3StoreSettings) {
    this.client = new S3Client({
      region: settings.region,
      ...(settings.endpoint ? { endpoint: settings.endpoint } : {}),
      forcePathStyle: settings.forcePathStyle,
      credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
      // checksums only where the API requires them: S3-compatible servers differ in their support
      // of the newer flexible-checksum headers (the SDK's default since 2025)
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      maxAttempts: 2,
      requestHandler: {
        connectionTimeout: Math.min(settings.timeoutMs, 3000),
        requestTimeout: settings.timeoutMs,
      },
    });
    if (settings.forcePathStyle) withBucketPathWithoutSlash(this.client);
  }

  get bucket(): string {
    return this.settings.bucket;
  }

  async put(key: string, bytes: Buffer, contentType = 'application/octet-stream'): Promise<void> {
    checkKey(key);
    try {
      await this.client.send(
        new PutObjectCommand({
          Bucket: this.settings.bucket,
          Key: key,
          Body: bytes,
          ContentLength: bytes.length,
          ContentType: contentType,
          IfNoneMatch: '*',
        }),
      );
    } catch (e) {
      throw new UploadStoreError(`could not store ${key} in bucket ${this.settings.bucket}: ${describe(e)}`, {
        cause: e,
      });
    }
  }

  async get(key: string): Promise<Buffer | null> {
    const o = await this.open(key);
    if (!o) return null;
    const chunks: Buffer[] = [];
    try {
      for await (const chunk of o.body) chunks.push(chunk as Buffer);
    } catch (e) {
      throw new UploadStoreError(
        `could not read ${key} from bucket ${this.settings.bucket}: ${describe(e)}`,
        {
          cause: e,
        },
      );
    }
    return Buffer.concat(chunks);
  }

  async open(key: string): Promise<StoredObject | null> {
    checkKey(key);
    try {
      const res = await this.client.send(new GetObjectCommand({ Bucket: this.settings.bucket, Key: key }));
      if (!(res.Body instanceof Readable))
        throw new Error('the S3 client gave no stream for the object (not Node.js?)');
      return {
        body: res.Body,
        length: res.ContentLength ?? 0,
        contentType: res.ContentType ?? null,
      };
    } catch (e) {
      if (isMissing(e)) return null;
      throw new UploadStoreError(
        `could not read ${key} from bucket ${this.settings.bucket}: ${describe(e)}`,
        {
          cause: e,
        },
      );
    }
  }

  /** S3's DELETE answers 204 for a key that is not there too. */
  async delete(key: string): Promise<void> {
    checkKey(key);
    try {
      await this.client.send(new DeleteObjectCommand({ Bucket: this.settings.bucket, Key: key }));
    } catch (e) {
      throw new UploadStoreError(
        `could not remove ${key} from bucket ${this.settings.bucket}: ${describe(e)}`,
        { cause: e },
      );
    }
  }

  /**
   * The startup check: the bucket is there and these credentials reach it (HeadBucket). A missing
   * bucket is created when S3_CREATE_BUCKET=true, else it is a configuration error (thrown, so the
   * boot stops with a message naming the bucket). An unreachable store is not: the app starts and
   * uploads answer 503 until the store is back.
   */
  async checkBucket(): Promise<BucketCheck> {
    const Bucket = this.settings.bucket;
    try {
      await this.client.send(new HeadBucketCommand({ Bucket }));
      return 'ready';
    } catch (e) {
      const status = httpStatus(e);
      if (status === 404 || errorName(e) === 'NoSuchBucket') {
        if (!this.settings.createBucket)
          throw new Error(
            `The upload bucket "${Bucket}" does not exist at ${this.where()}. Create it, or set S3_CREATE_BUCKET=true to let the app create it at startup.`,
            { cause: e },
          );
        try {
          await this.client.send(new CreateBucketCommand({ Bucket }));
        } catch (c) {
          if (!/BucketAlreadyOwnedByYou/.test(errorName(c)))
            throw new Error(`Could not create the upload bucket "${Bucket}": ${describe(c)}`, { cause: c });
        }
        return 'created';
      }
      if (status === 403 || status === 400 || status === 301)
        throw new Error(
          `The upload bucket "${Bucket}" at ${this.where()} refused these credentials or this region (HTTP ${status}: ${describe(e)}). Check S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY and S3_REGION.`,
          { cause: e },
        );
      return 'unreachable';
    }
  }

  /** Closes the client's connections (Nest calls it when the app closes). */
  onModuleDestroy(): void {
    this.client.destroy();
  }

  private where(): string {
    return this.settings.endpoint ?? `the provider's endpoint for ${this.settings.region}`;
  }
}

/**
 * Path style, a request on the bucket itself (HeadBucket, CreateBucket) goes to `/<bucket>`, not
 * `/<bucket>/` as the SDK writes it: S3 takes both, but some S3-compatible servers (s3rver among
 * them) compute the signature over `/<bucket>` and refuse the other with SignatureDoesNotMatch.
 * A build-step middleware, so it runs before signing and the signature covers the path sent.
 */
export function withBucketPathWithoutSlash(client: S3Client): S3Client {
  client.middlewareStack.add(
    (next) => (args) => {
      const request = args.request as { path?: unknown };
      if (typeof request.path === 'string' && /^\/[^/]+\/$/.test(request.path))
        request.path = request.path.slice(0, -1);
      return next(args);
    },
    { step: 'build', name: 'bucketPathWithoutSlash' },
  );
  return client;
}

const errorName = (e: unknown) => (e instanceof Error ? e.name : '');
const httpStatus = (e: unknown) =>
  e instanceof S3ServiceException ? e.$metadata?.httpStatusCode : undefined;
/** No such key (a missing bucket is an error of the store, not a missing file). */
const isMissing = (e: unknown) =>
  errorName(e) === 'NoSuchKey' || (httpStatus(e) === 404 && errorName(e) !== 'NoSuchBucket');
/** The error's name and message, without the request's details. */
function describe(e: unknown): string {
  if (!(e instanceof Error)) return String(e);
  const code = (e as NodeJS.ErrnoException).code;
  return `${e.name}${code && code !== e.name ? ` ${code}` : ''}: ${e.message}`;
}
