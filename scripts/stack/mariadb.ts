/** The private MariaDB inside the project: install, start, lock down. */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, chmodSync } from 'node:fs';
import { join, relative } from 'node:path';
import { ROOT, type Secrets, log } from './common';
import { alive, setMariaDbPidFile, sleep, stopPid } from './processes';

/* ------------------------------------------------------------------ MariaDB */

export const DB_NAME = 'loamline';
export const DB_USER = 'loamline';
export const DB_MIGRATOR = 'loamline_migrator';

/** The server's socket, inside a folder only its owner may enter (so no one else reaches root). */
export function socketPath(datadir: string): string {
  const p = join(datadir, 'mariadb.sock');
  // A Unix socket path must stay under about 100 bytes; else a private folder in /tmp.
  return p.length < 100 ? p : join(mkdtempSync(join('/tmp', 'loamline-')), 'mariadb.sock');
}

/** Runs SQL as root through the socket; the password goes in the environment, not the command line. */
export function rootSql(
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

export const sqlString = (v: string): string => `'${v.replace(/\\/g, '\\\\').replace(/'/g, "''")}'`;

/**
 * Locks the private MariaDB down (issue 8, finding 4) — on a new data folder and on one made by an
 * older version alike: root only as root@localhost (the owner-only socket; no TCP account), with
 * the generated password; no anonymous or other accounts; the app's user limited to
 * SELECT/INSERT/UPDATE/DELETE on its schema; a separate migrator user for the schema changes.
 */
export function secureMariaDb(socket: string, secrets: Secrets): void {
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

export async function startMariaDb(datadir: string, port: number, secrets: Secrets): Promise<string> {
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
  setMariaDbPidFile(pidFile);
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
