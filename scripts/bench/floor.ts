/**
 * The stack's floor for the Lighthouse figures (issue 12 asks for each figure against a baseline
 * measured in the same run): frontend/bench-floor/ is one screen on React, MUI and the app's theme and
 * nothing else (its main.tsx says what it draws). `buildFloor` builds it with Vite into a throw-away
 * folder; `serveFloor` serves it on loopback the way the app serves its build — brotli, hashed files
 * immutable, the page revalidated — so that Lighthouse meets the same transfer sizes and headers.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, relative, resolve } from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';

const FRONTEND = resolve(__dirname, '..', '..', 'frontend');

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
};

/** `vite build` of frontend/bench-floor into a new temporary folder; returns the folder. */
export function buildFloor(): string {
  const out = mkdtempSync(join(tmpdir(), 'loamline-floor-'));
  execFileSync(
    join(FRONTEND, 'node_modules', '.bin', 'vite'),
    ['build', '--config', 'bench-floor/vite.config.ts', '--outDir', out],
    { cwd: FRONTEND, stdio: ['ignore', 'ignore', 'inherit'] },
  );
  return out;
}

function filesUnder(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? filesUnder(path) : [path];
  });
}

/** Serves the built floor on 127.0.0.1 (a free port); `close` stops it and removes the folder. */
export async function serveFloor(dir: string): Promise<{ url: string; close: () => Promise<void> }> {
  const files = new Map<string, { br: Buffer; gzip: Buffer; type: string }>();
  for (const path of filesUnder(dir)) {
    const type = TYPES[extname(path)];
    if (!type) continue;
    const bytes = readFileSync(path);
    files.set(`/${relative(dir, path)}`, {
      br: brotliCompressSync(bytes),
      gzip: gzipSync(bytes, { level: 9 }),
      type,
    });
  }
  const server = createServer((req, res) => {
    const path = new URL(req.url ?? '/', 'http://x').pathname;
    const file = files.get(path === '/' ? '/index.html' : path);
    if (!file) {
      res.writeHead(404).end();
      return;
    }
    // as the app's static middleware: brotli when the browser takes it, else gzip
    const br = /\bbr\b/.test(String(req.headers['accept-encoding'] ?? ''));
    res.writeHead(200, {
      'Content-Type': file.type,
      'Content-Encoding': br ? 'br' : 'gzip',
      Vary: 'Accept-Encoding',
      'Cache-Control': path.startsWith('/assets/') ? 'public, max-age=31536000, immutable' : 'no-cache',
    });
    res.end(br ? file.br : file.gzip);
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
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
