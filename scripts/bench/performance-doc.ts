/**
 * docs/performance.md, written by every `npm run bench`: what each figure measures and why, then
 * this run's table with its date, machine and command.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { AVAILABILITY_CONNECTIONS } from './availability';
import { COMPUTE_CONNECTIONS } from './http-figures';
import { DURATION_S, ROUNDS } from './load';
import { type Row, table } from './report';

export interface PerformanceRun {
  date: string;
  machine: string;
  command: string;
  rows: Row[];
  notes: string[];
}

export function writePerformanceDoc(root: string, run: PerformanceRun): void {
  const failed = run.rows.filter((r) => r.pass === false).length;
  const doc = `# Performance

Written by \`${run.command}\` (scripts/bench.ts and scripts/bench/). The stack comes up on free ports with a
throw-away database, exactly as \`npm test\` starts it, then autocannon loads the app and a bare baseline
doing the same work, on the same machine, in the same run — so the ratio, not the absolute number, is the
figure to compare between runs and machines. Each pair is a warm-up of both sides, then ${ROUNDS} alternating
rounds of ${DURATION_S} s (app, bare, bare, app, …): the ratio is the median of the rounds' ratios and each
p50 / p99 the median of the rounds' values, because other work on a two-core machine comes and goes within
seconds. The bare baselines run in a process of their own (bare-servers.ts), as the app does, so that neither
shares an event loop with autocannon. Beside each rate the table gives the CPU time (user + system, from
\`/proc/<pid>/stat\`) each server process spent per answered request, and in brackets the ratio of those
(bare ÷ app): the share of the bare rate the app would reach with a core to itself. Other work on the
machine moves it less than the rates, but not nothing: a loaded machine raises the app's CPU per request more
than the small bare server's (more code and data to keep in the caches), so read it with the load average
the run prints. Figures from before 2026-12-02 ran the bare servers inside autocannon's own process, which
slowed them, and are not comparable. Override with \`BENCH_ROUNDS\`, \`BENCH_DURATION_S\`, \`BENCH_CONNECTIONS\` (compute and health, 10)
and \`BENCH_AVAILABILITY_CONNECTIONS\` (50). The command exits non-zero when a budget fails.

## ${run.date.slice(0, 10)}

${run.date}, ${run.machine}, loopback. ${failed ? `**${failed} budget(s) failed.**` : 'Every budget holds.'}

${table(run.rows)}

${run.notes.map((n) => `- ${n}`).join('\n')}

## What each figure measures

- **compute** (\`POST /api/baselines/compute\`, issue 12 budget ≥ 0.6 of the bare throughput): the bare
  server parses the body, calls the spring model and serializes its answer; the app adds Express, helmet's
  headers, the JSON body parser with its depth check, the three global guards (origin, session — the route
  is public — and roles), the global ValidationPipe on the nested DTOs (whitelist, unknown fields refused,
  transform) and the exception filter. The body is a fork and a shock with every overlay (about 10 curves
  of 50 points and two pressure solves).
- **health**: the bare server runs \`SELECT 1\` through a mysql2 pool on the same MariaDB; the app adds the
  same pipeline and TypeORM. No budget: it is the overhead every request pays. It is measured twice: at
  ${COMPUTE_CONNECTIONS} connections, and at the availability figure's ${AVAILABILITY_CONNECTIONS} — the app's cheapest route, so the
  floor under the availability budget (no route answers faster than the pipeline every route runs).
- **availability** (budget p99 < 30 ms at 50 connections): the booking calendar's request for a month of
  free starts, for a shop with five years of appointments seeded by the bench (scripts/bench/seed.ts:
  synthetic, from a fixed-seed PRNG, bulk inserts). The bare server runs the app's bench-time query through
  a mysql2 pool and answers its rows; the app also reads the shop, the service, the hours and closures and
  computes every free start of the month in the shop's zone.
- **parallel bookings**: a shop with three benches (its capacity at one time) and a free service, 100
  riders signed in through \`POST /api/auth/sign-in\` (stored with a cheap scrypt cost so that this takes
  a second), then 100 \`POST /api/appointments\` for the same start sent at once. Exactly three may be
  booked, every other answer must be a 409 saying the time is taken, none a 5xx; the database is counted
  afterwards. p50 / p99 are of the 100 answers' times.
- **JavaScript per route** (budget: every route ≤ 150 kB gzipped): per lazy route module, the entry and its
  static imports plus the route's module and its static imports, from the build's \`.vite/manifest.json\`,
  each file once, gzip level 9 (scripts/bench/frontend.ts). What a page loads later through \`lazy()\` (a
  chart, the booking calendar, a data grid) is not counted. The baseline is the floor of
  \`frontend/bench-floor/\`, built in the same run and weighed the same way: one screen on React, MUI and
  the theme (\`index.html\`), and the least page with a form the fixed stack allows (\`form.html\`: the
  same screen, React Router's declarative router with one route, SWR asking for the session,
  react-hook-form holding one field with a built-in rule, and MUI's input parts — not TextField, which
  brings Select, Menu, Popover and Modal with it).
- **Lighthouse** (budgets ≥ 0.95 on \`/baseline\`, ≥ 0.9 on the booking page and Workshop › Requests):
  Lighthouse 12.2.3 programmatically against Debian's Chromium, mobile, default simulated throttling (slow
  4G, 4× CPU), performance only, a fresh profile per page; Requests is opened as the five-year shop's owner
  (signed in through the API, the session cookie sent with \`extraHeaders\`).

${kept(root)}`;
  writeFileSync(join(root, 'docs', 'performance.md'), doc);
}

/** What the doc says by hand (from "## What was made faster" on) is kept across runs. */
const KEPT_FROM = '## What was made faster';
function kept(root: string): string {
  const file = join(root, 'docs', 'performance.md');
  const old = existsSync(file) ? readFileSync(file, 'utf8') : '';
  const at = old.indexOf(KEPT_FROM);
  return at >= 0 ? old.slice(at) : `${KEPT_FROM}\n\n(nothing yet)\n`;
}
