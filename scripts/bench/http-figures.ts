/**
 * The two stateless-route figures: GET /api/health against a bare server doing the same `SELECT 1`,
 * and POST /api/baselines/compute against a bare server calling the spring model on the same body
 * (both in bare-servers.ts).
 */
import { type Paired, paired } from './load';
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

/** The app and the bare servers: where they answer, and their processes (for CPU time). */
export interface Servers {
  app: string;
  appPid: number | null;
  bare: { health: string; compute: string; availability: string };
  barePid: number | null;
}

const cpu = (ms: number | null): string => (ms === null ? '' : `, ${ms.toFixed(2)} ms CPU/req`);

export function pairedRow(figure: string, p: Paired, budget: string, pass: boolean | null): Row {
  return {
    figure,
    measured: `${p.app.rps.toFixed(0)} req/s${cpu(p.app.cpuMsPerReq)}`,
    baseline: `${p.bare.rps.toFixed(0)} req/s${cpu(p.bare.cpuMsPerReq)}, p50 / p99 ${p.bare.p50} / ${p.bare.p99} ms`,
    ratio: p.ratio.toFixed(2) + (p.cpuRatio === null ? '' : ` (CPU ${p.cpuRatio.toFixed(2)})`),
    latency: `${p.app.p50} / ${p.app.p99}` + (p.app.errors ? ` (${p.app.errors} errors)` : ''),
    budget,
    pass,
  };
}

/**
 * GET /api/health (one `SELECT 1` behind the app's whole pipeline: headers, guards, filters) against the
 * bare server. At the availability figure's 50 connections it is the app's floor for that budget: no
 * route of the app answers faster than its cheapest one.
 */
export async function healthFigure(s: Servers, connections = COMPUTE_CONNECTIONS): Promise<Row> {
  const p = await paired(
    { url: `${s.app}/api/health`, pid: s.appPid },
    { url: s.bare.health, pid: s.barePid },
    connections,
  );
  console.log(`  health (${connections}): rounds ${p.ratios.map((r) => r.toFixed(2)).join(' ')}`);
  const budget =
    connections === COMPUTE_CONNECTIONS ? 'none (overhead)' : 'none (the floor of the row below)';
  return pairedRow(`GET /api/health, ${connections} connections`, p, budget, null);
}

export async function computeFigure(s: Servers, notes: string[]): Promise<Row> {
  const body = JSON.stringify(SAMPLE_INPUT);
  const p = await paired(
    { url: `${s.app}/api/baselines/compute`, method: 'POST', body, pid: s.appPid },
    { url: s.bare.compute, method: 'POST', body, pid: s.barePid },
    COMPUTE_CONNECTIONS,
  );
  console.log(
    `  compute: rounds ${p.ratios.map((r) => r.toFixed(2)).join(' ')}; CPU ratio ${p.cpuRatio?.toFixed(2)}`,
  );
  if (p.cpuRatio !== null && p.cpuRatio < COMPUTE_BUDGET)
    notes.push(
      `compute: the rate ratio is the budget's figure; by CPU time per request the app reaches ` +
        `${p.cpuRatio.toFixed(2)} of the bare server (${p.app.cpuMsPerReq?.toFixed(2)} against ` +
        `${p.bare.cpuMsPerReq?.toFixed(2)} ms), below ${COMPUTE_BUDGET}; the machine's other load raises the app's CPU per request more than the bare server's (load average in the header).`,
    );
  return pairedRow(
    `POST /api/baselines/compute, ${COMPUTE_CONNECTIONS} connections`,
    p,
    `ratio ≥ ${COMPUTE_BUDGET}`,
    p.ratio >= COMPUTE_BUDGET && p.app.errors === 0,
  );
}
