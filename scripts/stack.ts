/**
 * The bring-up behind `npm start`, `npm test` and `npm run bench` (scripts/run.sh installs what is
 * missing, then runs this file). It starts a private MariaDB inside the project, the payment and
 * mail fakes and the app, as plain processes it owns, and stops every one of them by PID on
 * Ctrl-C, SIGTERM or when the tests are done.
 *
 *   start  ports from the environment or the defaults, data in .data/mariadb (kept)
 *   test   free ports, a throw-away data directory, every test layer, then tear-down
 *   bench  like test, then the benchmarks (scripts/bench.ts)
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import {
  existsSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  readdirSync,
  rmSync,
  statSync,
  writeFileSync,
  openSync,
  chmodSync,
} from 'node:fs';
import { createServer } from 'node:net';
import { basename, join, relative, resolve } from 'node:path';

type Mode = 'start' | 'test' | 'bench';

const ROOT = resolve(__dirname, '..');
const DATA = join(ROOT, '.data');
const ARTIFACTS = join(ROOT, 'artifacts');
/** The demo seed writes the demo sign-ins here; the start command prints them. */
const DEMO_ACCOUNTS_FILE = join(DATA, 'demo-accounts.txt');

/** The path of a file inside an installed package, whatever its `exports` allow. */
function pkgFile(from: string, pkg: string, file: string): string {
  for (const base of [join(ROOT, from), ROOT]) {
    const dir = join(base, 'node_modules', pkg);
    if (existsSync(join(dir, 'package.json'))) return join(dir, file);
  }
  throw new Error(`${pkg} is not installed (looked from ${from}); run npm ci`);
}

const log = (msg: string): void => console.log(`loamline: ${msg}`);

interface Ports {
  app: number;
  db: number;
  payments: number;
  smtp: number;
  mailWeb: number;
}

interface Secrets {
  /** the app's MariaDB user (SELECT, INSERT, UPDATE, DELETE on its schema only) */
  dbPassword: string;
  /** the migrations' MariaDB user (DDL on the app's schema only) */
  dbMigratorPassword: string;
  /** MariaDB's root, reachable only through the owner-only socket */
  dbRootPassword: string;
  jwtSecret: string;
  webhookSecret: string;
}

/* ------------------------------------------------------------------ processes we own */

interface Owned {
  name: string;
  child: ChildProcess;
}

const owned: Owned[] = [];
let mariadbPidFile: string | null = null;
let stopping = false;

function spawnOwned(
  name: string,
  cmd: string,
  args: string[],
  env: NodeJS.ProcessEnv,
  logFile: string,
): ChildProcess {
  const out = openSync(logFile, 'a');
  const child = spawn(cmd, args, {
    cwd: ROOT,
    env,
    detached: true, // own process group: Ctrl-C reaches us, and we stop children in order
    stdio: ['ignore', out, out],
  });
  owned.push({ name, child });
  child.on('exit', (code, signal) => {
    if (!stopping) log(`${name} exited (${signal ?? code}); see ${relative(ROOT, logFile)}`);
  });
  return child;
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

async function waitForExit(pid: number, ms: number): Promise<boolean> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (!alive(pid)) return true;
    await sleep(100);
  }
  return !alive(pid);
}

async function stopPid(name: string, pid: number, graceMs = 10_000): Promise<void> {
  if (!alive(pid)) return;
  process.kill(pid, 'SIGTERM');
  if (!(await waitForExit(pid, graceMs))) {
    log(`${name} (pid ${pid}) did not stop in time; killing it`);
    process.kill(pid, 'SIGKILL');
    await waitForExit(pid, 2000);
  }
}

async function stopAll(): Promise<void> {
  if (stopping) return;
  stopping = true;
  for (const { name, child } of [...owned].reverse()) {
    if (child.pid && child.exitCode === null && child.signalCode === null) await stopPid(name, child.pid);
  }
  if (mariadbPidFile && existsSync(mariadbPidFile)) {
    const pid = Number(readFileSync(mariadbPidFile, 'utf8').trim());
    if (pid) await stopPid('mariadbd', pid, 30_000);
  }
}

const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

function run(
  cmd: string,
  args: string[],
  opts: { env?: NodeJS.ProcessEnv; cwd?: string; input?: string } = {},
): void {
  const r = spawnSync(cmd, args, {
    cwd: opts.cwd ?? ROOT,
    env: opts.env ?? process.env,
    stdio: opts.input !== undefined ? ['pipe', 'inherit', 'inherit'] : 'inherit',
    input: opts.input,
  });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed (${r.status ?? r.signal})`);
}

/** Runs a command in the foreground but as a child we can stop; resolves with its exit code. */
function runAsync(cmd: string, args: string[], env: NodeJS.ProcessEnv, cwd = ROOT): Promise<number> {
  return new Promise((res) => {
    const child = spawn(cmd, args, { cwd, env, stdio: 'inherit' });
    const entry = { name: `${cmd} ${args[0] ?? ''}`, child };
    owned.push(entry);
    child.on('exit', (code, signal) => {
      owned.splice(owned.indexOf(entry), 1);
      res(code ?? (signal ? 1 : 0));
    });
  });
}

/* ------------------------------------------------------------------ ports and secrets */

function envPort(name: string, fallback: number): number {
  const v = process.env[name];
  if (!v) return fallback;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1 || n > 65535) throw new Error(`${name} must be a port number, got ${v}`);
  return n;
}

function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const srv = createServer();
    srv.unref();
    srv.on('error', rej);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      srv.close(() => res(port));
    });
  });
}

async function portsFor(mode: Mode): Promise<Ports> {
  if (mode === 'start') {
    return {
      app: envPort('APP_PORT', 3000),
      db: envPort('DB_PORT', 3307),
      payments: envPort('PAYMENTS_PORT', 12111),
      smtp: envPort('SMTP_PORT', 1025),
      mailWeb: envPort('MAIL_WEB_PORT', 8025),
    };
  }
  // Tests pick free ports, so they can run beside `npm start` and beside each other.
  return {
    app: envPort('TEST_APP_PORT', await freePort()),
    db: envPort('TEST_DB_PORT', await freePort()),
    payments: envPort('TEST_PAYMENTS_PORT', await freePort()),
    smtp: envPort('TEST_SMTP_PORT', await freePort()),
    mailWeb: envPort('TEST_MAIL_WEB_PORT', await freePort()),
  };
}

function newSecrets(): Secrets {
  return {
    dbPassword: randomBytes(18).toString('base64url'),
    dbMigratorPassword: randomBytes(18).toString('base64url'),
    dbRootPassword: randomBytes(24).toString('base64url'),
    jwtSecret: randomBytes(48).toString('base64url'),
    webhookSecret: `whsec_${randomBytes(24).toString('base64url')}`,
  };
}

/**
 * Local secrets for `npm start`, made once and kept in the git-ignored data folder (owner-only).
 * A file from an older version gets the secrets it lacks added (the upgrade path).
 */
function keptSecrets(): Secrets {
  const file = join(DATA, 'secrets.json');
  mkdirSync(DATA, { recursive: true });
  const kept = existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as Partial<Secrets>) : {};
  const s: Secrets = { ...newSecrets(), ...kept };
  if (Object.keys(kept).length !== Object.keys(s).length) {
    writeFileSync(file, JSON.stringify(s, null, 2), { mode: 0o600 });
  }
  chmodSync(file, 0o600);
  return s;
}

/* ------------------------------------------------------------------ MariaDB */

const DB_NAME = 'loamline';
const DB_USER = 'loamline';
const DB_MIGRATOR = 'loamline_migrator';

/** The server's socket, inside a folder only its owner may enter (so no one else reaches root). */
function socketPath(datadir: string): string {
  const p = join(datadir, 'mariadb.sock');
  // A Unix socket path must stay under about 100 bytes; else a private folder in /tmp.
  return p.length < 100 ? p : join(mkdtempSync(join('/tmp', 'loamline-')), 'mariadb.sock');
}

/** Runs SQL as root through the socket; the password goes in the environment, not the command line. */
function rootSql(
  socket: string,
  password: string,
  sql: string,
  opts: { quiet?: boolean } = {},
): string | null {
  const r = spawnSync('mariadb', ['--no-defaults', `--socket=${socket}`, '-uroot', '-N', '-B'], {
    input: sql,
    env: { ...process.env, MYSQL_PWD: password },
    encoding: 'utf8',
  });
  if (r.status !== 0) {
    if (!opts.quiet) console.error(r.stderr);
    return null;
  }
  return r.stdout;
}

const sqlString = (v: string): string => `'${v.replace(/\\/g, '\\\\').replace(/'/g, "''")}'`;

/**
 * Locks the private MariaDB down (issue 8, finding 4) — on a new data folder and on one made by an
 * older version alike: root only as root@localhost (the owner-only socket; no TCP account), with
 * the generated password; no anonymous or other accounts; the app's user limited to
 * SELECT/INSERT/UPDATE/DELETE on its schema; a separate migrator user for the schema changes.
 */
function secureMariaDb(socket: string, secrets: Secrets): void {
  // A data folder from before has a root without a password: set it once, then use it.
  if (rootSql(socket, secrets.dbRootPassword, 'SELECT 1', { quiet: true }) === null) {
    if (rootSql(socket, '', 'SELECT 1', { quiet: true }) === null) {
      throw new Error(
        'cannot sign in to the private MariaDB as root with the password in .data/secrets.json; ' +
          'delete .data/ to start from nothing (the demo data is made again)',
      );
    }
    log('giving the private MariaDB root its generated password (only reachable through the socket)');
    const ok = rootSql(
      socket,
      '',
      `ALTER USER 'root'@'localhost' IDENTIFIED BY ${sqlString(secrets.dbRootPassword)}; FLUSH PRIVILEGES;`,
    );
    if (ok === null) throw new Error('could not set the MariaDB root password');
  }
  const rootPw = secrets.dbRootPassword;
  const keep = new Set([
    'root@localhost',
    'mariadb.sys@localhost',
    `${DB_USER}@localhost`,
    `${DB_USER}@127.0.0.1`,
    `${DB_MIGRATOR}@localhost`,
    `${DB_MIGRATOR}@127.0.0.1`,
  ]);
  const accounts = (rootSql(socket, rootPw, 'SELECT User, Host FROM mysql.user') ?? '')
    .split('\n')
    .filter(Boolean)
    .map((l) => l.split('\t') as [string, string]);
  const drops = accounts
    .filter(([u, h]) => !keep.has(`${u}@${h}`))
    .map(([u, h]) => `DROP USER ${sqlString(u)}@${sqlString(h)};`);
  const users = (name: string, pw: string): string =>
    ['localhost', '127.0.0.1']
      .map(
        (h) => `
    CREATE USER IF NOT EXISTS '${name}'@'${h}' IDENTIFIED BY ${sqlString(pw)};
    ALTER USER '${name}'@'${h}' IDENTIFIED BY ${sqlString(pw)};
    REVOKE ALL PRIVILEGES, GRANT OPTION FROM '${name}'@'${h}';`,
      )
      .join('');
  const sql = `
    ${drops.join('\n    ')}
    CREATE DATABASE IF NOT EXISTS \`${DB_NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
    ${users(DB_USER, secrets.dbPassword)}
    ${users(DB_MIGRATOR, secrets.dbMigratorPassword)}
    GRANT SELECT, INSERT, UPDATE, DELETE ON \`${DB_NAME}\`.* TO '${DB_USER}'@'localhost', '${DB_USER}'@'127.0.0.1';
    GRANT ALL PRIVILEGES ON \`${DB_NAME}\`.* TO '${DB_MIGRATOR}'@'localhost', '${DB_MIGRATOR}'@'127.0.0.1';
    FLUSH PRIVILEGES;`;
  if (rootSql(socket, rootPw, sql) === null) throw new Error('could not set up the MariaDB users');
}

async function startMariaDb(datadir: string, port: number, secrets: Secrets): Promise<string> {
  mkdirSync(datadir, { recursive: true });
  // Only the owner may enter: the socket, the tables and the logs are inside.
  chmodSync(datadir, 0o700);
  const pidFile = join(datadir, 'mariadb.pid');
  const errorLog = join(datadir, 'error.log');
  if (existsSync(pidFile)) {
    const pid = Number(readFileSync(pidFile, 'utf8').trim());
    if (pid && alive(pid)) {
      log(
        `a MariaDB from an earlier run (pid ${pid}) still holds ${relative(ROOT, datadir)}; stopping it first`,
      );
      await stopPid('mariadbd', pid, 30_000);
    }
    rmSync(pidFile, { force: true });
  }
  if (!existsSync(join(datadir, 'mysql'))) {
    log(`initialising a private MariaDB data directory in ${relative(ROOT, datadir)}`);
    const r = spawnSync(
      'mariadb-install-db',
      [
        '--no-defaults',
        `--datadir=${datadir}`,
        '--user=root',
        '--auth-root-authentication-method=normal',
        '--skip-test-db',
        '--basedir=/usr',
      ],
      { stdio: ['ignore', 'pipe', 'pipe'] },
    );
    if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stderr.toString()}`);
  }
  const socket = socketPath(datadir);
  const mariadbd = existsSync('/usr/sbin/mariadbd') ? '/usr/sbin/mariadbd' : 'mariadbd';
  const child = spawn(
    mariadbd,
    [
      '--no-defaults',
      '--user=root',
      `--datadir=${datadir}`,
      `--port=${port}`,
      '--bind-address=127.0.0.1',
      `--socket=${socket}`,
      `--pid-file=${pidFile}`,
      `--log-error=${errorLog}`,
      '--skip-name-resolve',
      '--default-time-zone=+00:00',
      '--innodb-buffer-pool-size=128M',
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
    ],
    { detached: true, stdio: 'ignore' },
  );
  child.unref();
  mariadbPidFile = pidFile;
  const until = Date.now() + 60_000;
  for (;;) {
    const ping = spawnSync('mariadb-admin', ['--no-defaults', `--socket=${socket}`, '-uroot', 'ping'], {
      stdio: 'ignore',
    });
    if (ping.status === 0) break;
    if (child.exitCode !== null || Date.now() > until) {
      const tail = existsSync(errorLog)
        ? readFileSync(errorLog, 'utf8').split('\n').slice(-15).join('\n')
        : '';
      throw new Error(`MariaDB did not start on port ${port}:\n${tail}`);
    }
    await sleep(200);
  }
  // The server makes its socket world-writable; the folder above keeps others out, and so does this.
  chmodSync(socket, 0o600);
  secureMariaDb(socket, secrets);
  return socket;
}

/* ------------------------------------------------------------------ builds */

function newestMtime(paths: string[]): number {
  let newest = 0;
  const walk = (p: string): void => {
    if (!existsSync(p)) return;
    const st = statSync(p);
    if (st.isDirectory()) {
      for (const e of readdirSync(p)) {
        if (e === 'node_modules' || e === 'dist' || e.startsWith('.')) continue;
        walk(join(p, e));
      }
    } else newest = Math.max(newest, st.mtimeMs);
  };
  paths.forEach(walk);
  return newest;
}

/** Runs `build` unless `stamp` is newer than every source file. */
function buildIfStale(name: string, sources: string[], stamp: string, build: () => void): void {
  const srcTime = newestMtime([...sources, join(ROOT, 'package-lock.json')]);
  if (existsSync(stamp) && statSync(stamp).mtimeMs >= srcTime) {
    log(`${name}: up to date`);
    return;
  }
  log(`${name}: building`);
  build();
  writeFileSync(stamp, new Date().toISOString());
}

function buildAll(frontendOut: string, backendOut: string): void {
  const tsc = pkgFile('backend', 'typescript', 'bin/tsc');
  const node = process.execPath;
  buildIfStale(
    'shared-types',
    [join(ROOT, 'shared-types')],
    join(ROOT, 'shared-types', 'dist', '.stamp'),
    () => run(node, [tsc, '-p', 'shared-types/tsconfig.json']),
  );
  buildIfStale(
    'backend',
    [join(ROOT, 'backend', 'src'), join(ROOT, 'shared-types', 'src'), join(ROOT, 'backend', 'tsconfig.json')],
    join(backendOut, '.stamp'),
    () => {
      rmSync(backendOut, { recursive: true, force: true });
      run(node, [tsc, '-p', 'backend/tsconfig.build.json', '--outDir', backendOut]);
    },
  );
  mkdirSync(frontendOut, { recursive: true });
  buildIfStale(
    'frontend',
    [
      join(ROOT, 'frontend', 'src'),
      join(ROOT, 'frontend', 'index.html'),
      join(ROOT, 'frontend', 'vite.config.ts'),
      join(ROOT, 'shared-types', 'src'),
    ],
    `${frontendOut}.stamp`,
    () => {
      const vite = pkgFile('frontend', 'vite', 'bin/vite.js');
      run(node, [vite, 'build', '--outDir', frontendOut, '--emptyOutDir', '--logLevel', 'warn'], {
        cwd: join(ROOT, 'frontend'),
      });
    },
  );
}

/* ------------------------------------------------------------------ services */

/** Runs pending migrations with the TypeORM CLI; its query log goes to a file, a summary to the console. */
function migrate(backendDist: string, env: NodeJS.ProcessEnv, logFile: string): void {
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

async function waitForHttp(name: string, url: string, child: ChildProcess, ms = 60_000): Promise<void> {
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

function appEnv(mode: Mode, ports: Ports, secrets: Secrets, frontendDist: string): NodeJS.ProcessEnv {
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
    PAYMENTS_WEBHOOK_SECRET: secrets.webhookSecret,
    PAYMENTS_WEBHOOK_URL: `${url}/api/payments/webhook`,
    DEMO_ACCOUNTS_FILE,
    // `npm start` is a local stack: its OpenAPI page stays on, though NODE_ENV is production.
    ...(mode === 'start' ? { API_DOCS: 'true' } : {}),
  };
}

async function bringUp(
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
  // Schema changes run as the migrator; the app (and the seed) only read and write rows.
  migrate(
    backendDist,
    { ...env, DB_USER: DB_MIGRATOR, DB_PASSWORD: secrets.dbMigratorPassword },
    join(logs, 'migrations.log'),
  );
  if (mode !== 'start') env.TEST_DB_SOCKET = socket;
  const seed = join(backendDist, 'database', 'seeds', 'run-seed.js');
  if (mode === 'start' && existsSync(seed)) run(process.execPath, [seed], { env });

  const tsxLoader = ['--import', 'tsx'];
  const payments = spawnOwned(
    'payments fake',
    process.execPath,
    [...tsxLoader, 'fakes/payments/src/main.ts'],
    { ...env, PORT: String(ports.payments) },
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
  const app = spawnOwned('app', process.execPath, [join(backendDist, 'main.js')], env, join(logs, 'app.log'));
  await waitForHttp('app', `http://127.0.0.1:${ports.app}/api/health`, app);
  return env;
}

/* ------------------------------------------------------------------ test layers */

interface Tally {
  passed: number;
  failed: number;
  skipped: number;
}

interface JestLikeReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests?: number;
  numRuntimeErrorTestSuites?: number;
  numFailedTestSuites?: number;
}

async function check(
  tally: Tally,
  name: string,
  cmd: string,
  args: string[],
  env: NodeJS.ProcessEnv,
  cwd = ROOT,
): Promise<void> {
  log(`— ${name}`);
  const code = await runAsync(cmd, args, env, cwd);
  if (code === 0) tally.passed += 1;
  else {
    tally.failed += 1;
    log(`${name}: FAILED`);
  }
}

async function suite(
  tally: Tally,
  name: string,
  cmd: string,
  args: string[],
  report: string,
  env: NodeJS.ProcessEnv,
  cwd = ROOT,
): Promise<void> {
  log(`— ${name}`);
  rmSync(report, { force: true });
  const code = await runAsync(cmd, args, env, cwd);
  if (!existsSync(report)) {
    tally.failed += 1;
    log(`${name}: no report (exit ${code})`);
    return;
  }
  const r = JSON.parse(readFileSync(report, 'utf8')) as JestLikeReport;
  tally.passed += r.numPassedTests;
  tally.failed += r.numFailedTests;
  tally.skipped += r.numPendingTests + (r.numTodoTests ?? 0);
  const broken =
    (r.numRuntimeErrorTestSuites ?? 0) + (r.numFailedTests === 0 ? (r.numFailedTestSuites ?? 0) : 0);
  if (broken > 0) tally.failed += broken;
  if (code !== 0 && r.numFailedTests === 0 && broken === 0) tally.failed += 1;
  log(`${name}: ${r.numPassedTests} passed, ${r.numFailedTests} failed`);
}

/** The fakes' own tests (`fakes/<name>/test/*.test.ts`), run with Node's test runner and tsx. */
function fakeTestFiles(): string[] {
  const fakes = join(ROOT, 'fakes');
  return readdirSync(fakes)
    .filter((f) => existsSync(join(fakes, f, 'test')))
    .flatMap((f) =>
      readdirSync(join(fakes, f, 'test'))
        .filter((t) => t.endsWith('.test.ts'))
        .map((t) => `fakes/${f}/test/${t}`),
    )
    .sort();
}

/** Node's test runner: spec output on the console, the TAP summary (`# pass N`, `# fail N`) counted. */
async function nodeSuite(
  tally: Tally,
  name: string,
  files: string[],
  report: string,
  env: NodeJS.ProcessEnv,
): Promise<void> {
  log(`— ${name}`);
  rmSync(report, { force: true });
  const args = [
    '--import',
    'tsx',
    '--test',
    '--test-reporter=spec',
    '--test-reporter-destination=stdout',
    '--test-reporter=tap',
    `--test-reporter-destination=${report}`,
    ...files,
  ];
  const code = await runAsync(process.execPath, args, env);
  const tap = existsSync(report) ? readFileSync(report, 'utf8') : '';
  const count = (key: string): number | null => {
    const all = [...tap.matchAll(new RegExp(`^# ${key} (\\d+)$`, 'gm'))];
    return all.length ? Number(all[all.length - 1][1]) : null;
  };
  const passed = count('pass');
  const failed = count('fail');
  if (passed === null || failed === null) {
    tally.failed += 1;
    log(`${name}: no summary (exit ${code})`);
    return;
  }
  const broken = failed + (count('cancelled') ?? 0);
  tally.passed += passed;
  tally.failed += broken;
  tally.skipped += (count('skipped') ?? 0) + (count('todo') ?? 0);
  if (code !== 0 && broken === 0) tally.failed += 1;
  log(`${name}: ${passed} passed, ${broken} failed`);
}

async function runTests(env: NodeJS.ProcessEnv, layers: Set<Layer>, tag: string): Promise<Tally> {
  const tally: Tally = { passed: 0, failed: 0, skipped: 0 };
  const node = process.execPath;
  const reports = join(ARTIFACTS, 'reports', tag);
  mkdirSync(reports, { recursive: true });
  if (layers.has('static')) {
    const tsc = pkgFile('backend', 'typescript', 'bin/tsc');
    for (const ws of ['shared-types', 'backend', 'frontend', 'fakes/payments', 'fakes/mail', 'scripts']) {
      await check(tally, `tsc --noEmit (${ws})`, node, [tsc, '--noEmit', '-p', `${ws}/tsconfig.json`], env);
    }
    const eslint = pkgFile('backend', 'eslint', 'bin/eslint.js');
    await check(tally, 'eslint', node, [eslint, '--max-warnings=0', '.'], env);
    const prettier = pkgFile('backend', 'prettier', 'bin/prettier.cjs');
    await check(tally, 'prettier --check', node, [prettier, '--check', '--log-level=warn', '.'], env);
  }
  if (layers.has('backend')) {
    const jest = pkgFile('backend', 'jest', 'bin/jest.js');
    const report = join(reports, 'backend.json');
    const args = [jest, '--ci', '--runInBand', '--json', `--outputFile=${report}`];
    await suite(tally, 'backend (jest)', node, args, report, env, join(ROOT, 'backend'));
    const fakeTests = fakeTestFiles();
    if (fakeTests.length > 0) {
      await nodeSuite(tally, 'fakes (node --test)', fakeTests, join(reports, 'fakes.tap'), env);
    }
  }
  const vitest = pkgFile('frontend', 'vitest', 'vitest.mjs');
  const vitestArgs = (report: string): string[] => [
    '--reporter=default',
    '--reporter=json',
    `--outputFile.json=${report}`,
  ];
  if (layers.has('frontend')) {
    const report = join(reports, 'frontend.json');
    const args = [vitest, 'run', ...vitestArgs(report)];
    await suite(tally, 'frontend (vitest)', node, args, report, env, join(ROOT, 'frontend'));
  }
  if (layers.has('browser')) {
    const report = join(reports, 'browser.json');
    const args = [vitest, 'run', '--config', 'vitest.e2e.config.ts', ...vitestArgs(report)];
    await suite(
      tally,
      'browser (playwright-core + chromium)',
      node,
      args,
      report,
      env,
      join(ROOT, 'frontend'),
    );
  }
  return tally;
}

/* ------------------------------------------------------------------ main */

async function main(): Promise<number> {
  const mode = (process.argv[2] ?? 'start') as Mode;
  if (!['start', 'test', 'bench'].includes(mode)) throw new Error(`unknown mode ${mode}`);
  const began = Date.now();
  mkdirSync(DATA, { recursive: true });

  const onSignal = (sig: NodeJS.Signals): void => {
    log(`${sig}: stopping everything this run started`);
    void stopAll().then(() => process.exit(130));
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
  process.on('SIGHUP', onSignal);
  // npm may pass SIGTERM only to the shell it started, not to us: when our parent goes away, stop too.
  const parent = process.ppid;
  setInterval(() => {
    if (process.ppid !== parent && !stopping) onSignal('SIGTERM');
  }, 500).unref();

  const layers = mode === 'test' ? layersAsked() : new Set<Layer>();
  const ports = await portsFor(mode);
  if (mode === 'start') {
    const datadir = join(DATA, 'mariadb');
    const env = await bringUp(
      mode,
      datadir,
      ports,
      keptSecrets(),
      join(ROOT, 'frontend', 'dist'),
      join(ROOT, 'backend', 'dist'),
    );
    const secs = ((Date.now() - began) / 1000).toFixed(1);
    console.log(`
Loamline is running (ready in ${secs} s)
  app            ${env.APP_URL}
  API docs       ${env.APP_URL}/api/docs
  mail inbox     ${env.MAIL_URL}
  payments fake  ${env.PAYMENTS_URL}
  MariaDB        127.0.0.1:${ports.db} (data in .data/mariadb, logs in .data/logs)
${demoSignIns()}
Press Ctrl-C to stop.`);
    await new Promise(() => undefined); // until a signal
    return 0;
  }

  const datadir = mkdtempSync(join(DATA, `${mode}-`));
  // Not under .data: the static file server refuses paths with a dot-folder in them.
  const frontendDist = join(ARTIFACTS, `frontend-${basename(datadir)}`);
  // Each test run builds the server into its own folder, so runs side by side never share one.
  const backendDist = join(ARTIFACTS, `backend-${basename(datadir)}`);
  let tally: Tally = { passed: 0, failed: 0, skipped: 0 };
  let code = 1;
  try {
    const env = await bringUp(mode, join(datadir, 'mariadb'), ports, newSecrets(), frontendDist, backendDist);
    log(
      `test stack up on app ${ports.app}, MariaDB ${ports.db} (${((Date.now() - began) / 1000).toFixed(1)} s)`,
    );
    if (mode === 'test') {
      tally = await runTests(env, layers, basename(datadir));
      code = tally.failed === 0 ? 0 : 1;
    } else {
      code = await runAsync(process.execPath, ['--import', 'tsx', 'scripts/bench.ts'], env);
    }
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    tally.failed += 1;
  } finally {
    await stopAll();
    rmSync(datadir, { recursive: true, force: true });
    rmSync(frontendDist, { recursive: true, force: true });
    rmSync(`${frontendDist}.stamp`, { force: true });
    rmSync(backendDist, { recursive: true, force: true });
  }
  if (mode === 'test') {
    log(`finished in ${((Date.now() - began) / 1000).toFixed(0)} s`);
    console.log(`${tally.passed} passed, ${tally.failed} failed, ${tally.skipped} skipped`);
  }
  return code;
}

const LAYERS = ['static', 'backend', 'frontend', 'browser'] as const;
type Layer = (typeof LAYERS)[number];

/** `npm test -- backend browser` runs only those layers; no names runs every layer. */
function layersAsked(): Set<Layer> {
  const asked = process.argv.slice(3);
  for (const a of asked) {
    if (!(LAYERS as readonly string[]).includes(a))
      throw new Error(`unknown test layer ${a} (${LAYERS.join(', ')})`);
  }
  return new Set((asked.length ? asked : LAYERS) as Layer[]);
}

function demoSignIns(): string {
  const file = DEMO_ACCOUNTS_FILE;
  return existsSync(file) ? `\nDemo sign-ins:\n${readFileSync(file, 'utf8')}` : '';
}

main().then(
  (code) => process.exit(code),
  async (err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    await stopAll();
    process.exit(1);
  },
);
