/**
 * The bare baselines of `npm run bench`, in a process of their own (as the app is), so that neither
 * side shares its event loop with autocannon: started by the bench with `node --import tsx`, it
 * prints one JSON line `{ health, compute, availability }` (their URLs) and serves until stopped.
 *   - health: `SELECT 1` through a mysql2 pool on the app's MariaDB;
 *   - compute: the spring model on the posted body, serialized as the app answers it;
 *   - availability: the app's bench-time query for one shop and window (BARE_AVAILABILITY, JSON of
 *     `{ shopId, fromMs, toMs }`, or the bench's own shop when absent), its rows as JSON.
 */
import type { ServerResponse } from 'node:http';
import { join, resolve } from 'node:path';
import { createPool } from 'mysql2/promise';
import { listen, readBody, urlOf } from './load';
import { BUSY_SQL } from './seed';

const ROOT = resolve(__dirname, '..', '..');

async function main(): Promise<void> {
  const pool = createPool({
    host: process.env.DB_HOST,
    port: Number(process.env.DB_PORT),
    user: process.env.DB_USER,
    password: process.env.DB_PASSWORD,
    database: process.env.DB_NAME,
    connectionLimit: 10, // as the app's pool (typeorm-options.ts)
    timezone: 'Z',
  });
  const fail = (res: ServerResponse) => (): void => {
    res.writeHead(503);
    res.end();
  };

  const health = await listen((_req, res) => {
    pool.query('SELECT 1').then(() => {
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end('{"status":"ok","db":"up"}');
    }, fail(res));
  });

  const modelPath = join(ROOT, 'backend', 'src', 'baselines', 'spring-model', 'index.ts');
  const model = (await import(modelPath)) as { computeBaseline: (input: unknown) => unknown };
  const compute = await listen((req, res) => {
    void readBody(req).then((body) => {
      const out = JSON.stringify(model.computeBaseline(JSON.parse(body)));
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(out);
    });
  });

  const availability = await listen((req, res) => {
    const q = new URL(req.url ?? '/', 'http://x').searchParams;
    const args = [q.get('shopId'), new Date(Number(q.get('toMs'))), new Date(Number(q.get('fromMs')))];
    pool.query(BUSY_SQL, [...args, new Date()]).then(([rows]) => {
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(JSON.stringify(rows));
    }, fail(res));
  });

  console.log(
    JSON.stringify({
      health: urlOf(health, '/'),
      compute: urlOf(compute, '/'),
      availability: urlOf(availability, '/'),
    }),
  );
  const stop = (): void => {
    void pool.end().finally(() => process.exit(0));
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

void main();
