/**
 * docs/performance.md, written by every `npm run bench`: what each figure measures and why, then
 * this run's table with its date, machine and command.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
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
  same pipeline and TypeORM. No budget: it is the overhead every request pays.
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
- **home route JavaScript**: the entry chunk and its static imports, gzipped at level 9.

## What was made faster, and why (issue 12)

Profiles: \`node --cpu-prof\` on the built backend under autocannon, self time grouped by package.

- **compute**: Express hashed every JSON answer for an ETag (SHA-1 over the 27 kB baseline, about a third
  of what serializing it costs) although every API answer is \`no-store\` and so can never be revalidated:
  \`etag\` is off for what the app sends (setup-app.ts; static files keep serve-static's own). The global
  ValidationPipe is the next cost after the model: class-validator rebuilt its metadata list (a filter
  over all metadata and an inheritance walk over every registered class) and grouped it by property for
  every nested object of every request, and Nest's binary-value check looked it up once more. Those
  look-ups are now kept per class and options and dropped when a decorator registers new metadata
  (common/pipes/validation-metadata-cache.ts, frozen, with a spec); the rules and options —
  \`whitelist\`, \`forbidNonWhitelisted\`, \`transform\`, every constraint — are unchanged. Looked at and left:
  helmet's headers (a few µs), the three global guards (metadata reads; the session guard returns at once
  on a public route), the body parser and its depth check, cookie parsing (no cookie, no work), one
  serialization only (Nest hands the object to \`res.json\`), no logging per request.
- **availability**: the bench-time query used \`IDX_appointments_shop_start\`, a range on \`start_at <
  to\` that reads every earlier appointment of the shop (five years of them), or the state index across
  all shops. \`IDX_appointments_shop_live\` (shop, state, keep_until, start_at, bench, hold_expires_at;
  migration 1766300000000) reads only the shop's live appointments that end after the range starts and
  answers from the index. Luxon's offset look-ups (Intl's \`formatToParts\`) were most of the CPU: the
  offered starts were computed with two or three Luxon calls per start; now an interval whose offset is
  the same at opening and closing is walked in epoch milliseconds with its strings built from Luxon's own
  ISO of the opening (days the clocks change still go start by start), and the offered starts of one
  calendar, service length and range are kept by their inputs' value (64 lists), so bookings and "now"
  are applied to a kept list. The route read the shop twice and then the service, hours, closures and
  bench time one after the other: the shop's calendar is now reused for a second (a change through this
  instance is seen at once; bookings read it afresh), the service and the bench time are read in
  parallel, and the bench time as raw rows.
`;
  writeFileSync(join(root, 'docs', 'performance.md'), doc);
}
