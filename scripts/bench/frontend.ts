/**
 * The first screen, measured (issue 12): what JavaScript each route of the built front end loads,
 * gzipped, and Lighthouse's mobile performance on a running app.
 *
 *   routeScripts(distDir)                       per route: entry + its static imports + the route's lazy
 *                                               module + its static imports, from Vite's manifest
 *   lighthouseScores(appUrl, pages, chromium)   Lighthouse 12.2.3, mobile, default simulated throttling
 *
 * `npm run bench` (scripts/bench.ts) uses both; `npm test`'s static layer checks the route budget with
 * routeScripts (scripts/stack/layers.ts). By hand, against a running `npm start`:
 *
 *   node --import tsx scripts/bench/frontend.ts http://127.0.0.1:3000 [distDir]
 *
 * The Workshop page needs a staff sign-in: BENCH_STAFF_EMAIL and BENCH_STAFF_PASSWORD, else the first
 * owner in .data/demo-accounts.txt (what `npm start` seeds and prints).
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';

const ROOT = resolve(__dirname, '..', '..');

/** The route budget of issue 12: every route's JavaScript, gzipped. */
export const ROUTE_BUDGET_KB = 150;

/* ------------------------------------------------------------------ JavaScript per route */

/** One entry of Vite's `.vite/manifest.json` (vite.dev/guide/backend-integration). */
interface ManifestChunk {
  file: string;
  src?: string;
  isEntry?: boolean;
  isDynamicEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
  css?: string[];
}
type Manifest = Record<string, ManifestChunk>;

export interface RouteScripts {
  /** the URL pattern from the router (`/shops/:slug`), or the module's name when the router has none */
  route: string;
  /** the lazy route module, `src/app/routes/<name>.tsx` */
  module: string;
  /** gzipped (level 9) kB (1000 bytes) of every JS file the route loads before it draws */
  gzipKb: number;
  rawKb: number;
  files: number;
}

/** `paths.x` → '/x' (config/paths.ts) and route module → `paths.x` (app/router.tsx), by reading the source. */
function routePatterns(frontendSrc: string): Map<string, string> {
  const out = new Map<string, string>();
  const pathsFile = join(frontendSrc, 'config', 'paths.ts');
  const routerFile = join(frontendSrc, 'app', 'router.tsx');
  if (!existsSync(pathsFile) || !existsSync(routerFile)) return out;
  const pathsSrc = readFileSync(pathsFile, 'utf8');
  const block = pathsSrc.slice(pathsSrc.indexOf('export const paths'), pathsSrc.indexOf('} as const'));
  const paths = new Map([...block.matchAll(/^\s*(\w+):\s*'([^']*)'/gm)].map((m) => [m[1], m[2]]));
  const router = readFileSync(routerFile, 'utf8');
  for (const m of router.matchAll(
    /\{\s*(?:path:\s*(paths\.(\w+)|'([^']*)')|index:\s*true),\s*lazy:\s*\(\)\s*=>\s*import\('\.\/routes\/([\w-]+)'\)/g,
  )) {
    const pattern = m[2] ? paths.get(m[2]) : (m[3] ?? '/');
    if (pattern !== undefined) out.set(`src/app/routes/${m[4]}.tsx`, pattern);
  }
  return out;
}

/** The chunk `key` and everything it imports statically, transitively (its `dynamicImports` load later). */
function staticClosure(manifest: Manifest, key: string, seen = new Set<string>()): Set<string> {
  if (seen.has(key) || !manifest[key]) return seen;
  seen.add(key);
  for (const imp of manifest[key].imports ?? []) staticClosure(manifest, imp, seen);
  return seen;
}

/**
 * The JavaScript each lazy route (`src/app/routes/*.tsx`) loads, from the build's manifest
 * (`build.manifest: true` writes `<distDir>/.vite/manifest.json`): the entry (index.html) and its static
 * imports, plus the route module and its static imports, each file counted once, gzipped at level 9.
 * Sorted largest first.
 */
export function routeScripts(distDir: string, frontendSrc = join(ROOT, 'frontend', 'src')): RouteScripts[] {
  const manifestFile = join(distDir, '.vite', 'manifest.json');
  if (!existsSync(manifestFile)) throw new Error(`${manifestFile} is missing: build with build.manifest`);
  const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as Manifest;
  const entry = Object.keys(manifest).find((k) => manifest[k].isEntry);
  if (!entry) throw new Error(`${manifestFile} has no entry`);
  const patterns = routePatterns(frontendSrc);
  const sizes = new Map<string, { gz: number; raw: number }>();
  const sizeOf = (file: string): { gz: number; raw: number } => {
    let s = sizes.get(file);
    if (!s) {
      const bytes = readFileSync(join(distDir, file));
      s = { gz: gzipSync(bytes, { level: 9 }).length, raw: bytes.length };
      sizes.set(file, s);
    }
    return s;
  };
  const shell = staticClosure(manifest, entry);
  return Object.keys(manifest)
    .filter((k) => /^src\/app\/routes\/[\w-]+\.tsx$/.test(k))
    .map((k) => {
      const keys = staticClosure(manifest, k, new Set(shell));
      const files = [...new Set([...keys].map((c) => manifest[c].file))].filter((f) => f.endsWith('.js'));
      const gz = files.reduce((n, f) => n + sizeOf(f).gz, 0);
      const raw = files.reduce((n, f) => n + sizeOf(f).raw, 0);
      return {
        route: patterns.get(k) ?? k.replace(/^src\/app\/routes\/|\.tsx$/g, ''),
        module: k,
        gzipKb: Math.round(gz / 100) / 10,
        rawKb: Math.round(raw / 100) / 10,
        files: files.length,
      };
    })
    .sort((a, b) => b.gzipKb - a.gzipKb);
}

/** The routes over the budget, one line each (`/baseline: 151.2 kB gzipped > 150 kB`). */
export function overBudget(routes: RouteScripts[], budgetKb = ROUTE_BUDGET_KB): string[] {
  return routes
    .filter((r) => r.gzipKb > budgetKb)
    .map((r) => `${r.route} (${r.module}): ${r.gzipKb} kB gzipped > ${budgetKb} kB`);
}

/* ------------------------------------------------------------------ Lighthouse */

export interface LighthousePage {
  /** what the table calls it */
  name: string;
  /** path on the app (`/baseline`) */
  path: string;
  /** signs in first (POST /api/auth/sign-in) and sends the session cookie with every request */
  signIn?: { email: string; password: string };
}

export interface LighthouseScores {
  name: string;
  url: string;
  /** 0–1, Lighthouse's performance category */
  score: number;
  fcpMs: number;
  lcpMs: number;
  tbtMs: number;
  cls: number;
}

/** Chrome's switches for a quiet, repeatable headless run (chrome-launcher's own list, trimmed). */
export const CHROME_FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** The session cookie for a staff account: the app's own sign-in, as the browser does it. */
async function sessionCookie(appUrl: string, who: { email: string; password: string }): Promise<string> {
  const res = await fetch(new URL('/api/auth/sign-in', appUrl), {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: new URL(appUrl).origin },
    body: JSON.stringify(who),
  });
  if (!res.ok) throw new Error(`sign-in as ${who.email} answered ${res.status}`);
  const cookies = res.headers.getSetCookie().map((c) => c.split(';')[0]);
  if (cookies.length === 0) throw new Error(`sign-in as ${who.email} set no cookie`);
  return cookies.join('; ');
}

/**
 * Lighthouse 12.2.3 on each page in turn, mobile (its default form factor, Moto G Power screen) with
 * the default simulated throttling (slow 4G, 4× CPU), performance category only, each page in a fresh
 * Chromium with its own empty profile (a first visit: nothing cached).
 */
export async function lighthouseScores(
  appUrl: string,
  pages: LighthousePage[],
  chromiumPath = '/usr/bin/chromium',
): Promise<LighthouseScores[]> {
  // both are ES modules only; this file runs as CommonJS under tsx
  const { default: lighthouse } = await import('lighthouse');
  const chromeLauncher = await import('chrome-launcher');
  const out: LighthouseScores[] = [];
  for (const page of pages) {
    const url = new URL(page.path, appUrl).toString();
    const extraHeaders = page.signIn ? { Cookie: await sessionCookie(appUrl, page.signIn) } : undefined;
    const profile = mkdtempSync(join(tmpdir(), 'loamline-lh-'));
    const chrome = await chromeLauncher.launch({
      chromePath: chromiumPath,
      chromeFlags: [...CHROME_FLAGS, `--user-data-dir=${profile}`],
      userDataDir: false,
      logLevel: 'error',
    });
    try {
      const result = await lighthouse(url, {
        port: chrome.port,
        output: 'json',
        logLevel: 'error',
        onlyCategories: ['performance'],
        extraHeaders,
      });
      if (!result) throw new Error(`lighthouse gave no result for ${url}`);
      const { lhr } = result;
      if (lhr.runtimeError) throw new Error(`lighthouse on ${url}: ${lhr.runtimeError.message}`);
      const num = (id: string): number => lhr.audits[id]?.numericValue ?? NaN;
      out.push({
        name: page.name,
        url,
        score: lhr.categories.performance.score ?? 0,
        fcpMs: num('first-contentful-paint'),
        lcpMs: num('largest-contentful-paint'),
        tbtMs: num('total-blocking-time'),
        cls: num('cumulative-layout-shift'),
      });
    } finally {
      chrome.kill();
      rmSync(profile, { recursive: true, force: true });
    }
  }
  return out;
}

/* ------------------------------------------------------------------ by hand */

/** A staff sign-in: the environment, else the first owner `npm start` wrote to .data/demo-accounts.txt. */
export function staffSignIn(): { email: string; password: string } | null {
  const { BENCH_STAFF_EMAIL: email, BENCH_STAFF_PASSWORD: password } = process.env;
  if (email && password) return { email, password };
  const file = join(ROOT, '.data', 'demo-accounts.txt');
  if (!existsSync(file)) return null;
  const line = readFileSync(file, 'utf8')
    .split('\n')
    .find((l) => /^\s*owner\s/.test(l));
  const m = line?.match(/^\s*owner\s+(\S+)\s+(\S+)/);
  return m ? { email: m[1], password: m[2] } : null;
}

/** The three pages of issue 12's Lighthouse budget. */
export function budgetPages(
  shopSlug: string,
  staff: { email: string; password: string } | null,
): LighthousePage[] {
  const pages: LighthousePage[] = [
    { name: 'baseline', path: '/baseline' },
    { name: 'booking page', path: `/shops/${encodeURIComponent(shopSlug)}` },
  ];
  if (staff) pages.push({ name: 'Workshop › Requests', path: '/workshop/requests', signIn: staff });
  return pages;
}

function table(head: string[], rows: (string | number)[][]): string {
  const line = (cells: (string | number)[]): string => `| ${cells.join(' | ')} |`;
  return [line(head), line(head.map(() => '---')), ...rows.map(line)].join('\n');
}

async function main(): Promise<void> {
  const appUrl = process.argv[2] ?? process.env.APP_URL ?? 'http://127.0.0.1:3000';
  const dist = process.argv[3] ?? process.env.FRONTEND_DIST ?? join(ROOT, 'frontend', 'dist');
  const routes = routeScripts(dist);
  console.log(`JavaScript per route (${dist}), budget ${ROUTE_BUDGET_KB} kB gzipped\n`);
  console.log(
    table(
      ['route', 'JS gzip kB', 'JS raw kB', 'files'],
      routes.map((r) => [r.route, r.gzipKb.toFixed(1), r.rawKb.toFixed(1), r.files]),
    ),
  );
  const shops = (await (await fetch(new URL('/api/shops', appUrl))).json()) as { slug: string }[];
  const staff = staffSignIn();
  if (!staff) console.warn('\nno staff sign-in (BENCH_STAFF_EMAIL/PASSWORD): the Workshop page is left out');
  const scores = await lighthouseScores(appUrl, budgetPages(shops[0]?.slug ?? 'none', staff));
  console.log('\nLighthouse 12.2.3, mobile, simulated throttling\n');
  console.log(
    table(
      ['page', 'performance', 'FCP s', 'LCP s', 'TBT ms', 'CLS'],
      scores.map((s) => [
        `${s.name} (${new URL(s.url).pathname})`,
        s.score.toFixed(2),
        (s.fcpMs / 1000).toFixed(1),
        (s.lcpMs / 1000).toFixed(1),
        s.tbtMs.toFixed(0),
        s.cls.toFixed(3),
      ]),
    ),
  );
}

if (require.main === module) {
  main().catch((err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
