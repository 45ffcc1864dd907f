/**
 * The real cluster of issue 12 (`npm run cluster`, and the `cluster` layer of `npm test`): three
 * MariaDB Galera nodes on loopback, HAProxy in front of them and of two app instances, and the
 * payment and mail fakes — every one a plain process this run owns and stops by PID.
 *
 *   riders ─► HAProxy :http (round-robin, GET /api/health) ─► app 1, app 2
 *   app 1, app 2 ─► HAProxy :db (leastconn, TCP check) ─► Galera node 1, 2, 3
 */
import { type ChildProcess, spawnSync } from 'node:child_process';
import {
  chmodSync,
  chownSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Secrets, log } from './common';
import { DB_MIGRATOR, secureMariaDb, rootSql, sqlString } from './mariadb';

import { owned, sleep, spawnOwned, stopChildren } from './processes';
import { startLocalS3IfAsked } from './s3';
import { appEnv, migrate, waitForHttp } from './services';

export const GALERA_PROVIDER = '/usr/lib/galera/libgalera_smm.so';
const NODES = 3;
const HAPROXY = existsSync('/usr/sbin/haproxy') ? '/usr/sbin/haproxy' : 'haproxy';

export interface GaleraNode {
  name: string;
  /** the SQL port riders' apps never use directly (HAProxy does; the tests read each node here) */
  port: number;
  /** group communication (gmcast.listen_addr), incremental (ist.recv_addr) and full (SST) transfer */
  gcommPort: number;
  istPort: number;
  sstPort: number;
  datadir: string;
  socket: string;
  pidFile: string;
  child: ChildProcess | null;
}

export interface ClusterPorts {
  http: number;
  db: number;
  stats: number;
  apps: number[];
  payments: number;
  smtp: number;
  mailWeb: number;
}

export interface Cluster {
  dir: string;
  nodes: GaleraNode[];
  ports: ClusterPorts;
  /** the environment of the app instances (DB through HAProxy), for tests and the seed */
  env: NodeJS.ProcessEnv;
  /** every process the cluster started, in start order (stop them in reverse) */
  children: ChildProcess[];
}

/** Ports handed out in this run (never twice). */
const given = new Set<number>();

/**
 * A free port below the kernel's ephemeral range (Linux: 32768–60999 by default). Ports from
 * `listen(0)` come from that range, and so do the source ports of outgoing connections — of which the
 * cluster makes many (group communication, checks, pools) — so a port picked there and bound a few
 * seconds later may already be taken. Below it, only another listener can take it.
 */
async function freePort(): Promise<number> {
  const { createServer } = await import('node:net');
  for (let i = 0; i < 200; i++) {
    const port = 20_000 + Math.floor(Math.random() * 12_000);
    if (given.has(port)) continue;
    const ok = await new Promise<boolean>((res) => {
      const srv = createServer();
      srv.once('error', () => res(false));
      srv.listen(port, '127.0.0.1', () => srv.close(() => res(true)));
    });
    if (ok) {
      given.add(port);
      return port;
    }
  }
  throw new Error('no free port between 20000 and 32000');
}

function mysqlIds(): { uid: number; gid: number } {
  const r = spawnSync('id', ['-u', 'mysql'], { encoding: 'utf8' });
  const g = spawnSync('id', ['-g', 'mysql'], { encoding: 'utf8' });
  if (r.status !== 0 || g.status !== 0) throw new Error('the cluster needs the mysql user (mariadb-server)');
  return { uid: Number(r.stdout.trim()), gid: Number(g.stdout.trim()) };
}

/** A status variable of one node, read as root through its socket (null while it does not answer). */
export function nodeStatus(node: GaleraNode, rootPassword: string, variable: string): string | null {
  const out = rootSql(node.socket, rootPassword, `SHOW GLOBAL STATUS LIKE ${sqlString(variable)}`, {
    quiet: true,
  });
  return out === null ? null : (out.trim().split('\t')[1] ?? null);
}

function startNode(node: GaleraNode, all: GaleraNode[], logs: string, first: boolean): void {
  const mariadbd = existsSync('/usr/sbin/mariadbd') ? '/usr/sbin/mariadbd' : 'mariadbd';
  const peers = all.map((n) => `127.0.0.1:${n.gcommPort}`).join(',');
  const provider = [
    `gmcast.listen_addr=tcp://127.0.0.1:${node.gcommPort}`,
    `ist.recv_addr=127.0.0.1:${node.istPort}`,
    'gcache.size=32M',
    // A node that dies is noticed in about 2 s instead of 5–15 s (Galera docs, evs.* options;
    // keepalive ≤ check period ≤ suspect ≤ inactive timeout).
    'evs.keepalive_period=PT0.5S',
    'evs.inactive_check_period=PT0.5S',
    'evs.suspect_timeout=PT2S',
    'evs.inactive_timeout=PT4S',
    'evs.install_timeout=PT4S',
  ].join(';');
  const args = [
    '--no-defaults',
    '--user=mysql', // rsync state transfer refuses to run as root
    `--datadir=${node.datadir}`,
    `--port=${node.port}`,
    '--bind-address=127.0.0.1',
    `--socket=${node.socket}`,
    `--pid-file=${node.pidFile}`,
    `--log-error=${join(node.datadir, 'error.log')}`,
    '--skip-name-resolve',
    '--default-time-zone=+00:00',
    '--innodb-buffer-pool-size=64M',
    '--performance-schema=OFF',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    // Galera (MariaDB docs, "Configuring MariaDB Galera Cluster": mandatory settings)
    '--wsrep-on=ON',
    `--wsrep-provider=${GALERA_PROVIDER}`,
    '--binlog-format=ROW',
    '--default-storage-engine=InnoDB',
    '--innodb-autoinc-lock-mode=2',
    '--wsrep-cluster-name=loamline',
    `--wsrep-node-name=${node.name}`,
    '--wsrep-node-address=127.0.0.1',
    `--wsrep-cluster-address=gcomm://${peers}`,
    `--wsrep-provider-options=${provider}`,
    '--wsrep-sst-method=rsync',
    `--wsrep-sst-receive-address=127.0.0.1:${node.sstPort}`,
    // Causal reads (MariaDB docs, wsrep_sync_wait=1): a read waits until the node has applied
    // every write the cluster committed before it, so a claim made through one node is seen
    // through any other (the app's pool spreads one request's queries over the nodes).
    '--wsrep-sync-wait=1',
    ...(first ? ['--wsrep-new-cluster'] : []),
  ];
  node.child = spawnOwned(node.name, mariadbd, args, process.env, join(logs, `${node.name}.log`));
}

async function waitFor(what: string, ms: number, ok: () => boolean, failed?: () => string | null) {
  const until = Date.now() + ms;
  while (!ok()) {
    const why = failed?.();
    if (why) throw new Error(`${what}: ${why}`);
    if (Date.now() > until) throw new Error(`${what}: not within ${ms / 1000} s`);
    await sleep(250);
  }
}

function tail(file: string): string {
  return existsSync(file) ? readFileSync(file, 'utf8').split('\n').slice(-20).join('\n') : '';
}

const exited = (node: GaleraNode): string | null =>
  node.child && node.child.exitCode !== null
    ? `${node.name} exited:\n${tail(join(node.datadir, 'error.log'))}`
    : null;

/** Starts three Galera nodes, the first bootstrapping the cluster; resolves once all three are Synced. */
export async function startGalera(dir: string, secrets: Secrets, logs: string): Promise<GaleraNode[]> {
  const { uid, gid } = mysqlIds();
  const nodes: GaleraNode[] = [];
  for (let i = 1; i <= NODES; i++) {
    const datadir = join(dir, `node${i}`);
    mkdirSync(datadir, { recursive: true });
    chownSync(datadir, uid, gid);
    chmodSync(datadir, 0o700); // the socket, the tables and the logs are inside
    nodes.push({
      name: `galera${i}`,
      port: await freePort(),
      gcommPort: await freePort(),
      istPort: await freePort(),
      sstPort: await freePort(),
      datadir,
      socket: join(datadir, 'mariadb.sock'),
      pidFile: join(datadir, 'mariadb.pid'),
      child: null,
    });
  }
  const [first, ...rest] = nodes;
  // Only the first node gets a fresh system schema; the others receive everything by state transfer.
  const r = spawnSync(
    'mariadb-install-db',
    [
      '--no-defaults',
      `--datadir=${first.datadir}`,
      '--user=mysql',
      '--auth-root-authentication-method=normal',
      '--skip-test-db',
      '--basedir=/usr',
    ],
    { stdio: ['ignore', 'pipe', 'pipe'] },
  );
  if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stderr.toString()}`);
  startNode(first, nodes, logs, true);
  const pw = (): string =>
    rootSql(first.socket, '', 'SELECT 1', { quiet: true }) !== null ? '' : secrets.dbRootPassword;
  await waitFor(
    `${first.name} did not bootstrap`,
    60_000,
    () => nodeStatus(first, pw(), 'wsrep_local_state_comment') === 'Synced',
    () => exited(first),
  );
  chmodSync(first.socket, 0o600);
  // The same accounts as the single server (replicated to the joiners by the state transfer).
  secureMariaDb(first.socket, secrets);
  for (const n of rest) startNode(n, nodes, logs, false);
  await waitFor(
    'the Galera nodes did not form a cluster of three',
    120_000,
    () =>
      nodes.every(
        (n) =>
          nodeStatus(n, secrets.dbRootPassword, 'wsrep_local_state_comment') === 'Synced' &&
          nodeStatus(n, secrets.dbRootPassword, 'wsrep_cluster_size') === String(NODES),
      ),
    () => nodes.map(exited).find(Boolean) ?? null,
  );
  for (const n of rest) chmodSync(n.socket, 0o600);
  return nodes;
}

/** HAProxy's configuration (HAProxy 2.6 configuration manual): one HTTP and one TCP frontend. */
export function haproxyConfig(ports: ClusterPorts, nodes: GaleraNode[]): string {
  const apps = ports.apps
    .map((p, i) => `  server app${i + 1} 127.0.0.1:${p} check inter 1s fall 2 rise 2`)
    .join('\n');
  const dbs = nodes
    .map(
      (n) =>
        `  server ${n.name} 127.0.0.1:${n.port} check inter 500ms fall 2 rise 3 on-marked-down shutdown-sessions`,
    )
    .join('\n');
  return `# Made by scripts/stack/cluster.ts for one run; not kept.
global
  maxconn 2000

defaults
  log global
  timeout connect 3s
  # connection retries to another server (option redispatch) when the first one refuses
  retries 2
  option redispatch

# The app instances: round-robin, a server is out after two failed GET /api/health (1 s apart).
frontend http_in
  mode http
  bind 127.0.0.1:${ports.http}
  timeout client 60s
  default_backend apps

backend apps
  mode http
  balance roundrobin
  # the rider's address for the app's per-client limits (the apps trust loopback: TRUST_PROXY)
  option forwardfor
  timeout server 60s
  option httpchk GET /api/health
  http-check expect status 200
${apps}

# The app's database connections: each new connection to the node with the fewest; a node is out
# after two failed TCP checks (0.5 s apart), and its open connections are cut at once so the
# app's pool opens new ones to the survivors. Long timeouts: a pool keeps idle connections.
frontend db_in
  mode tcp
  bind 127.0.0.1:${ports.db}
  timeout client 8h
  default_backend galera

backend galera
  mode tcp
  balance leastconn
  timeout server 8h
${dbs}

listen stats
  mode http
  bind 127.0.0.1:${ports.stats}
  timeout client 60s
  timeout server 60s
  stats enable
  stats uri /
  stats refresh 2s
`;
}

/**
 * Brings the whole cluster up in `dir` (a temp folder this run owns): Galera, migrations once
 * through the migrator user, HAProxy, the fakes, two app instances with the same secrets.
 */
export async function startCluster(
  secrets: Secrets,
  frontendDist: string,
  backendDist: string,
  logs: string,
  opts: { httpPort?: number; seed?: boolean; appEnv?: NodeJS.ProcessEnv } = {},
): Promise<Cluster> {
  const dir = mkdtempSync(join(tmpdir(), 'loamline-cluster-'));
  chmodSync(dir, 0o755); // the mysql user walks through to its node folders
  mkdirSync(logs, { recursive: true });
  const before = new Set(owned.map((o) => o.child));
  try {
    return await startIn(dir, secrets, frontendDist, backendDist, logs, opts);
  } catch (e) {
    // a failed start leaves nothing behind: its processes stop (newest first), its folder goes
    await stopChildren(owned.filter((o) => !before.has(o.child)).map((o) => o.child));
    rmSync(dir, { recursive: true, force: true });
    throw e;
  }
}

async function startIn(
  dir: string,
  secrets: Secrets,
  frontendDist: string,
  backendDist: string,
  logs: string,
  opts: { httpPort?: number; seed?: boolean; appEnv?: NodeJS.ProcessEnv },
): Promise<Cluster> {
  const children: ChildProcess[] = [];
  const ports: ClusterPorts = {
    http: opts.httpPort ?? (await freePort()),
    db: await freePort(),
    stats: await freePort(),
    apps: [await freePort(), await freePort()],
    payments: await freePort(),
    smtp: await freePort(),
    mailWeb: await freePort(),
  };
  const began = Date.now();
  const nodes = await startGalera(dir, secrets, logs);
  children.push(...nodes.map((n) => n.child!));
  log(`Galera: ${nodes.length} nodes Synced (${((Date.now() - began) / 1000).toFixed(1)} s)`);

  const cfg = join(dir, 'haproxy.cfg');
  writeFileSync(cfg, haproxyConfig(ports, nodes));
  const check = spawnSync(HAPROXY, ['-c', '-q', '-f', cfg], { encoding: 'utf8' });
  if (check.status !== 0) throw new Error(`haproxy config refused:\n${check.stderr}${check.stdout}`);
  // -db: stay in the foreground (a process we own and stop by PID)
  const haproxy = spawnOwned('haproxy', HAPROXY, ['-db', '-f', cfg], process.env, join(logs, 'haproxy.log'));
  children.push(haproxy);

  const base = appEnv(
    'test',
    { app: ports.http, db: ports.db, payments: ports.payments, smtp: ports.smtp, mailWeb: ports.mailWeb },
    secrets,
    frontendDist,
  );
  const env: NodeJS.ProcessEnv = {
    ...base,
    ...opts.appEnv,
    // HAProxy on loopback is the proxy in front: req.ip is the rider's (X-Forwarded-For)
    TRUST_PROXY: 'loopback',
    // uploads in an S3-compatible object store both instances reach (a local one from the npm
    // registry, stack/s3.ts), as past one machine; CLUSTER_UPLOADS_STORE=disk shares a folder instead
    UPLOADS_STORE: process.env.CLUSTER_UPLOADS_STORE === 'disk' ? 'disk' : 's3',
    UPLOADS_DIR: join(dir, 'uploads'),
    DEMO_ACCOUNTS_FILE: join(dir, 'demo-accounts.txt'),
    CLUSTER_HTTP_URL: `http://127.0.0.1:${ports.http}`,
    CLUSTER_APP_URLS: ports.apps.map((p) => `http://127.0.0.1:${p}`).join(','),
    CLUSTER_NODE_PORTS: nodes.map((n) => n.port).join(','),
    CLUSTER_NODE_PID_FILES: nodes.map((n) => n.pidFile).join(','),
    CLUSTER_HAPROXY_STATS: `http://127.0.0.1:${ports.stats}/`,
  };
  await waitForTcp('HAProxy', ports.db, 10_000);
  // before the migrations: everything that reads the app's config checks the S3_* settings
  const s3 = await startLocalS3IfAsked('test', env, secrets, logs, dir, await freePort());
  if (s3) children.push(s3);
  migrate(
    backendDist,
    { ...env, DB_USER: DB_MIGRATOR, DB_PASSWORD: secrets.dbMigratorPassword },
    join(logs, 'cluster-migrations.log'),
  );
  const tsxLoader = ['--import', 'tsx'];
  const payments = spawnOwned(
    'payments fake (cluster)',
    process.execPath,
    [...tsxLoader, 'fakes/payments/src/main.ts'],
    { ...env, PORT: String(ports.payments), PAYMENTS_STATE_FILE: '' },
    join(logs, 'cluster-payments.log'),
  );
  const mail = spawnOwned(
    'mail fake (cluster)',
    process.execPath,
    [...tsxLoader, 'fakes/mail/src/main.ts'],
    { ...env, SMTP_PORT: String(ports.smtp), WEB_PORT: String(ports.mailWeb) },
    join(logs, 'cluster-mail.log'),
  );
  children.push(payments, mail);
  await waitForHttp('payments fake', `http://127.0.0.1:${ports.payments}/health`, payments);
  await waitForHttp('mail fake', `http://127.0.0.1:${ports.mailWeb}/health`, mail);
  if (opts.seed) {
    const seed = join(backendDist, 'database', 'seeds', 'run-seed.js');
    if (existsSync(seed)) {
      const r = spawnSync(process.execPath, [seed], { env, stdio: 'inherit' });
      if (r.status !== 0) throw new Error('the demo seed failed on the cluster');
    }
  }
  const apps = ports.apps.map((p, i) =>
    spawnOwned(
      `app ${i + 1}`,
      process.execPath,
      [join(backendDist, 'main.js')],
      { ...env, APP_PORT: String(p) },
      join(logs, `cluster-app${i + 1}.log`),
    ),
  );
  children.push(...apps);
  await Promise.all(
    apps.map((a, i) => waitForHttp(`app ${i + 1}`, `http://127.0.0.1:${ports.apps[i]}/api/health`, a)),
  );
  // HAProxy marks both instances up after their first checks
  await waitForHttp('HAProxy', `http://127.0.0.1:${ports.http}/api/health`, haproxy);
  return { dir, nodes, ports, env, children };
}

async function waitForTcp(name: string, port: number, ms: number): Promise<void> {
  const { connect } = await import('node:net');
  const until = Date.now() + ms;
  for (;;) {
    const ok = await new Promise<boolean>((res) => {
      const s = connect(port, '127.0.0.1');
      s.once('connect', () => {
        s.destroy();
        res(true);
      });
      s.once('error', () => res(false));
    });
    if (ok) return;
    if (Date.now() > until) throw new Error(`${name} did not listen on ${port}`);
    await sleep(100);
  }
}
