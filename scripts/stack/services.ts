/** Migrations, the demo seed, the fakes and the app: bring-up in order. */
import { type ChildProcess, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import {
  ARTIFACTS,
  DATA,
  DEMO_ACCOUNTS_FILE,
  type Mode,
  type Ports,
  ROOT,
  type Secrets,
  log,
  pkgFile,
} from './common';
import { run, sleep, spawnOwned } from './processes';
import { DB_MIGRATOR, DB_NAME, DB_USER, startMariaDb } from './mariadb';
import { buildAll } from './builds';
import { startLocalS3IfAsked } from './s3';

/* ------------------------------------------------------------------ services */

/** Runs pending migrations with the TypeORM CLI; its query log goes to a file, a summary to the console. */
export function migrate(backendDist: string, env: NodeJS.ProcessEnv, logFile: string): void {
  const cli = pkgFile('backend', 'typeorm', 'cli.js');
  const r = spawnSync(
    process.execPath,
    [cli, 'migration:run', '-d', join(backendDist, 'database', 'data-source.js')],
    {
      cwd: ROOT,
      env,
      encoding: 'utf8',
    },
  );
  const out = `${r.stdout}${r.stderr}`;
  writeFileSync(logFile, out);
  if (r.status !== 0) {
    console.error(out);
    throw new Error('migrations failed');
  }
  const ran = out.split('\n').filter((l) => /has been executed successfully/.test(l));
  log(
    ran.length
      ? `migrations: ${ran.length} run (${ran.map((l) => l.split(' ')[1]).join(', ')})`
      : 'migrations: none pending',
  );
}

export async function waitForHttp(
  name: string,
  url: string,
  child: ChildProcess,
  ms = 60_000,
): Promise<void> {
  const until = Date.now() + ms;
  for (;;) {
    try {
      const r = await fetch(url, { signal: AbortSignal.timeout(2000) });
      if (r.ok) return;
    } catch {
      /* not up yet */
    }
    if (child.exitCode !== null) throw new Error(`${name} exited before it answered ${url}`);
    if (Date.now() > until) throw new Error(`${name} did not answer ${url} within ${ms / 1000} s`);
    await sleep(250);
  }
}

export function appEnv(mode: Mode, ports: Ports, secrets: Secrets, frontendDist: string): NodeJS.ProcessEnv {
  const url = `http://127.0.0.1:${ports.app}`;
  return {
    ...process.env,
    NODE_ENV: mode === 'start' ? 'production' : 'test',
    APP_HOST: '127.0.0.1',
    APP_PORT: String(ports.app),
    APP_URL: url,
    DB_HOST: '127.0.0.1',
    DB_PORT: String(ports.db),
    DB_NAME,
    DB_USER,
    DB_PASSWORD: secrets.dbPassword,
    JWT_SECRET: secrets.jwtSecret,
    FRONTEND_DIST: frontendDist,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(ports.smtp),
    MAIL_WEB_PORT: String(ports.mailWeb),
    MAIL_URL: `http://127.0.0.1:${ports.mailWeb}`,
    PAYMENTS_HOST: '127.0.0.1',
    PAYMENTS_PORT: String(ports.payments),
    PAYMENTS_URL: `http://127.0.0.1:${ports.payments}`,
    PAYMENTS_PROTOCOL: 'http',
    PAYMENTS_SCRIPT_URL: `http://127.0.0.1:${ports.payments}/js/stripe.js`,
    PAYMENTS_WEBHOOK_SECRET: secrets.webhookSecret,
    PAYMENTS_WEBHOOK_URL: `${url}/api/payments/webhook`,
    DEMO_ACCOUNTS_FILE,
    // uploaded photos and curves: beside the data for `npm start`, a throw-away folder for tests
    UPLOADS_DIR: mode === 'start' ? join(DATA, 'uploads') : join(tmpdir(), `loamline-uploads-${ports.app}`),
    // `npm start` is a local stack: its OpenAPI page stays on, though NODE_ENV is production.
    ...(mode === 'start' ? { API_DOCS: 'true' } : {}),
  };
}

export async function bringUp(
  mode: Mode,
  datadir: string,
  ports: Ports,
  secrets: Secrets,
  frontendDist: string,
  backendDist: string,
): Promise<NodeJS.ProcessEnv> {
  const logs = mode === 'start' ? join(DATA, 'logs') : join(ARTIFACTS, 'logs');
  mkdirSync(logs, { recursive: true });
  buildAll(frontendDist, backendDist);
  const socket = await startMariaDb(datadir, ports.db, secrets);
  log(`MariaDB on 127.0.0.1:${ports.db}`);
  const env = appEnv(mode, ports, secrets, frontendDist);
  // opt-in: UPLOADS_STORE=s3 without an S3_ENDPOINT of your own starts a local S3 server (stack/s3.ts);
  // first, as everything that reads the app's config (migrations too) checks the S3_* settings
  await startLocalS3IfAsked(mode, env, secrets, logs, dirname(datadir));
  // Schema changes run as the migrator; the app (and the seed) only read and write rows.
  migrate(
    backendDist,
    { ...env, DB_USER: DB_MIGRATOR, DB_PASSWORD: secrets.dbMigratorPassword },
    join(logs, 'migrations.log'),
  );
  if (mode !== 'start') env.TEST_DB_SOCKET = socket;
  const tsxLoader = ['--import', 'tsx'];
  const payments = spawnOwned(
    'payments fake',
    process.execPath,
    [...tsxLoader, 'fakes/payments/src/main.ts'],
    {
      ...env,
      PORT: String(ports.payments),
      // `npm start` keeps the fake's payments next to the app's database; tests keep them in memory.
      PAYMENTS_STATE_FILE: mode === 'start' ? join(DATA, 'payments-fake.json') : '',
    },
    join(logs, 'payments.log'),
  );
  const mail = spawnOwned(
    'mail fake',
    process.execPath,
    [...tsxLoader, 'fakes/mail/src/main.ts'],
    { ...env, SMTP_PORT: String(ports.smtp), WEB_PORT: String(ports.mailWeb) },
    join(logs, 'mail.log'),
  );
  await waitForHttp('payments fake', `http://127.0.0.1:${ports.payments}/health`, payments);
  await waitForHttp('mail fake', `http://127.0.0.1:${ports.mailWeb}/health`, mail);
  // the seed makes the demo's payments at the payment fake, so it runs once the fakes are up
  const seed = join(backendDist, 'database', 'seeds', 'run-seed.js');
  if (mode === 'start' && existsSync(seed)) run(process.execPath, [seed], { env });
  const app = spawnOwned('app', process.execPath, [join(backendDist, 'main.js')], env, join(logs, 'app.log'));
  await waitForHttp('app', `http://127.0.0.1:${ports.app}/api/health`, app);
  return env;
}
