/**
 * `npm run bench`: measured side by side in one run, because the machines are noisy. The stack
 * script has started the app on free ports with a throw-away database and passes its addresses in
 * the environment. Each server figure is a ratio against a bare baseline doing the same work in
 * the same run, in alternating rounds after a warm-up (scripts/bench/load.ts):
 *   - GET /api/health (NestJS + TypeORM `SELECT 1`) against a bare node:http server doing `SELECT 1`
 *     through a mysql2 pool on the same MariaDB;
 *   - POST /api/baselines/compute (NestJS, validation, the model) against a bare node:http server
 *     calling the model directly — budget: ≥ 0.6 of the bare throughput;
 *   - GET /api/health again at the availability figure's connections: the app's cheapest route, so the
 *     floor under the availability budget;
 *   - availability for a shop with five years of appointments (seeded here, scripts/bench/seed.ts)
 *     against a bare mysql2 query answering the same rows — budget: p99 < 30 ms at 50 connections;
 *   - 100 parallel bookings of one time: exactly the capacity booked, the rest 409, no 5xx;
 *   - the first screen's figures (scripts/bench/frontend.ts, when present).
 * BENCH_ONLY=compute,health,health-50,availability,bookings,first-screen picks steps (then docs/performance.md is left
 * as it is); scripts/bench/performance-doc.ts lists the other knobs.
 * The table goes to the console, artifacts/bench.md and docs/performance.md; the exit code is 1
 * when a budget fails.
 */
import { resolve, join } from 'node:path';
import { AVAILABILITY_CONNECTIONS, availabilityFigure } from './bench/availability';
import { bookingBurstFigure } from './bench/bookings';
import { firstScreenFigures } from './bench/first-screen';
import { type Servers, computeFigure, healthFigure } from './bench/http-figures';
import { DURATION_S, ROUNDS, pidListeningOn, startBareServers } from './bench/load';
import { type Row, machine, table, writeArtifact } from './bench/report';
import { writePerformanceDoc } from './bench/performance-doc';

const ROOT = resolve(__dirname, '..');
const APP = process.env.APP_URL ?? 'http://127.0.0.1:3000';
/** what `npm run bench` runs; the doc names it as the command that made the figures */
export const COMMAND = 'npm run bench';

async function main(): Promise<number> {
  const began = Date.now();
  console.log(`bench: ${ROUNDS} alternating rounds of ${DURATION_S} s after a warm-up, app at ${APP}`);
  const rows: Row[] = [];
  const notes: string[] = [];
  // BENCH_ONLY=availability,bookings runs only those steps (and leaves docs/performance.md alone)
  const only = process.env.BENCH_ONLY?.split(',').filter(Boolean);
  const step = async (name: string, f: () => Promise<Row | Row[]>): Promise<void> => {
    if (only && !only.includes(name)) return;
    const t = Date.now();
    console.log(`bench: ${name}`);
    const out = await f();
    for (const r of Array.isArray(out) ? out : [out]) {
      rows.push(r);
      console.log(
        `  ${r.figure}: ${r.measured} | ${r.baseline} | ${r.ratio} | ${r.latency} | ${r.pass ?? '—'}`,
      );
    }
    console.log(`  (${((Date.now() - t) / 1000).toFixed(0)} s)`);
  };

  // The server side (issue 12), against the bare servers in a process of their own.
  const bare = await startBareServers();
  const servers: Servers = {
    app: APP,
    appPid: pidListeningOn(Number(new URL(APP).port)),
    bare: bare.urls,
    barePid: bare.pid,
  };
  try {
    await step('compute', () => computeFigure(servers, notes));
    await step('health', () => healthFigure(servers));
    await step('health-50', () => healthFigure(servers, AVAILABILITY_CONNECTIONS));
    await step('availability', () => availabilityFigure(servers, notes));
    await step('bookings', () => bookingBurstFigure(APP, notes));
  } finally {
    await bare.stop();
  }

  // The first screen: JavaScript per route and Lighthouse (scripts/bench/first-screen.ts), after the
  // server's figures so that autocannon and Chromium never run at once.
  const dist = process.env.FRONTEND_DIST ?? join(ROOT, 'frontend', 'dist');
  await step('first-screen', () => firstScreenFigures(APP, dist, notes));

  const date = new Date().toISOString();
  const header = `${date} — ${machine()}; \`${COMMAND}\`, ${ROUNDS} alternating rounds of ${DURATION_S} s after a warm-up, loopback, ${((Date.now() - began) / 1000).toFixed(0)} s`;
  console.log(`\n${header}\n\n${table(rows)}\n`);
  for (const n of notes) console.log(`- ${n}`);
  writeArtifact(ROOT, header, rows, notes);
  if (!only) writePerformanceDoc(ROOT, { date, machine: machine(), command: COMMAND, rows, notes });
  const failed = rows.filter((r) => r.pass === false);
  if (failed.length) console.error(`bench: budget failed: ${failed.map((r) => r.figure).join('; ')}`);
  return failed.length ? 1 : 0;
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(err);
    process.exit(1);
  },
);
