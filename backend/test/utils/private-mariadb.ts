import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { typeormOptions } from '../../src/database/typeorm-options';
import { freePort } from './mail-fake-process';

const NAME = 'loamline';
const APP_USER = 'loamline';
const MIGRATOR = 'loamline_migrator';

/**
 * A MariaDB of the test's own, for fault tests that stop and kill it: a data folder in the
 * system's temp folder, mariadbd on a free port, started the way scripts/stack/mariadb.ts starts
 * the test run's server (same flags), the app's and the migrator's users with the same grants,
 * the migrations run. The shared test database is never touched. `stop()` (SIGTERM, a clean
 * shutdown), `kill()` (SIGKILL, a crash) and `start()` again on the same port and data.
 */
export class PrivateMariaDb {
  private child: ChildProcess | null = null;
  readonly appPassword = randomBytes(12).toString('base64url');
  private readonly migratorPassword = randomBytes(12).toString('base64url');

  private constructor(
    readonly datadir: string,
    readonly port: number,
  ) {}

  get socket(): string {
    return join(this.datadir, 'mariadb.sock');
  }

  /** The DB_* variables for createTestApp. */
  get env(): Record<string, string> {
    return {
      DB_HOST: '127.0.0.1',
      DB_PORT: String(this.port),
      DB_NAME: NAME,
      DB_USER: APP_USER,
      DB_PASSWORD: this.appPassword,
    };
  }

  /** Initialises a data folder, starts the server, makes the users and runs the migrations. */
  static async create(): Promise<PrivateMariaDb> {
    // short: a Unix socket path must stay under about 100 bytes
    const datadir = mkdtempSync(join(tmpdir(), 'lm-fault-'));
    const db = new PrivateMariaDb(datadir, await freePort());
    const init = spawnSync(
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
    if (init.status !== 0) throw new Error(`mariadb-install-db failed:\n${init.stderr.toString()}`);
    await db.start();
    const users = (name: string, pw: string, grant: string) =>
      ['localhost', '127.0.0.1']
        .map(
          (h) =>
            `CREATE USER '${name}'@'${h}' IDENTIFIED BY '${pw}'; GRANT ${grant} ON \`${NAME}\`.* TO '${name}'@'${h}';`,
        )
        .join('\n');
    db.rootSql(
      `
      CREATE DATABASE \`${NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
      ${users(APP_USER, db.appPassword, 'SELECT, INSERT, UPDATE, DELETE')}
      ${users(MIGRATOR, db.migratorPassword, 'ALL PRIVILEGES')}
      FLUSH PRIVILEGES;`,
      null,
    );
    const migrations = new DataSource(
      typeormOptions({
        host: '127.0.0.1',
        port: db.port,
        user: MIGRATOR,
        password: db.migratorPassword,
        name: NAME,
      }),
    );
    await migrations.initialize();
    try {
      await migrations.runMigrations({ transaction: 'each' });
    } finally {
      await migrations.destroy();
    }
    return db;
  }

  /** Starts mariadbd on the same port and data folder and waits until it answers a ping. */
  async start(): Promise<void> {
    if (this.child && this.child.exitCode === null && this.child.signalCode === null) return;
    const mariadbd = existsSync('/usr/sbin/mariadbd') ? '/usr/sbin/mariadbd' : 'mariadbd';
    const errorLog = join(this.datadir, 'error.log');
    const child = spawn(
      mariadbd,
      [
        '--no-defaults',
        '--user=root',
        `--datadir=${this.datadir}`,
        `--port=${this.port}`,
        '--bind-address=127.0.0.1',
        `--socket=${this.socket}`,
        `--pid-file=${join(this.datadir, 'mariadb.pid')}`,
        `--log-error=${errorLog}`,
        '--skip-name-resolve',
        '--default-time-zone=+00:00',
        '--innodb-buffer-pool-size=32M',
        '--character-set-server=utf8mb4',
        '--collation-server=utf8mb4_unicode_ci',
      ],
      { stdio: 'ignore' },
    );
    this.child = child;
    // a test run that ends without afterAll (a crash, a kill) leaves no mariadbd behind
    const orphan = () => child.kill('SIGKILL');
    process.once('exit', orphan);
    child.once('exit', () => process.off('exit', orphan));
    const until = Date.now() + 30_000;
    for (;;) {
      const ping = spawnSync(
        'mariadb-admin',
        ['--no-defaults', `--socket=${this.socket}`, '-uroot', 'ping'],
        {
          stdio: 'ignore',
        },
      );
      if (ping.status === 0) return;
      if (child.exitCode !== null || Date.now() > until) {
        const tail = existsSync(errorLog)
          ? readFileSync(errorLog, 'utf8').split('\n').slice(-15).join('\n')
          : '';
        throw new Error(`the private MariaDB did not start on port ${this.port}:\n${tail}`);
      }
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  /** A clean shutdown (SIGTERM), as `systemctl stop` does; resolves once the process has exited. */
  stop(): Promise<void> {
    return this.signal('SIGTERM');
  }

  /** A crash (SIGKILL): no shutdown, InnoDB recovers at the next start. */
  kill(): Promise<void> {
    return this.signal('SIGKILL');
  }

  /**
   * Freezes the server (SIGSTOP): the port still accepts connections but nothing answers, as a
   * stalled disk or a network partition looks to the app. `thaw()` lets it go on.
   */
  freeze(): void {
    this.child?.kill('SIGSTOP');
  }

  thaw(): void {
    this.child?.kill('SIGCONT');
  }

  private async signal(sig: NodeJS.Signals): Promise<void> {
    const child = this.child;
    this.child = null;
    if (!child || child.exitCode !== null || child.signalCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once('exit', () => resolve());
      child.kill(sig);
      child.kill('SIGCONT'); // a frozen server must run to act on SIGTERM
    });
  }

  /** SQL as root through the socket (the password-less root of a fresh data folder). */
  rootSql(sql: string, database: string | null = NAME): string {
    const args = ['--no-defaults', `--socket=${this.socket}`, '-uroot', '-N', '-B'];
    const r = spawnSync('mariadb', database ? [...args, database] : args, { input: sql, encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`mariadb: ${r.stderr}`);
    return r.stdout;
  }

  /** Stops the server and removes its data folder. */
  async destroy(): Promise<void> {
    await this.kill();
    rmSync(this.datadir, { recursive: true, force: true });
  }
}
