/**
 * An S3-compatible server from the npm registry (@20minutes/s3rver: the S3 REST API with
 * signature V4 checks, objects as files under S3_DIR) as a process of its own, for tests and the
 * opt-in `UPLOADS_STORE=s3 npm start`. Env: S3_PORT, S3_DIR, S3_ACCESS_KEY_ID and
 * S3_SECRET_ACCESS_KEY (the only key pair it accepts; its built-in one is revoked), S3_BUCKETS
 * (comma-separated, made at start; optional). Listens on 127.0.0.1 only; prints one line
 * `s3 server listening on <port>` when ready; SIGINT/SIGTERM stop it with exit code 0.
 */
import { mkdirSync } from 'node:fs';
import S3rver from '@20minutes/s3rver';
import { DUMMY_ACCOUNT } from '@20minutes/s3rver/lib/models/account';

async function main(): Promise<void> {
  const need = (name: string) => {
    const v = process.env[name];
    if (!v) throw new Error(`${name} is required`);
    return v;
  };
  const accessKeyId = need('S3_ACCESS_KEY_ID');
  DUMMY_ACCOUNT.revokeAccessKey('S3RVER');
  DUMMY_ACCOUNT.createKeyPair(accessKeyId, need('S3_SECRET_ACCESS_KEY'));
  const directory = need('S3_DIR');
  mkdirSync(directory, { recursive: true, mode: 0o700 });
  const server = new S3rver({
    address: '127.0.0.1',
    port: Number(need('S3_PORT')),
    directory,
    silent: true,
    vhostBuckets: false,
    configureBuckets: (process.env.S3_BUCKETS ?? '')
      .split(',')
      .map((b) => b.trim())
      .filter(Boolean)
      .map((name) => ({ name })),
  });
  const { port } = await server.run();
  console.log(`s3 server listening on ${port}`);
  const stop = () => {
    server.close().then(
      () => process.exit(0),
      () => process.exit(0),
    );
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
