/**
 * `npm run bench`: measured side by side in one run, because the machines are noisy. The stack
 * script has started the app on free ports with a throw-away database and passes its addresses in
 * the environment. Each figure is printed as a ratio against a bare baseline doing the same work
 * in the same run:
 *   - GET /api/health (NestJS + TypeORM `SELECT 1`) against a bare node:http server doing `SELECT 1`
 *     through a mysql2 pool on the same MariaDB;
 *   - POST /api/baselines/compute (NestJS, validation, the model) against a bare node:http server
 *     calling the model directly;
 *   - the JavaScript the home route loads, gzipped.
 * The results go to the console and to artifacts/bench.md; docs/performance.md keeps a copy.
 */
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import autocannon from 'autocannon';
import { createPool } from 'mysql2/promise';

const ROOT = resolve(__dirname, '..');
const APP = process.env.APP_URL ?? 'http://127.0.0.1:3000';
const DURATION_S = Number(process.env.BENCH_DURATION_S ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 10);

interface Figures {
  rps: number;
  p50: number;
  p99: number;
  errors: number;
  non2xx: number;
}

async function load(url: string, opts: { method?: 'GET' | 'POST'; body?: string } = {}): Promise<Figures> {
  const r = await autocannon({
    url,
    method: opts.method ?? 'GET',
    body: opts.body,
    headers: opts.body ? { 'content-type': 'application/json' } : undefined,
    connections: CONNECTIONS,
    duration: DURATION_S,
  });
  return {
    rps: r.requests.average,
    p50: r.latency.p50,
    p99: r.latency.p99,
    errors: r.errors,
    non2xx: r.non2xx,
  };
}

function listen(handler: (req: IncomingMessage, res: ServerResponse) => void): Promise<Server> {
  const srv = createServer(handler);
  return new Promise((r) => srv.listen(0, '127.0.0.1', () => r(srv)));
}

const urlOf = (srv: Server, path: string): string =>
  `http://127.0.0.1:${(srv.address() as AddressInfo).port}${path}`;

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((r) => {
    let s = '';
    req.on('data', (c: Buffer) => (s += c.toString()));
    req.on('end', () => r(s));
  });
}

const rows: string[] = [];
function report(name: string, app: Figures, bare: Figures): void {
  const line =
    `| ${name} | ${app.rps.toFixed(0)} | ${bare.rps.toFixed(0)} | ${(app.rps / bare.rps).toFixed(2)} | ` +
    `${app.p50} / ${app.p99} | ${bare.p50} / ${bare.p99} | ${app.errors + app.non2xx} |`;
  rows.push(line);
  console.log(line);
}

const SAMPLE_INPUT = {
  rider: { massKg: 80 },
  riding: { style: 'trail', feel: 'balanced' },
  fork: { travelMm: 140, stanchionMm: 34, spring: 'air', spacers: 1 },
  shock: { strokeMm: 55, wheelTravelMm: 140, spring: 'air', spacers: 0 },
};

async function main(): Promise<void> {
  console.log(`bench: ${DURATION_S} s per run, ${CONNECTIONS} connections, app at ${APP}`);
  rows.push(
    '| route | app req/s | bare req/s | app ÷ bare | app p50 / p99 ms | bare p50 / p99 ms | app errors |',
    '| --- | --- | --- | --- | --- | --- | --- |',
  );
  console.log(rows.join('\n'));

  // 1. health: the same SELECT 1 against the same MariaDB.
  const pool = createPool({
    host: process.env.DB_HOST,
    port: Number(process.env.DB_PORT),
    user: process.env.DB_USER,
    password: process.env.DB_PASSWORD,
    database: process.env.DB_NAME,
    connectionLimit: 10,
  });
  const bareHealth = await listen((_req, res) => {
    pool.query('SELECT 1').then(
      () => {
        res.writeHead(200, { 'content-type': 'application/json' });
        res.end('{"status":"ok","db":"up"}');
      },
      () => {
        res.writeHead(503);
        res.end();
      },
    );
  });
  await load(`${APP}/api/health`); // warm-up
  report('GET /api/health', await load(`${APP}/api/health`), await load(urlOf(bareHealth, '/')));
  bareHealth.close();
  await pool.end();

  // 2. compute: the model behind NestJS against the model alone.
  const modelPath = join(ROOT, 'backend', 'src', 'baselines', 'spring-model', 'index.ts');
  if (existsSync(modelPath)) {
    const model = (await import(modelPath)) as { computeBaseline: (input: unknown) => unknown };
    const bareCompute = await listen((req, res) => {
      void readBody(req).then((body) => {
        const out = JSON.stringify(model.computeBaseline(JSON.parse(body)));
        res.writeHead(200, { 'content-type': 'application/json' });
        res.end(out);
      });
    });
    const body = JSON.stringify(SAMPLE_INPUT);
    const route = `${APP}/api/baselines/compute`;
    await load(route, { method: 'POST', body });
    report(
      'POST /api/baselines/compute',
      await load(route, { method: 'POST', body }),
      await load(urlOf(bareCompute, '/'), { method: 'POST', body }),
    );
    bareCompute.close();
  }

  // 3. the JavaScript the home route loads (entry chunk and its static imports), gzipped.
  const dist = process.env.FRONTEND_DIST ?? join(ROOT, 'frontend', 'dist');
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const scripts = [...html.matchAll(/(?:src|href)="\/(assets\/[^"]+\.js)"/g)].map((m) => m[1]);
  let gz = 0;
  let raw = 0;
  for (const s of scripts) {
    const buf = readFileSync(join(dist, s));
    raw += buf.length;
    gz += gzipSync(buf, { level: 9 }).length;
  }
  const all = readdirSync(join(dist, 'assets')).filter((f) => f.endsWith('.js')).length;
  const sizeLine = `Home route JavaScript: ${(gz / 1024).toFixed(1)} kB gzipped (${(raw / 1024).toFixed(0)} kB raw) in ${scripts.length} file(s) of ${all} chunks.`;
  console.log(sizeLine);

  mkdirSync(join(ROOT, 'artifacts'), { recursive: true });
  writeFileSync(
    join(ROOT, 'artifacts', 'bench.md'),
    `${new Date().toISOString()} — ${DURATION_S} s per run, ${CONNECTIONS} connections, loopback\n\n${rows.join('\n')}\n\n${sizeLine}\n`,
  );
}

main().then(
  () => process.exit(0),
  (err: unknown) => {
    console.error(err);
    process.exit(1);
  },
);
