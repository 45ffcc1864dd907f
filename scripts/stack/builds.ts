/** Building shared-types, the server and the browser app when a source is newer. */
import { existsSync, mkdirSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, log, pkgFile } from './common';
import { run } from './processes';

/* ------------------------------------------------------------------ builds */

export function newestMtime(paths: string[]): number {
  let newest = 0;
  const walk = (p: string): void => {
    if (!existsSync(p)) return;
    const st = statSync(p);
    if (st.isDirectory()) {
      for (const e of readdirSync(p)) {
        if (e === 'node_modules' || e === 'dist' || e.startsWith('.')) continue;
        walk(join(p, e));
      }
    } else newest = Math.max(newest, st.mtimeMs);
  };
  paths.forEach(walk);
  return newest;
}

/** Runs `build` unless `stamp` is newer than every source file. */
export function buildIfStale(name: string, sources: string[], stamp: string, build: () => void): void {
  const srcTime = newestMtime([...sources, join(ROOT, 'package-lock.json')]);
  if (existsSync(stamp) && statSync(stamp).mtimeMs >= srcTime) {
    log(`${name}: up to date`);
    return;
  }
  log(`${name}: building`);
  build();
  writeFileSync(stamp, new Date().toISOString());
}

export function buildAll(frontendOut: string, backendOut: string): void {
  const tsc = pkgFile('backend', 'typescript', 'bin/tsc');
  const node = process.execPath;
  buildIfStale(
    'shared-types',
    [join(ROOT, 'shared-types')],
    join(ROOT, 'shared-types', 'dist', '.stamp'),
    () => run(node, [tsc, '-p', 'shared-types/tsconfig.json']),
  );
  buildIfStale(
    'backend',
    [join(ROOT, 'backend', 'src'), join(ROOT, 'shared-types', 'src'), join(ROOT, 'backend', 'tsconfig.json')],
    join(backendOut, '.stamp'),
    () => {
      rmSync(backendOut, { recursive: true, force: true });
      run(node, [tsc, '-p', 'backend/tsconfig.build.json', '--outDir', backendOut]);
    },
  );
  mkdirSync(frontendOut, { recursive: true });
  buildIfStale(
    'frontend',
    [
      join(ROOT, 'frontend', 'src'),
      join(ROOT, 'frontend', 'index.html'),
      join(ROOT, 'frontend', 'vite.config.ts'),
      join(ROOT, 'shared-types', 'src'),
    ],
    `${frontendOut}.stamp`,
    () => {
      const vite = pkgFile('frontend', 'vite', 'bin/vite.js');
      run(node, [vite, 'build', '--outDir', frontendOut, '--emptyOutDir', '--logLevel', 'warn'], {
        cwd: join(ROOT, 'frontend'),
      });
    },
  );
}
