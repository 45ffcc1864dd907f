/**
 * The first screen's figures for `npm run bench` (issue 12): the JavaScript each route loads,
 * gzipped (scripts/bench/frontend.ts reads the build's manifest), against the 150 kB budget, and
 * Lighthouse 12.2.3 mobile performance on `/baseline` (budget ≥ 0.95), a shop's booking page and the
 * Workshop's Requests signed in as the shop's owner (≥ 0.9 each).
 */
import { randomBytes } from 'node:crypto';
import {
  ROUTE_BUDGET_KB,
  budgetPages,
  lighthouseScores,
  routeScripts,
  type LighthouseScores,
} from './frontend';
import { buildFloor, floorPageKb, serveFloor } from './floor';
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
  // the stack's floor (floor.ts), built once: its two pages weighed here, its screen scored below
  const floorDir = buildFloor();
  const floorScreenKb = floorPageKb(floorDir, 'index.html');
  const floorFormKb = floorPageKb(floorDir, 'form.html');
  const rows: Row[] = [
    {
      figure: `JavaScript per route, gzipped (${routes.length} routes)`,
      measured: `largest ${largest.route} ${largest.gzipKb.toFixed(1)} kB, smallest ${smallest.route} ${smallest.gzipKb.toFixed(1)} kB; ${over.length} over`,
      baseline: `floor: a screen ${floorScreenKb.toFixed(1)} kB, a form ${floorFormKb.toFixed(1)} kB`,
      ratio: `${(smallest.gzipKb / floorFormKb).toFixed(2)}–${(largest.gzipKb / floorFormKb).toFixed(2)} of the form floor`,
      latency: '—',
      budget: `every route ≤ ${ROUTE_BUDGET_KB} kB`,
      pass: over.length === 0,
    },
  ];
  notes.push(
    `route JavaScript floor (frontend/bench-floor, built in this run, weighed as a route is): one screen on React, MUI and the theme ${floorScreenKb.toFixed(1)} kB; the same with the least a form page takes from the stack's other fixed libraries (React Router's declarative router, SWR, react-hook-form with a built-in rule, MUI's input parts) ${floorFormKb.toFixed(1)} kB.` +
      (floorFormKb > ROUTE_BUDGET_KB
        ? ` That is over the ${ROUTE_BUDGET_KB} kB budget before any of the app's own code: no route with a form can meet it on this stack.`
        : ''),
  );
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
  // The floor's screen, scored before and after the app's pages: the mean of the two is the baseline
  // each page is read against, and their spread says how much the machine moved meanwhile.
  const floor = await serveFloor(floorDir);
  let scores: LighthouseScores[];
  let floorRuns: LighthouseScores[];
  try {
    const floorPage = [{ name: 'floor', path: '/' }];
    const before = await lighthouseScores(floor.url, floorPage);
    scores = await lighthouseScores(appUrl, budgetPages(shopSlug, owner));
    const after = await lighthouseScores(floor.url, floorPage);
    floorRuns = [...before, ...after];
  } finally {
    await floor.close();
  }
  const floorScore = floorRuns.reduce((n, s) => n + s.score, 0) / floorRuns.length;
  const metrics = (s: LighthouseScores): string =>
    `FCP ${(s.fcpMs / 1000).toFixed(1)} s, LCP ${(s.lcpMs / 1000).toFixed(1)} s, TBT ${s.tbtMs.toFixed(0)} ms, CLS ${s.cls.toFixed(3)}`;
  rows.push({
    figure:
      "Lighthouse mobile performance, the stack's floor (React + MUI + the theme, one screen; frontend/bench-floor)",
    measured: floorRuns.map((s) => `${s.score.toFixed(2)}: ${metrics(s)}`).join('; then '),
    baseline: '—',
    ratio: '—',
    latency: '—',
    budget: 'none (the baseline of the rows below)',
    pass: null,
  });
  for (const s of scores) {
    const min = LIGHTHOUSE_BUDGET[s.name] ?? 0.9;
    rows.push({
      figure: `Lighthouse mobile performance, ${s.name} (${new URL(s.url).pathname})`,
      measured: `${s.score.toFixed(2)}: ${metrics(s)}`,
      baseline: `floor ${floorScore.toFixed(2)}`,
      ratio: floorScore > 0 ? (s.score / floorScore).toFixed(2) : '—',
      latency: '—',
      budget: `≥ ${min}`,
      pass: s.score >= min,
    });
  }
  notes.push(
    `Lighthouse: the floor page (one screen on React, MUI and the app's theme, nothing else) scored ${floorRuns
      .map((s) => s.score.toFixed(2))
      .join(
        ' before and ',
      )} after the app's pages; a page's ratio is its score over their mean. A budget above the floor cannot be met by this stack on this machine, whatever the app does.`,
  );
  return rows;
}
