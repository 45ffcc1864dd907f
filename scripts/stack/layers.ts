/** The test layers of `npm test` and their tally. */
import { copyFileSync, existsSync, mkdirSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { ARTIFACTS, ROOT, log, pkgFile } from './common';
import { runAsync, stopChildren } from './processes';
import { startCluster } from './cluster';
import { newSecrets } from './ports';

/* ------------------------------------------------------------------ test layers */

export interface Tally {
  passed: number;
  failed: number;
  skipped: number;
}

export interface JestLikeReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests?: number;
  numRuntimeErrorTestSuites?: number;
  numFailedTestSuites?: number;
}

export async function check(
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

export async function suite(
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
export function fakeTestFiles(): string[] {
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
export async function nodeSuite(
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
    // a test or hook that hangs (a browser that stops answering) fails after two minutes instead of
    // holding up the run
    '--test-timeout=120000',
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

export async function runTests(
  env: NodeJS.ProcessEnv,
  layers: Set<Layer>,
  tag: string,
  builds: { frontendDist: string; backendDist: string },
): Promise<Tally> {
  const tally: Tally = { passed: 0, failed: 0, skipped: 0 };
  const node = process.execPath;
  const reports = join(ARTIFACTS, 'reports', tag);
  mkdirSync(reports, { recursive: true });
  const vitest = pkgFile('frontend', 'vitest', 'vitest.mjs');
  const vitestArgs = (report: string): string[] => [
    '--reporter=default',
    '--reporter=json',
    `--outputFile.json=${report}`,
  ];
  // Two groups run at once, each in its own order (on two cores each leaves the other idle time:
  // jest and the browser tests wait on the server and the database, vitest on jsdom's timers, the
  // cluster on Galera). The shared test stack's layers: backend, then browser. Everything else brings
  // its own servers or none: static, frontend, faults, fakes, cluster.
  const sharedStack = async (): Promise<void> => {
    if (layers.has('backend')) {
      const jest = pkgFile('backend', 'jest', 'bin/jest.js');
      const report = join(reports, 'backend.json');
      const args = [jest, '--ci', '--runInBand', '--json', `--outputFile=${report}`];
      // the fault tests with a MariaDB of their own are the faults layer's
      args.push('--testPathIgnorePatterns', '/test/faults/');
      // TEST_FILTER=payments runs only the jest files (and fake tests) whose path matches it
      if (process.env.TEST_FILTER) args.push('--testPathPatterns', process.env.TEST_FILTER);
      await suite(tally, 'backend (jest)', node, args, report, env, join(ROOT, 'backend'));
    }
    if (layers.has('browser')) {
      const report = join(reports, 'browser.json');
      const args = [vitest, 'run', '--config', 'vitest.e2e.config.ts', ...vitestArgs(report)];
      if (process.env.TEST_FILTER) args.push(process.env.TEST_FILTER); // a file-name filter, as for jest
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
  };
  const ownServers = async (): Promise<void> => {
    if (layers.has('static')) {
      const tsc = pkgFile('backend', 'typescript', 'bin/tsc');
      for (const ws of ['shared-types', 'backend', 'frontend', 'fakes/payments', 'fakes/mail', 'scripts']) {
        await check(tally, `tsc --noEmit (${ws})`, node, [tsc, '--noEmit', '-p', `${ws}/tsconfig.json`], env);
      }
      const eslint = pkgFile('backend', 'eslint', 'bin/eslint.js');
      await check(tally, 'eslint', node, [eslint, '--max-warnings=0', '.'], env);
      const prettier = pkgFile('backend', 'prettier', 'bin/prettier.cjs');
      await check(tally, 'prettier --check', node, [prettier, '--check', '--log-level=warn', '.'], env);
      // issue 12's budget as a ratchet: no route's JavaScript grows past its committed ceiling
      // (scripts/bench/route-ceilings.json), no new route over 150 kB gzipped; routes still over 150 kB
      // are a warning
      await check(
        tally,
        'route JavaScript budget',
        node,
        ['--import', 'tsx', 'scripts/bench/route-budget.ts'],
        env,
      );
    }
    if (layers.has('frontend')) {
      const report = join(reports, 'frontend.json');
      const args = [vitest, 'run', ...vitestArgs(report)];
      await suite(tally, 'frontend (vitest)', node, args, report, env, join(ROOT, 'frontend'));
    }
    if (layers.has('faults')) {
      // backend/test/faults: each file starts a MariaDB of its own and stops, kills or freezes it
      // (the shared test database is never touched); the fakes are the stack's
      const jest = pkgFile('backend', 'jest', 'bin/jest.js');
      const report = join(reports, 'faults.json');
      const args = [
        jest,
        '--ci',
        '--runInBand',
        '--json',
        `--outputFile=${report}`,
        '--testMatch',
        '<rootDir>/test/faults/**/*.e2e-spec.ts',
        '--passWithNoTests',
      ];
      if (process.env.TEST_FILTER) args.push('--testPathPatterns', process.env.TEST_FILTER);
      await suite(tally, 'faults (jest, own MariaDB)', node, args, report, env, join(ROOT, 'backend'));
    }
    if (layers.has('backend')) {
      const fakeTests = fakeTestFiles().filter(
        (f) => !process.env.TEST_FILTER || f.includes(process.env.TEST_FILTER),
      );
      if (fakeTests.length > 0) {
        await nodeSuite(tally, 'fakes (node --test)', fakeTests, join(reports, 'fakes.tap'), env);
      }
    }
    if (layers.has('cluster')) await clusterLayer(tally, reports, builds);
  };
  await Promise.all([sharedStack(), ownServers()]);
  return tally;
}

/**
 * The cluster layer: its own stack (three Galera nodes, HAProxy, two app instances, the fakes;
 * scripts/stack/cluster.ts), the jest files of backend/test/cluster against it, then tear-down.
 */
async function clusterLayer(
  tally: Tally,
  reports: string,
  builds: { frontendDist: string; backendDist: string },
): Promise<void> {
  const began = Date.now();
  log('— cluster: starting three Galera nodes, HAProxy and two app instances');
  let cluster: Awaited<ReturnType<typeof startCluster>> | null = null;
  try {
    cluster = await startCluster(
      newSecrets(),
      builds.frontendDist,
      builds.backendDist,
      join(ARTIFACTS, 'logs'),
      {
        // both instances sweep the outbox often, so their relays race for the same rows
        appEnv: { MAIL_RELAY_INTERVAL_MS: '300' },
      },
    );
    log(`cluster up in ${((Date.now() - began) / 1000).toFixed(1)} s`);
    const jest = pkgFile('backend', 'jest', 'bin/jest.js');
    const report = join(reports, 'cluster.json');
    const args = [
      jest,
      '--ci',
      '--runInBand',
      '--passWithNoTests',
      '--testMatch',
      '<rootDir>/test/cluster/**/*.cluster-spec.ts',
      '--json',
      `--outputFile=${report}`,
      // HTTP keep-alive sockets to the instances outlive the tests by a few seconds
      '--forceExit',
    ];
    if (process.env.TEST_FILTER) args.push('--testPathPatterns', process.env.TEST_FILTER);
    await suite(tally, 'cluster (jest)', process.execPath, args, report, cluster.env, join(ROOT, 'backend'));
  } catch (e) {
    tally.failed += 1;
    log(`cluster: FAILED to start: ${e instanceof Error ? e.message : String(e)}`);
  } finally {
    if (cluster) {
      await stopChildren(cluster.children);
      // the nodes' own logs (written by the mysql user inside their folders) go with the others
      for (const n of cluster.nodes) {
        const from = join(n.datadir, 'error.log');
        if (existsSync(from)) copyFileSync(from, join(ARTIFACTS, 'logs', `${n.name}-error.log`));
      }
      rmSync(cluster.dir, { recursive: true, force: true });
    }
    log(`cluster layer: ${((Date.now() - began) / 1000).toFixed(1)} s in all`);
  }
}

export const LAYERS = ['static', 'backend', 'faults', 'frontend', 'browser', 'cluster'] as const;
export type Layer = (typeof LAYERS)[number];

/** `npm test -- backend browser` runs only those layers; no names runs every layer. */
export function layersAsked(): Set<Layer> {
  const asked = process.argv.slice(3);
  for (const a of asked) {
    if (!(LAYERS as readonly string[]).includes(a))
      throw new Error(`unknown test layer ${a} (${LAYERS.join(', ')})`);
  }
  return new Set((asked.length ? asked : LAYERS) as Layer[]);
}
