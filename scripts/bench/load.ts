/**
 * The load generator of `npm run bench`: autocannon on loopback at a fixed concurrency, and the
 * alternating rounds that make a ratio hold on a noisy machine — app, bare, app, bare … — each
 * pair measured seconds apart, so both sides of a ratio see the same background load. The figure
 * is the median over the rounds (of the ratios, and of each side's p50 and p99).
 */
import { execSync } from 'node:child_process';
import { readFileSync, readdirSync, readlinkSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import autocannon from 'autocannon';

export const DURATION_S = Number(process.env.BENCH_DURATION_S ?? 2);
export const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 6);

export interface Target {
  url: string;
  /** the serving process, for its CPU time per request */
  pid?: number | null;
  method?: 'GET' | 'POST';
  body?: string;
  headers?: Record<string, string>;
}

export interface Figures {
  rps: number;
  p50: number;
  p99: number;
  /** connection errors, timeouts and answers other than 2xx */
  errors: number;
  /** CPU time (user + system) the serving process spent per answered request, ms */
  cpuMsPerReq: number | null;
}

const CLK_TCK = ((): number => {
  try {
    return Number(execSync('getconf CLK_TCK', { encoding: 'utf8' }).trim()) || 100;
  } catch {
    return 100;
  }
})();

/** user + system CPU time of a process so far, ms (/proc/<pid>/stat), or null. */
export function cpuMs(pid: number): number | null {
  try {
    const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return ((Number(f[11]) + Number(f[12])) * 1000) / CLK_TCK;
  } catch {
    return null;
  }
}

/** The process listening on a loopback TCP port (its socket's inode in /proc/net/tcp, then /proc/<pid>/fd). */
export function pidListeningOn(port: number): number | null {
  const hex = port.toString(16).toUpperCase().padStart(4, '0');
  let inode: string | undefined;
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    try {
      for (const line of readFileSync(table, 'utf8').split('\n').slice(1)) {
        const f = line.trim().split(/\s+/);
        if (f[1]?.endsWith(`:${hex}`) && f[3] === '0A') inode = f[9];
      }
    } catch {
      /* no such table */
    }
  }
  if (!inode) return null;
  for (const pid of readdirSync('/proc').filter((d) => /^\d+$/.test(d))) {
    try {
      for (const fd of readdirSync(`/proc/${pid}/fd`)) {
        if (readlinkSync(`/proc/${pid}/fd/${fd}`) === `socket:[${inode}]`) return Number(pid);
      }
    } catch {
      /* gone, or not ours to read */
    }
  }
  return null;
}

export async function load(t: Target, connections: number, durationS = DURATION_S): Promise<Figures> {
  const cpu0 = t.pid ? cpuMs(t.pid) : null;
  const r = await autocannon({
    url: t.url,
    method: t.method ?? 'GET',
    body: t.body,
    headers: { ...(t.body ? { 'content-type': 'application/json' } : {}), ...t.headers },
    connections,
    duration: durationS,
  });
  const cpu1 = t.pid ? cpuMs(t.pid) : null;
  return {
    rps: r.requests.average,
    p50: r.latency.p50,
    p99: r.latency.p99,
    errors: r.errors + r.timeouts + r.non2xx,
    cpuMsPerReq:
      cpu0 !== null && cpu1 !== null && r.requests.total > 0 ? (cpu1 - cpu0) / r.requests.total : null,
  };
}

export const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

export interface Paired {
  app: Figures;
  bare: Figures;
  /** median of the per-round app ÷ bare throughput ratios */
  ratio: number;
  /** each round's ratio, for the record */
  ratios: number[];
  /**
   * median of the rounds' bare ÷ app CPU time per request: the share of the bare server's rate the
   * app would reach with a core to itself — the figure the other work on the machine moves least
   */
  cpuRatio: number | null;
}

/**
 * A warm-up of each side (the JIT, connection pools, the database's buffer pool), then ROUNDS
 * alternating pairs. `app` and `bare` are each side's median over the rounds; errors are summed.
 */
export async function paired(app: Target, bare: Target, connections: number): Promise<Paired> {
  await load(app, connections, 2);
  await load(bare, connections, 2);
  const a: Figures[] = [];
  const b: Figures[] = [];
  for (let i = 0; i < ROUNDS; i++) {
    // alternate which side goes first, so neither always follows the other's garbage collection
    if (i % 2 === 0) {
      a.push(await load(app, connections));
      b.push(await load(bare, connections));
    } else {
      b.push(await load(bare, connections));
      a.push(await load(app, connections));
    }
  }
  const ratios = a.map((x, i) => x.rps / b[i].rps);
  const cpu = a.flatMap((x, i) => {
    const [ac, bc] = [x.cpuMsPerReq, b[i].cpuMsPerReq];
    return ac && bc ? [bc / ac] : [];
  });
  return {
    app: summarise(a),
    bare: summarise(b),
    ratio: median(ratios),
    ratios,
    cpuRatio: cpu.length ? median(cpu) : null,
  };
}

function summarise(xs: Figures[]): Figures {
  return {
    rps: median(xs.map((x) => x.rps)),
    p50: median(xs.map((x) => x.p50)),
    p99: median(xs.map((x) => x.p99)),
    errors: xs.reduce((s, x) => s + x.errors, 0),
    cpuMsPerReq: xs.every((x) => x.cpuMsPerReq !== null) ? median(xs.map((x) => x.cpuMsPerReq!)) : null,
  };
}

/** A bare node:http server on a free loopback port. */
export function listen(handler: (req: IncomingMessage, res: ServerResponse) => void): Promise<Server> {
  const srv = createServer(handler);
  return new Promise((r) => srv.listen(0, '127.0.0.1', () => r(srv)));
}

export const urlOf = (srv: Server, path: string): string =>
  `http://127.0.0.1:${(srv.address() as AddressInfo).port}${path}`;

export function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((r) => {
    let s = '';
    req.on('data', (c: Buffer) => (s += c.toString()));
    req.on('end', () => r(s));
  });
}

export function close(srv: Server): Promise<void> {
  srv.closeAllConnections();
  return new Promise((r) => srv.close(() => r()));
}

export interface BareUrls {
  health: string;
  compute: string;
  availability: string;
}

/** Starts scripts/bench/bare-servers.ts as a child process; `stop` ends it (by its own pid). */
export async function startBareServers(): Promise<{
  urls: BareUrls;
  pid: number | null;
  stop: () => Promise<void>;
}> {
  const { spawn } = await import('node:child_process');
  const child = spawn(process.execPath, ['--import', 'tsx', `${__dirname}/bare-servers.ts`], {
    env: process.env,
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const urls = await new Promise<BareUrls>((resolve, reject) => {
    let out = '';
    child.stdout.on('data', (c: Buffer) => {
      out += c.toString();
      const line = out.split('\n').find((l) => l.startsWith('{'));
      if (line) resolve(JSON.parse(line) as BareUrls);
    });
    child.on('exit', (code) => reject(new Error(`bare servers exited (${code})`)));
  });
  return {
    urls,
    pid: child.pid ?? null,
    stop: () =>
      new Promise((r) => {
        if (child.exitCode !== null) return r();
        child.once('exit', () => r());
        child.kill('SIGTERM');
      }),
  };
}
