/** Ports (fixed for start, free ones for test) and the local secrets. */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync, chmodSync } from 'node:fs';
import { createServer } from 'node:net';
import { join } from 'node:path';
import { DATA, type Mode, type Ports, type Secrets } from './common';

/* ------------------------------------------------------------------ ports and secrets */

export function envPort(name: string, fallback: number): number {
  const v = process.env[name];
  if (!v) return fallback;
  const n = Number(v);
  if (!Number.isInteger(n) || n < 1 || n > 65535) throw new Error(`${name} must be a port number, got ${v}`);
  return n;
}

export function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const srv = createServer();
    srv.unref();
    srv.on('error', rej);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      srv.close(() => res(port));
    });
  });
}

export async function portsFor(mode: Mode): Promise<Ports> {
  if (mode === 'start') {
    return {
      app: envPort('APP_PORT', 3000),
      db: envPort('DB_PORT', 3307),
      payments: envPort('PAYMENTS_PORT', 12111),
      smtp: envPort('SMTP_PORT', 1025),
      mailWeb: envPort('MAIL_WEB_PORT', 8025),
    };
  }
  // Tests pick free ports, so they can run beside `npm start` and beside each other.
  return {
    app: envPort('TEST_APP_PORT', await freePort()),
    db: envPort('TEST_DB_PORT', await freePort()),
    payments: envPort('TEST_PAYMENTS_PORT', await freePort()),
    smtp: envPort('TEST_SMTP_PORT', await freePort()),
    mailWeb: envPort('TEST_MAIL_WEB_PORT', await freePort()),
  };
}

export function newSecrets(): Secrets {
  return {
    dbPassword: randomBytes(18).toString('base64url'),
    dbMigratorPassword: randomBytes(18).toString('base64url'),
    dbRootPassword: randomBytes(24).toString('base64url'),
    jwtSecret: randomBytes(48).toString('base64url'),
    webhookSecret: `whsec_${randomBytes(24).toString('base64url')}`,
  };
}

/**
 * Local secrets for `npm start`, made once and kept in the git-ignored data folder (owner-only).
 * A file from an older version gets the secrets it lacks added (the upgrade path).
 */
export function keptSecrets(): Secrets {
  const file = join(DATA, 'secrets.json');
  mkdirSync(DATA, { recursive: true });
  const kept = existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as Partial<Secrets>) : {};
  const s: Secrets = { ...newSecrets(), ...kept };
  if (Object.keys(kept).length !== Object.keys(s).length) {
    writeFileSync(file, JSON.stringify(s, null, 2), { mode: 0o600 });
  }
  chmodSync(file, 0o600);
  return s;
}
