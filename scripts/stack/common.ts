/** What every part of the bring-up shares: the project paths, ports, secrets, logging. */
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';

export type Mode = 'start' | 'test' | 'bench' | 'cluster';

export const ROOT = resolve(__dirname, '..', '..');
export const DATA = join(ROOT, '.data');
export const ARTIFACTS = join(ROOT, 'artifacts');
/** The demo seed writes the demo sign-ins here; the start command prints them. */
export const DEMO_ACCOUNTS_FILE = join(DATA, 'demo-accounts.txt');

/** The path of a file inside an installed package, whatever its `exports` allow. */
export function pkgFile(from: string, pkg: string, file: string): string {
  for (const base of [join(ROOT, from), ROOT]) {
    const dir = join(base, 'node_modules', pkg);
    if (existsSync(join(dir, 'package.json'))) return join(dir, file);
  }
  throw new Error(`${pkg} is not installed (looked from ${from}); run npm ci`);
}

export const log = (msg: string): void => console.log(`loamline: ${msg}`);

export interface Ports {
  app: number;
  db: number;
  payments: number;
  smtp: number;
  mailWeb: number;
}

export interface Secrets {
  /** the app's MariaDB user (SELECT, INSERT, UPDATE, DELETE on its schema only) */
  dbPassword: string;
  /** the migrations' MariaDB user (DDL on the app's schema only) */
  dbMigratorPassword: string;
  /** MariaDB's root, reachable only through the owner-only socket */
  dbRootPassword: string;
  jwtSecret: string;
  webhookSecret: string;
}
