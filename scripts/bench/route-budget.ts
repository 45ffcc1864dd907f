/**
 * `npm test`'s static layer: fails when any route's JavaScript is over the budget of issue 12
 * (ROUTE_BUDGET_KB gzipped: the entry and its static imports plus the route's lazy module and its
 * static imports), naming each route and its size. Reads the build of this run (FRONTEND_DIST).
 */
import { join, resolve } from 'node:path';
import { ROUTE_BUDGET_KB, overBudget, routeScripts } from './frontend';

const dist = process.env.FRONTEND_DIST ?? join(resolve(__dirname, '..', '..'), 'frontend', 'dist');
const routes = routeScripts(dist);
const over = overBudget(routes);
const largest = routes[0];
if (over.length > 0) {
  console.error(`route JavaScript over ${ROUTE_BUDGET_KB} kB gzipped:\n  ${over.join('\n  ')}`);
  process.exit(1);
}
console.log(
  `every route within ${ROUTE_BUDGET_KB} kB gzipped (${routes.length} routes; largest ${largest.route} ${largest.gzipKb} kB)`,
);
