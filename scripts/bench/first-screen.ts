/**
 * The first screen's figures for `npm run bench` (issue 12): the JavaScript each route loads,
 * gzipped (scripts/bench/frontend.ts reads the build's manifest), against the 150 kB budget, and
 * Lighthouse 12.2.3 mobile performance on `/baseline` (budget ≥ 0.95), a shop's booking page and the
 * Workshop's Requests signed in as the shop's owner (≥ 0.9 each).
 */
import { randomBytes } from 'node:crypto';
import { ROUTE_BUDGET_KB, budgetPages, lighthouseScores, routeScripts } from './frontend';
import type { Row } from './report';
import { benchPool, seedFiveYearShop, seedShopOwner } from './seed';

const LIGHTHOUSE_BUDGET: Record<string, number> = {
  baseline: 0.95,
  'booking page': 0.9,
  'Workshop › Requests': 0.9,
};

export async function firstScreenFigures(appUrl: string, dist: string, notes: string[]): Promise<Row[]> {
  const routes = routeScripts(dist);
  const over = routes.filter((r) => r.gzipKb > ROUTE_BUDGET_KB);
  const largest = routes[0];
  const smallest = routes[routes.length - 1];
  const rows: Row[] = [
    {
      figure: `JavaScript per route, gzipped (${routes.length} routes)`,
      measured: `largest ${largest.route} ${largest.gzipKb.toFixed(1)} kB, smallest ${smallest.route} ${smallest.gzipKb.toFixed(1)} kB; ${over.length} over`,
      baseline: '—',
      ratio: '—',
      latency: '—',
      budget: `every route ≤ ${ROUTE_BUDGET_KB} kB`,
      pass: over.length === 0,
    },
  ];
  notes.push(
    `route JavaScript (kB gzipped, entry + static imports + the route's module): ${routes
      .map((r) => `${r.route} ${r.gzipKb.toFixed(1)}`)
      .join(', ')}.`,
  );

  // the five-year shop of the availability step is the booking page; its owner opens Requests
  const shopSlug = 'bench-five-years';
  const pool = benchPool(2);
  let owner: { email: string; password: string };
  try {
    // run alone (BENCH_ONLY=first-screen), the availability step has not seeded the shop
    const [rows] = await pool.query('SELECT id FROM shops WHERE slug = ?', [shopSlug]);
    if ((rows as unknown[]).length === 0) await seedFiveYearShop(pool, Date.now());
    owner = await seedShopOwner(pool, shopSlug, randomBytes(18).toString('base64url'));
  } finally {
    await pool.end();
  }
  const scores = await lighthouseScores(appUrl, budgetPages(shopSlug, owner));
  for (const s of scores) {
    const min = LIGHTHOUSE_BUDGET[s.name] ?? 0.9;
    rows.push({
      figure: `Lighthouse mobile performance, ${s.name} (${new URL(s.url).pathname})`,
      measured: `${s.score.toFixed(2)}: FCP ${(s.fcpMs / 1000).toFixed(1)} s, LCP ${(s.lcpMs / 1000).toFixed(1)} s, TBT ${s.tbtMs.toFixed(0)} ms, CLS ${s.cls.toFixed(3)}`,
      baseline: '—',
      ratio: '—',
      latency: '—',
      budget: `≥ ${min}`,
      pass: s.score >= min,
    });
  }
  return rows;
}
