/**
 * `npm test`'s static layer: a ratchet on each route's JavaScript (issue 12), gzipped: the entry and its
 * static imports plus the route's lazy module and its static imports (`routeScripts`). Reads the build of
 * this run (FRONTEND_DIST) and the committed ceilings (route-ceilings.json, kB per route pattern).
 *
 * Fails when a route grows more than ROUTE_SLACK_KB past its ceiling, or a route without a ceiling is over
 * the ROUTE_BUDGET_KB budget. Routes still over the budget are a warning, not a failure, until they are
 * brought under it. `node --import tsx scripts/bench/route-budget.ts --update` rewrites the ceilings from
 * the build (after a change that makes routes smaller, or one that grows them on purpose).
 */
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { ROUTE_BUDGET_KB, routeScripts, type RouteScripts } from './frontend';

/** How far past its ceiling a route may grow before the check fails (build noise, a small fix). */
export const ROUTE_SLACK_KB = 1;

export const CEILINGS_FILE = join(__dirname, 'route-ceilings.json');

export type Ceilings = Record<string, number>;

/** The failures (one line each) and the routes still over the budget. */
export function checkRoutes(
  routes: RouteScripts[],
  ceilings: Ceilings,
  budgetKb = ROUTE_BUDGET_KB,
  slackKb = ROUTE_SLACK_KB,
): { failures: string[]; overBudget: RouteScripts[] } {
  const failures: string[] = [];
  for (const r of routes) {
    const ceiling = ceilings[r.route];
    if (ceiling === undefined) {
      if (r.gzipKb > budgetKb) {
        failures.push(`${r.route} (${r.module}): new route, ${r.gzipKb} kB gzipped > ${budgetKb} kB budget`);
      }
    } else if (r.gzipKb > ceiling + slackKb) {
      failures.push(
        `${r.route} (${r.module}): ${r.gzipKb} kB gzipped, grew past its ceiling ${ceiling} kB (+${slackKb} kB allowed)`,
      );
    }
  }
  return { failures, overBudget: routes.filter((r) => r.gzipKb > budgetKb) };
}

export function ceilingsOf(routes: RouteScripts[]): Ceilings {
  return Object.fromEntries(
    [...routes].sort((a, b) => a.route.localeCompare(b.route)).map((r) => [r.route, r.gzipKb]),
  );
}

function main(): void {
  const dist = process.env.FRONTEND_DIST ?? join(resolve(__dirname, '..', '..'), 'frontend', 'dist');
  const routes = routeScripts(dist);
  if (process.argv.includes('--update')) {
    writeFileSync(CEILINGS_FILE, `${JSON.stringify(ceilingsOf(routes), null, 2)}\n`);
    console.log(`wrote ${routes.length} route ceilings to ${CEILINGS_FILE}`);
    return;
  }
  const ceilings = existsSync(CEILINGS_FILE)
    ? (JSON.parse(readFileSync(CEILINGS_FILE, 'utf8')) as Ceilings)
    : {};
  const { failures, overBudget } = checkRoutes(routes, ceilings);
  if (overBudget.length > 0) {
    console.warn(
      `warning: ${overBudget.length} of ${routes.length} routes still over the ${ROUTE_BUDGET_KB} kB gzipped budget (largest ${routes[0].route} ${routes[0].gzipKb} kB)`,
    );
  }
  if (failures.length > 0) {
    console.error(
      `route JavaScript over its ceiling (scripts/bench/route-ceilings.json):\n  ${failures.join('\n  ')}\n` +
        'Make it smaller, or if the growth is meant: node --import tsx scripts/bench/route-budget.ts --update',
    );
    process.exit(1);
  }
  console.log(
    `every route within its ceiling (${routes.length} routes; largest ${routes[0].route} ${routes[0].gzipKb} kB)`,
  );
}

if (require.main === module) main();
