/**
 * Opt-in: `UPLOADS_STORE=s3 npm start` (or `npm test`) keeps uploads in an S3-compatible object
 * store instead of the disk. Unless S3_ENDPOINT names one of your own, a local S3-compatible
 * server from the npm registry (@20minutes/s3rver, backend/test/utils/s3-server-main.ts) is
 * started on 127.0.0.1 (`npm start`: port S3_PORT, default 4569, objects in .data/s3; tests: a
 * free port, objects in the run's .data/test-* folder), with a key pair derived from the local secrets, and the
 * app is pointed at it. Without UPLOADS_STORE=s3 nothing here runs.
 */
import type { ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { type Mode, type Secrets, log } from './common';
import { envPort, freePort } from './ports';
import { sleep, spawnOwned } from './processes';

export const LOCAL_S3_BUCKET = 'loamline-uploads';

/** `dataDir`: the run's data folder (.data for `npm start`, .data/test-* that tests delete after). */
export async function startLocalS3IfAsked(
  mode: Mode,
  env: NodeJS.ProcessEnv,
  secrets: Secrets,
  logs: string,
  dataDir: string,
  /** a port picked by the caller (the cluster picks below the ephemeral range) */
  givenPort?: number,
): Promise<ChildProcess | null> {
  if (env.UPLOADS_STORE !== 's3' || env.S3_ENDPOINT) return null;
  const port = givenPort ?? (mode === 'start' ? envPort('S3_PORT', 4569) : await freePort());
  const dir = join(dataDir, 's3');
  // local only: a key pair that stays the same across starts, derived from the local secrets
  const secret = createHash('sha256').update(`local-s3:${secrets.jwtSecret}`).digest('base64url');
  const keys = { S3_ACCESS_KEY_ID: 'loamline-local', S3_SECRET_ACCESS_KEY: secret };
  const child = spawnOwned(
    'S3 server',
    process.execPath,
    ['--import', 'tsx', 'backend/test/utils/s3-server-main.ts'],
    { ...env, ...keys, S3_PORT: String(port), S3_DIR: dir, S3_BUCKETS: LOCAL_S3_BUCKET },
    join(logs, 's3.log'),
  );
  const until = Date.now() + 30_000;
  for (;;) {
    // any HTTP answer means it listens (an unsigned request gets 403)
    const up = await fetch(`http://127.0.0.1:${port}/`, { signal: AbortSignal.timeout(2000) }).then(
      () => true,
      () => false,
    );
    if (up) break;
    if (child.exitCode !== null) throw new Error('the S3 server exited before it answered (see s3.log)');
    if (Date.now() > until) throw new Error('the S3 server did not answer within 30 s');
    await sleep(200);
  }
  Object.assign(env, keys, {
    S3_ENDPOINT: `http://127.0.0.1:${port}`,
    S3_REGION: env.S3_REGION || 'us-east-1',
    S3_BUCKET: env.S3_BUCKET || LOCAL_S3_BUCKET,
    S3_FORCE_PATH_STYLE: 'true',
    S3_CREATE_BUCKET: 'true',
  });
  log(`S3 server on 127.0.0.1:${port}, bucket ${env.S3_BUCKET} (objects in ${dir})`);
  return child;
}
