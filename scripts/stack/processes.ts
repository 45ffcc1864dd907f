/** The processes a run starts and owns, and how they are stopped by PID. */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, openSync } from 'node:fs';
import { relative } from 'node:path';
import { ROOT, log } from './common';

/* ------------------------------------------------------------------ processes we own */

export interface Owned {
  name: string;
  child: ChildProcess;
}

export const owned: Owned[] = [];
let mariadbPidFile: string | null = null;
let stopping = false;
/** children stopped on purpose before the end of the run (stopChildren): their exit is not news */
const stoppedOnPurpose = new WeakSet<ChildProcess>();

/** The pid file of the MariaDB this run started (stopAll stops it last). */
export function setMariaDbPidFile(file: string): void {
  mariadbPidFile = file;
}

/** True once stopAll has begun. */
export const isStopping = (): boolean => stopping;

export function spawnOwned(
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
    if (!stopping && !stoppedOnPurpose.has(child))
      log(`${name} exited (${signal ?? code}); see ${relative(ROOT, logFile)}`);
  });
  return child;
}

export function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export async function waitForExit(pid: number, ms: number): Promise<boolean> {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (!alive(pid)) return true;
    await sleep(100);
  }
  return !alive(pid);
}

export async function stopPid(name: string, pid: number, graceMs = 10_000): Promise<void> {
  if (!alive(pid)) return;
  process.kill(pid, 'SIGTERM');
  if (!(await waitForExit(pid, graceMs))) {
    log(`${name} (pid ${pid}) did not stop in time; killing it`);
    process.kill(pid, 'SIGKILL');
    await waitForExit(pid, 2000);
  }
}

export async function stopAll(): Promise<void> {
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

export const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

export function run(
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
export function runAsync(cmd: string, args: string[], env: NodeJS.ProcessEnv, cwd = ROOT): Promise<number> {
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

/** Stops some of the processes this run owns (newest first), e.g. the cluster once its layer ran. */
export async function stopChildren(children: ChildProcess[]): Promise<void> {
  for (const child of [...children].reverse()) {
    stoppedOnPurpose.add(child);
    if (child.pid && child.exitCode === null && child.signalCode === null) {
      const entry = owned.find((o) => o.child === child);
      await stopPid(entry?.name ?? 'process', child.pid, 30_000);
    }
    const i = owned.findIndex((o) => o.child === child);
    if (i >= 0) owned.splice(i, 1);
  }
}
