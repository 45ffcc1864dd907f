/**
 * The bring-up behind `npm start`, `npm test` and `npm run bench` (scripts/run.sh installs what is
 * missing, then runs this file). It starts a private MariaDB inside the project, the payment and
 * mail fakes and the app, as plain processes it owns, and stops every one of them by PID on
 * Ctrl-C, SIGTERM or when the tests are done.
 *
 *   start  ports from the environment or the defaults, data in .data/mariadb (kept)
 *   test   free ports, a throw-away data directory, every test layer, then tear-down
 *   bench  like test, then the benchmarks (scripts/bench.ts)
 *   cluster  three Galera nodes, HAProxy, two app instances and the fakes (scripts/stack/cluster.ts),
 *          in a throw-away folder, until Ctrl-C
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { basename, join } from 'node:path';
import { ARTIFACTS, DATA, DEMO_ACCOUNTS_FILE, type Mode, ROOT, log } from './stack/common';
import { isStopping, runAsync, stopAll } from './stack/processes';
import { startCluster } from './stack/cluster';
import { buildAll } from './stack/builds';
import { envPort, keptSecrets, newSecrets, portsFor } from './stack/ports';
import { bringUp } from './stack/services';
import { type Layer, type Tally, layersAsked, runTests } from './stack/layers';

async function main(): Promise<number> {
  const mode = (process.argv[2] ?? 'start') as Mode;
  if (!['start', 'test', 'bench', 'cluster'].includes(mode)) throw new Error(`unknown mode ${mode}`);
  const began = Date.now();
  mkdirSync(DATA, { recursive: true });
  /** folders removed once every process is stopped (also on Ctrl-C) */
  const leftovers: string[] = [];

  const onSignal = (sig: NodeJS.Signals): void => {
    log(`${sig}: stopping everything this run started`);
    void stopAll().then(() => {
      for (const d of leftovers) rmSync(d, { recursive: true, force: true });
      process.exit(130);
    });
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
  process.on('SIGHUP', onSignal);
  // npm may pass SIGTERM only to the shell it started, not to us: when our parent goes away, stop too.
  const parent = process.ppid;
  setInterval(() => {
    if (process.ppid !== parent && !isStopping()) onSignal('SIGTERM');
  }, 500).unref();

  if (mode === 'cluster') {
    const frontendDist = join(ROOT, 'frontend', 'dist');
    const backendDist = join(ROOT, 'backend', 'dist');
    buildAll(frontendDist, backendDist);
    const c = await startCluster(newSecrets(), frontendDist, backendDist, join(DATA, 'logs'), {
      httpPort: envPort('CLUSTER_HTTP_PORT', 3100),
      seed: true,
      appEnv: { NODE_ENV: 'production', API_DOCS: 'true' },
    });
    leftovers.push(c.dir);
    const secs = ((Date.now() - began) / 1000).toFixed(1);
    const signIns = join(c.dir, 'demo-accounts.txt');
    console.log(`
Loamline cluster is running (ready in ${secs} s; throw-away data in ${c.dir})
  app (HAProxy, round-robin)  ${c.env.CLUSTER_HTTP_URL}
  app instances               ${String(c.env.CLUSTER_APP_URLS).split(',').join(', ')}
  database (HAProxy, TCP)     127.0.0.1:${c.ports.db}
  Galera nodes                ${c.nodes.map((n) => `${n.name} 127.0.0.1:${n.port}`).join(', ')}
  HAProxy stats               ${c.env.CLUSTER_HAPROXY_STATS}
  mail inbox                  ${c.env.MAIL_URL}
  payments fake               ${c.env.PAYMENTS_URL}
  logs                        .data/logs (galera*, haproxy, cluster-*)
${existsSync(signIns) ? `\nDemo sign-ins:\n${readFileSync(signIns, 'utf8')}` : ''}
Press Ctrl-C to stop.`);
    await new Promise(() => undefined); // until a signal
    return 0;
  }

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
    // `npm test -- cluster` needs only the builds: the cluster layer brings up its own stack.
    const single = mode !== 'test' || [...layers].some((l) => l !== 'cluster');
    let env: NodeJS.ProcessEnv = { ...process.env, FRONTEND_DIST: frontendDist };
    if (single) {
      env = await bringUp(mode, join(datadir, 'mariadb'), ports, newSecrets(), frontendDist, backendDist);
      log(
        `test stack up on app ${ports.app}, MariaDB ${ports.db} (${((Date.now() - began) / 1000).toFixed(1)} s)`,
      );
    } else buildAll(frontendDist, backendDist);
    if (mode === 'test') {
      tally = await runTests(env, layers, basename(datadir), { frontendDist, backendDist });
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
