/**
 * The two stateless-route figures: GET /api/health against a bare server doing the same `SELECT 1`,
 * and POST /api/baselines/compute against a bare server calling the spring model on the same body.
 */
import { join } from 'node:path';
import { createPool } from 'mysql2/promise';
import { type Paired, close, listen, paired, readBody, urlOf } from './load';
import type { Row } from './report';

export const COMPUTE_CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 10);
/** issue 12: the compute endpoint at ≥ 0.6 of the bare server's throughput */
export const COMPUTE_BUDGET = 0.6;

/** A fork and a shock with every overlay: about 10 curves of 50 points and two pressure solves. */
export const SAMPLE_INPUT = {
  rider: { massKg: 80 },
  riding: { style: 'trail', feel: 'balanced' },
  fork: { travelMm: 140, stanchionMm: 34, spring: 'air', spacers: 1 },
  shock: { strokeMm: 55, wheelTravelMm: 140, spring: 'air', spacers: 0 },
};

export function pairedRow(figure: string, p: Paired, budget: string, pass: boolean | null): Row {
  return {
    figure,
    measured: `${p.app.rps.toFixed(0)} req/s`,
    baseline: `${p.bare.rps.toFixed(0)} req/s (p50 / p99 ${p.bare.p50} / ${p.bare.p99} ms)`,
    ratio: p.ratio.toFixed(2),
    latency: `${p.app.p50} / ${p.app.p99}` + (p.app.errors ? ` (${p.app.errors} errors)` : ''),
    budget,
    pass,
  };
}

export async function healthFigure(app: string): Promise<Row> {
  const pool = createPool({
    host: process.env.DB_HOST,
    port: Number(process.env.DB_PORT),
    user: process.env.DB_USER,
    password: process.env.DB_PASSWORD,
    database: process.env.DB_NAME,
    connectionLimit: 10,
  });
  const bare = await listen((_req, res) => {
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
  try {
    const p = await paired({ url: `${app}/api/health` }, { url: urlOf(bare, '/') }, COMPUTE_CONNECTIONS);
    console.log(`  health: rounds ${p.ratios.map((r) => r.toFixed(2)).join(' ')}`);
    return pairedRow(`GET /api/health, ${COMPUTE_CONNECTIONS} connections`, p, 'none (overhead)', null);
  } finally {
    await close(bare);
    await pool.end();
  }
}

export async function computeFigure(app: string, root: string): Promise<Row> {
  const modelPath = join(root, 'backend', 'src', 'baselines', 'spring-model', 'index.ts');
  const model = (await import(modelPath)) as { computeBaseline: (input: unknown) => unknown };
  const bare = await listen((req, res) => {
    void readBody(req).then((body) => {
      const out = JSON.stringify(model.computeBaseline(JSON.parse(body)));
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(out);
    });
  });
  const body = JSON.stringify(SAMPLE_INPUT);
  try {
    const p = await paired(
      { url: `${app}/api/baselines/compute`, method: 'POST', body },
      { url: urlOf(bare, '/'), method: 'POST', body },
      COMPUTE_CONNECTIONS,
    );
    console.log(`  compute: rounds ${p.ratios.map((r) => r.toFixed(2)).join(' ')}`);
    return pairedRow(
      `POST /api/baselines/compute, ${COMPUTE_CONNECTIONS} connections`,
      p,
      `ratio ≥ ${COMPUTE_BUDGET}`,
      p.ratio >= COMPUTE_BUDGET && p.app.errors === 0,
    );
  } finally {
    await close(bare);
  }
}
