/**
 * The stack's floor (issue 12 asks for each figure against a baseline measured in the same run):
 * frontend/bench-floor/ builds two pages. index.html is one screen on React, MUI and the app's theme and
 * nothing else (main.tsx says what it draws); Lighthouse scores it beside the app's pages. form.html adds
 * the least that the stack's router, SWR and react-hook-form bring to a page with a form (form.tsx);
 * its JavaScript is weighed beside each route's. `buildFloor` builds it with Vite into a throw-away
 * folder; `serveFloor` serves it on loopback through the app's own static middleware
 * (backend/src/common/security/static-files.ts: the brotli and gzip twins, hashed files immutable, the
 * page revalidated), so that Lighthouse meets the same transfer sizes and headers as on the app.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import express from 'express';
import { frontendFiles } from '../../backend/src/common/security/static-files';

const FRONTEND = resolve(__dirname, '..', '..', 'frontend');

/** `vite build` of frontend/bench-floor into a new temporary folder; returns the folder. */
export function buildFloor(): string {
  const out = mkdtempSync(join(tmpdir(), 'loamline-floor-'));
  execFileSync(
    join(FRONTEND, 'node_modules', '.bin', 'vite'),
    ['build', '--config', 'bench-floor/vite.config.ts', '--outDir', out],
    // a production build whatever the bench's own environment says (NODE_ENV=test there gave React's
    // development build: 197 kB where the production floor is 119 kB)
    {
      cwd: FRONTEND,
      stdio: ['ignore', 'ignore', 'inherit'],
      env: { ...process.env, NODE_ENV: 'production' },
    },
  );
  return out;
}

/**
 * The JavaScript a built floor page loads, gzipped at level 9 file by file in kB, as routeScripts
 * (frontend.ts) weighs a route: its module script and the modules it preloads.
 */
export function floorPageKb(dir: string, page: 'index.html' | 'form.html'): number {
  const html = readFileSync(join(dir, page), 'utf8');
  const files = [
    ...html.matchAll(/<(?:script type="module"[^>]*src|link rel="modulepreload"[^>]*href)="\/([^"]+\.js)"/g),
  ].map((m) => m[1]);
  if (files.length === 0) throw new Error(`no scripts found in the floor's ${page}`);
  const bytes = files.reduce((n, f) => n + gzipSync(readFileSync(join(dir, f)), { level: 9 }).length, 0);
  return Math.round(bytes / 100) / 10;
}

/** Serves the built floor on 127.0.0.1 (a free port); `close` stops it and removes the folder. */
export async function serveFloor(dir: string): Promise<{ url: string; close: () => Promise<void> }> {
  const app = express();
  app.use(frontendFiles(dir));
  const server = await new Promise<ReturnType<typeof app.listen>>((ok) => {
    const s = app.listen(0, '127.0.0.1', () => ok(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/`,
    close: () =>
      new Promise<void>((ok) =>
        server.close(() => {
          rmSync(dir, { recursive: true, force: true });
          ok();
        }),
      ),
  };
}
