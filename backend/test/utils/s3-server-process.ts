import { type ChildProcess, spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { withBucketPathWithoutSlash } from '../../src/service-reports/s3-upload-store';
import { freePort } from './mail-fake-process';

const ROOT = join(__dirname, '..', '..', '..');

/**
 * A real S3-compatible server (@20minutes/s3rver, run by s3-server-main.ts) as a process of its
 * own on a fixed loopback port, with its objects in a temporary directory, so a test can stop it
 * (the store is down) and start it again on the same port with the same objects. Its key pair is
 * random per instance; `appEnv` gives the app's S3_* settings for it, `client` an S3 client for
 * looking into the bucket.
 */
export class S3ServerProcess {
  private child: ChildProcess | null = null;
  readonly accessKeyId = `test-${randomBytes(6).toString('hex')}`;
  readonly secretAccessKey = randomBytes(24).toString('base64url');
  readonly dir = mkdtempSync(join(tmpdir(), 'loamline-s3-'));

  constructor(
    readonly port: number,
    /** buckets made at every start (an existing one keeps its objects) */
    readonly buckets: string[] = [],
  ) {}

  static async onFreePort(buckets: string[] = []): Promise<S3ServerProcess> {
    return new S3ServerProcess(await freePort(), buckets);
  }

  get endpoint(): string {
    return `http://127.0.0.1:${this.port}`;
  }

  /** The app's settings for an S3 upload store in `bucket` on this server. */
  appEnv(bucket: string, more: Record<string, string> = {}): Record<string, string> {
    return {
      UPLOADS_STORE: 's3',
      S3_ENDPOINT: this.endpoint,
      S3_REGION: 'us-east-1',
      S3_BUCKET: bucket,
      S3_ACCESS_KEY_ID: this.accessKeyId,
      S3_SECRET_ACCESS_KEY: this.secretAccessKey,
      S3_FORCE_PATH_STYLE: 'true',
      S3_TIMEOUT_MS: '3000',
      ...more,
    };
  }

  /** Starts the server (once: a running one is left as it is) and waits for its "listening" line. */
  async start(): Promise<void> {
    if (this.child && this.child.exitCode === null) return;
    const child = spawn(process.execPath, ['--import', 'tsx', 'backend/test/utils/s3-server-main.ts'], {
      cwd: ROOT,
      env: {
        ...process.env,
        S3_PORT: String(this.port),
        S3_DIR: this.dir,
        S3_ACCESS_KEY_ID: this.accessKeyId,
        S3_SECRET_ACCESS_KEY: this.secretAccessKey,
        S3_BUCKETS: this.buckets.join(','),
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    this.child = child;
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`the S3 server did not start: ${err}`)), 20_000);
      let out = '';
      child.stdout.on('data', (d: Buffer) => {
        out += d.toString();
        if (out.includes('s3 server listening on')) {
          clearTimeout(timer);
          resolve();
        }
      });
      child.once('exit', (code) => {
        clearTimeout(timer);
        reject(new Error(`the S3 server exited (${code}): ${err}`));
      });
    });
  }

  async stop(): Promise<void> {
    const child = this.child;
    this.child = null;
    if (!child || child.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    });
  }

  /** Stops the server and removes its objects. */
  async dispose(): Promise<void> {
    await this.stop();
    rmSync(this.dir, { recursive: true, force: true });
  }

  /** An S3 client signed in to this server (for looking into buckets from a test). */
  client(): S3Client {
    return withBucketPathWithoutSlash(
      new S3Client({
        endpoint: this.endpoint,
        region: 'us-east-1',
        forcePathStyle: true,
        credentials: { accessKeyId: this.accessKeyId, secretAccessKey: this.secretAccessKey },
        requestChecksumCalculation: 'WHEN_REQUIRED',
        responseChecksumValidation: 'WHEN_REQUIRED',
      }),
    );
  }

  /** The keys in `bucket`, sorted. */
  async keys(bucket: string): Promise<string[]> {
    const client = this.client();
    try {
      const keys: string[] = [];
      let token: string | undefined;
      do {
        const res = await client.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
        keys.push(...(res.Contents ?? []).map((o) => o.Key!));
        token = res.IsTruncated ? res.NextContinuationToken : undefined;
      } while (token);
      return keys.sort();
    } finally {
      client.destroy();
    }
  }
}
