/**
 * The stack's floor for the Lighthouse figures (issue 12 asks for each figure against a baseline
 * measured in the same run): frontend/bench-floor/ is one screen on React, MUI and the app's theme and
 * nothing else (its main.tsx says what it draws). `buildFloor` builds it with Vite into a throw-away
 * folder; `serveFloor` serves it on loopback through the app's own static middleware
 * (backend/src/common/security/static-files.ts: the brotli and gzip twins, hashed files immutable, the
 * page revalidated), so that Lighthouse meets the same transfer sizes and headers as on the app.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import express from 'express';
import { frontendFiles } from '../../backend/src/common/security/static-files';

const FRONTEND = resolve(__dirname, '..', '..', 'frontend');

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
