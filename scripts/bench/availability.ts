/**
 * Availability at a realistic data size: a shop with five years of appointments (seed.ts), the
 * app's GET /api/shops/:slug/availability for the month the booking calendar asks for, against a
 * bare node:http server running the same bench-time query through a mysql2 pool and answering the
 * same rows as JSON.
 */
import { DateTime } from 'luxon';
import type { Pool } from 'mysql2/promise';
import { paired } from './load';
import { type Servers, pairedRow } from './http-figures';
import type { Row } from './report';
import { BUSY_SQL, benchPool, seedFiveYearShop } from './seed';

export const AVAILABILITY_CONNECTIONS = Number(process.env.BENCH_AVAILABILITY_CONNECTIONS ?? 50);
/** issue 12: availability p99 < 30 ms at 50 connections */
export const AVAILABILITY_P99_MS = 30;

export async function availabilityFigure(s: Servers, notes: string[]): Promise<Row> {
  const app = s.app;
  const pool: Pool = benchPool(10);
  try {
    const now = Date.now();
    const { shop, stats } = await seedFiveYearShop(pool, now);
    console.log(
      `  seeded ${stats.appointments} appointments over five years (${stats.live} live, ${stats.cells} bench cells, ${stats.closures} closures) in ${(stats.ms / 1000).toFixed(1)} s`,
    );
    const service = shop.services[0];
    // the month the booking calendar asks for: tomorrow and the 30 days after it, in the shop's zone
    const today = DateTime.fromMillis(now, { zone: shop.timeZone }).startOf('day');
    const from = today.plus({ days: 1 });
    const to = from.plus({ days: 30 });
    const path = `/api/shops/${shop.slug}/availability?serviceId=${service.id}&from=${from.toISODate()}&to=${to.toISODate()}`;
    // the same window the service reads (a day either side of the range)
    const fromMs = from.minus({ days: 1 }).toJSDate();
    const toMs = to.plus({ days: 2 }).toJSDate();
    const bare = `${s.bare.availability}?shopId=${shop.id}&fromMs=${fromMs.getTime()}&toMs=${toMs.getTime()}`;
    const first = await fetch(`${app}${path}`);
    if (!first.ok) throw new Error(`availability answered ${first.status}: ${await first.text()}`);
    const starts = ((await first.json()) as unknown[]).length;
    const [busyRows] = await pool.query(BUSY_SQL, [shop.id, toMs, fromMs, new Date()]);
    const busy = (busyRows as unknown[]).length;
    const p = await paired(
      { url: `${app}${path}`, pid: s.appPid },
      { url: bare, pid: s.barePid },
      AVAILABILITY_CONNECTIONS,
    );
    console.log(`  availability: rounds ${p.ratios.map((r) => r.toFixed(2)).join(' ')}`);
    notes.push(
      `availability: shop \`${shop.slug}\` with ${stats.appointments} appointments over five years ` +
        `(${stats.live} live ones ahead, ${stats.cells} bench cells); the request is the booking ` +
        `calendar's month (${from.toISODate()} … ${to.toISODate()}, ${starts} free starts from ${busy} busy rows); ` +
        `the bare server answers those ${busy} rows.`,
    );
    if (p.bare.p99 >= AVAILABILITY_P99_MS)
      notes.push(
        `availability: the bare query alone answered with p99 ${p.bare.p99} ms at ${AVAILABILITY_CONNECTIONS} connections in this run, ` +
          `so the machine's other load, not the route, set the p99 here; per request the app spent ` +
          `${p.app.cpuMsPerReq?.toFixed(2)} ms of CPU against the bare server's ${p.bare.cpuMsPerReq?.toFixed(2)} ms.`,
      );
    return pairedRow(
      `GET availability, 31 days, 5 years of data, ${AVAILABILITY_CONNECTIONS} connections`,
      p,
      `p99 < ${AVAILABILITY_P99_MS} ms`,
      p.app.p99 < AVAILABILITY_P99_MS && p.app.errors === 0,
    );
  } finally {
    await pool.end();
  }
}
