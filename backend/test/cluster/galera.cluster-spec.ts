import { readFileSync } from 'node:fs';
import type { INestApplication } from '@nestjs/common';
import { DateTime } from 'luxon';
import { createConnection, type Connection, type RowDataPacket } from 'mysql2/promise';
import { DataSource } from 'typeorm';
import type { AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { createShop, createUser, type TestUser } from '../factories/accounts';
import { createTestApp } from '../utils/test-app';

/*
 * The real cluster of issue 12, started by the `cluster` layer of `npm test` (scripts/stack/cluster.ts):
 * three MariaDB Galera nodes, two app instances and HAProxy in front of both (HTTP round-robin over
 * the instances, TCP leastconn over the nodes for the apps' database connections). The riders here
 * call each app instance directly, alternating, so both serve the same race; each instance's pool
 * holds connections to every node, so the writes land on all three (checked with
 * wsrep_local_commits). This file's own Nest app only makes the shop and the riders (the test
 * factories) through HAProxy, as a third client of the cluster; it runs no mail relay.
 *
 * Sources beside each check: Galera/MariaDB docs (certification: a conflicting write fails at
 * commit with ER_LOCK_DEADLOCK 1213; wsrep_local_commits counts the commits a node originated;
 * wsrep_cluster_size; wsrep_sync_wait=1 makes a read see every earlier commit), HAProxy docs (a
 * server that fails its checks is taken out, `on-marked-down shutdown-sessions` cuts its
 * connections), RFC 9110 (409 Conflict, 503 Service Unavailable), and "common practice, no source"
 * (a rider whose request failed with 503 tries again).
 */

const env = process.env;
const APPS = String(env.CLUSTER_APP_URLS ?? '').split(',');
const HTTP_URL = String(env.CLUSTER_HTTP_URL);
const NODE_PORTS = String(env.CLUSTER_NODE_PORTS ?? '')
  .split(',')
  .map(Number);
const NODE_PID_FILES = String(env.CLUSTER_NODE_PID_FILES ?? '').split(',');
const MAIL_URL = String(env.MAIL_URL);
const ZONE = 'Europe/Berlin';
const BENCHES = 2;
jest.setTimeout(90_000);

const settings = (): ShopSettings => ({
  timeZone: ZONE,
  currency: 'EUR',
  benches: BENCHES,
  hours: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '08:00', end: '18:00' })),
  closures: [],
  rules: {
    slotStepMinutes: 60,
    minNoticeMinutes: 0,
    maxDaysAhead: 365,
    holdMinutes: 15,
    cancellationWindowHours: 48,
  },
});
const weeksAhead = (weeks: number, plusDays = 0): string =>
  DateTime.now().setZone(ZONE).plus({ weeks, days: plusDays }).toISODate()!;

interface Answer {
  status: number;
  body: { id?: string; message?: string };
}

/** One call to an app instance (or HAProxy) as a signed-in user; a dropped connection is status 0. */
async function call(base: string, u: TestUser, method: string, path: string, body?: object): Promise<Answer> {
  try {
    const r = await fetch(`${base}${path}`, {
      method,
      headers: { cookie: u.cookie, ...(body ? { 'content-type': 'application/json' } : {}) },
      body: body ? JSON.stringify(body) : undefined,
      signal: AbortSignal.timeout(30_000),
    });
    const text = await r.text();
    return { status: r.status, body: text ? (JSON.parse(text) as Answer['body']) : {} };
  } catch {
    return { status: 0, body: {} };
  }
}

/** A direct connection to one Galera node, as the app's user (SELECT on its schema only). */
const nodeConnection = (port: number): Promise<Connection> =>
  createConnection({
    host: '127.0.0.1',
    port,
    user: env.DB_USER,
    password: env.DB_PASSWORD,
    database: env.DB_NAME,
    timezone: 'Z',
  });

async function onNode<T extends RowDataPacket>(
  port: number,
  sql: string,
  params: unknown[] = [],
): Promise<T[]> {
  const c = await nodeConnection(port);
  try {
    const [rows] = await c.query<T[]>(sql, params);
    return rows;
  } finally {
    await c.end();
  }
}

const status = async (port: number, name: string): Promise<string> =>
  (await onNode<RowDataPacket & { Value: string }>(port, 'SHOW GLOBAL STATUS LIKE ?', [name]))[0].Value;

async function until(what: string, ms: number, ok: () => Promise<boolean>): Promise<void> {
  const end = Date.now() + ms;
  while (!(await ok())) {
    if (Date.now() > end) throw new Error(`${what}: not within ${ms / 1000} s`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('a Galera cluster of three behind HAProxy, two app instances', () => {
  let app: INestApplication;
  let owner: TestUser;
  let riders: TestUser[];
  let slug: string;
  let shopId: string;
  let free: ShopService;
  let paid: ShopService;
  /** every node still running (the kill test takes one out) */
  let live = [...NODE_PORTS];

  const slots = async (serviceId: string, day: string): Promise<AvailableStart[]> => {
    const r = await fetch(
      `${HTTP_URL}/api/shops/${slug}/availability?serviceId=${serviceId}&from=${day}&to=${day}`,
    );
    expect(r.status).toBe(200);
    return (await r.json()) as AvailableStart[];
  };

  /** The shop's live appointments at `start` on one node: ids and benches. */
  const liveAt = (port: number, start: string) =>
    onNode<RowDataPacket & { id: string; bench: number; rider_id: string }>(
      port,
      `SELECT id, bench, rider_id FROM appointments
        WHERE shop_id = ? AND start_at = ? AND status IN ('held', 'requested', 'confirmed') ORDER BY id`,
      [shopId, new Date(start)],
    );

  beforeAll(async () => {
    // Galera docs: every node in the primary component, synced
    for (const p of NODE_PORTS) {
      expect(await status(p, 'wsrep_cluster_size')).toBe('3');
      expect(await status(p, 'wsrep_local_state_comment')).toBe('Synced');
    }
    app = await createTestApp({ MAIL_RELAY_INTERVAL_MS: '0' });
    const shop = await createShop(app, { timeZone: ZONE });
    slug = shop.slug;
    shopId = shop.id;
    owner = await createUser(app, { role: 'owner', shopId: shop.id });
    riders = await Promise.all(Array.from({ length: 50 }, () => createUser(app)));
    expect((await call(HTTP_URL, owner, 'PUT', '/api/workshop/settings', settings())).status).toBe(200);
    const service = async (name: string, depositMinor: number) => {
      const r = await call(HTTP_URL, owner, 'POST', '/api/workshop/services', {
        name,
        durationMinutes: 60,
        bufferAfterMinutes: 0,
        priceMinor: 6900,
        depositMinor,
      });
      expect(r.status).toBe(201);
      return r.body as unknown as ShopService;
    };
    free = await service('Air spring check', 0);
    paid = await service('Air spring setup', 2000);
  });

  afterAll(async () => {
    await app?.close();
  });

  it('50 riders book one time at once over both instances and all three nodes: never more than capacity, every node agrees', async () => {
    const commits = async () => Promise.all(NODE_PORTS.map((p) => status(p, 'wsrep_local_commits')));
    const before = (await commits()).map(Number);
    const starts = (await slots(free.id, weeksAhead(4))).slice(0, 4).map((s) => s.start);
    expect(starts).toHaveLength(4);
    for (const start of starts) {
      const answers = await Promise.all(
        riders.map((r, i) =>
          call(APPS[i % APPS.length], r, 'POST', '/api/appointments', {
            shopSlug: slug,
            serviceId: free.id,
            start,
          }),
        ),
      );
      const codes = answers.map((a) => a.status);
      // RFC 9110: the losers get 409 (taken), never a 500; one per bench wins
      expect(codes.filter((c) => c === 201)).toHaveLength(BENCHES);
      expect(codes.filter((c) => c === 409)).toHaveLength(riders.length - BENCHES);
      const won = answers
        .filter((a) => a.status === 201)
        .map((a) => a.body.id!)
        .sort();
      // Galera docs (wsrep_sync_wait=1, causal reads): each node answers with every committed row
      for (const p of NODE_PORTS) {
        const rows = await liveAt(p, start);
        expect(rows.map((r) => r.id).sort()).toEqual(won);
        expect(new Set(rows.map((r) => r.bench)).size).toBe(BENCHES);
      }
    }
    // Galera docs: wsrep_local_commits counts the write sets a node originated — all three wrote
    const after = (await commits()).map(Number);
    after.forEach((n, i) => expect(n).toBeGreaterThan(before[i]));
    // the cells agree row for row on every node (the primary key (shop, bench, cell) holds each once)
    const cells = await Promise.all(
      NODE_PORTS.map((p) =>
        onNode(
          p,
          'SELECT bench, cell_at, appointment_id FROM appointment_cells WHERE shop_id = ? ORDER BY bench, cell_at',
          [shopId],
        ),
      ),
    );
    expect(cells[1]).toEqual(cells[0]);
    expect(cells[2]).toEqual(cells[0]);
    // Galera docs: a write set a node cannot apply makes the cluster vote and evict the
    // inconsistent node — after the races all three are still members and synced
    for (const p of NODE_PORTS) {
      expect(await status(p, 'wsrep_cluster_size')).toBe('3');
      expect(await status(p, 'wsrep_local_state_comment')).toBe('Synced');
    }
  });

  it('holds expired and mail sent by both instances at once: each hold expires once, each mail arrives once', async () => {
    // twelve riders hold a paid time each (a deposit: held until paid)
    const holders = riders.slice(0, 12);
    const day = weeksAhead(6);
    const starts = (await slots(paid.id, day)).map((s) => s.start);
    const held: string[] = [];
    await Promise.all(
      holders.map(async (r, i) => {
        const a = await call(APPS[i % APPS.length], r, 'POST', '/api/appointments', {
          shopSlug: slug,
          serviceId: paid.id,
          start: starts[Math.floor(i / BENCHES)],
        });
        expect(a.status).toBe(201);
        held.push(a.body.id!);
      }),
    );
    // their payment windows end now (the app's clock is the real one)
    const ds = app.get(DataSource);
    await ds.query(
      `UPDATE appointments SET hold_expires_at = ? WHERE id IN (${held.map(() => '?').join(',')})`,
      [new Date(Date.now() - 60_000), ...held],
    );
    // Both instances expire the shop's lapsed holds at the same moment, many times over: reading
    // "my appointments" expires the reader's lapsed holds (on one node each, through HAProxy).
    await Promise.all(
      holders.flatMap((r) => APPS.map((base) => call(base, r, 'GET', '/api/appointments'))),
    ).then((answers) => answers.forEach((a) => expect(a.status).toBe(200)));
    await until('every hold expired', 30_000, async () => {
      const rows = await onNode<RowDataPacket & { n: number }>(
        live[0],
        `SELECT COUNT(*) AS n FROM appointments WHERE status = 'expired' AND id IN (${held.map(() => '?').join(',')})`,
        held,
      );
      return Number(rows[0].n) === held.length;
    });
    // one 'expire' event per hold, on every node (Galera docs: the loser of a certification
    // conflict rolls back whole, its event and mail with it)
    for (const p of live) {
      const ev = await onNode<RowDataPacket & { appointment_id: string; n: number }>(
        p,
        `SELECT appointment_id, COUNT(*) AS n FROM appointment_events
          WHERE event = 'expire' AND appointment_id IN (${held.map(() => '?').join(',')}) GROUP BY appointment_id`,
        held,
      );
      expect(ev).toHaveLength(held.length);
      for (const e of ev) expect(Number(e.n)).toBe(1);
    }
    // every outbox row sent (both relays sweep every 300 ms), and the inbox holds each mail once
    await until('the outbox emptied', 30_000, async () => {
      const rows = await onNode<RowDataPacket & { n: number }>(
        live[0],
        'SELECT COUNT(*) AS n FROM mail_outbox WHERE sent_at IS NULL AND failed_at IS NULL',
      );
      return Number(rows[0].n) === 0;
    });
    const [{ n: sentRows }] = await onNode<RowDataPacket & { n: number }>(
      live[0],
      'SELECT COUNT(*) AS n FROM mail_outbox WHERE sent_at IS NOT NULL',
    );
    const inbox = (await (await fetch(`${MAIL_URL}/api/messages`)).json()) as {
      to: string[];
      subject: string;
      text: string;
    }[];
    expect(inbox.length).toBe(Number(sentRows));
    const keys = inbox.map((m) => `${m.to.join(',')}|${m.subject}|${m.text}`);
    expect(new Set(keys).size).toBe(keys.length);
    // each holder got their mail about the released hold exactly once
    for (const r of holders) {
      const mine = inbox.filter((m) => m.to.some((t) => t.toLowerCase() === r.email.toLowerCase()));
      expect(mine.length).toBeGreaterThan(0);
    }
  });

  it('one node killed (SIGKILL) mid-run: the run completes, no booking lost or doubled, the survivors agree', async () => {
    const victim = 1; // the second node: HAProxy keeps routing to the first and third
    const pid = Number(readFileSync(NODE_PID_FILES[victim], 'utf8').trim());
    const day = weeksAhead(8);
    const starts = (await slots(free.id, day)).slice(0, 6).map((s) => s.start);
    expect(starts).toHaveLength(6);
    let retried = 0;
    /** A rider tries until the app says yes or taken (common practice, no source: retry after 503). */
    const book = async (r: TestUser, i: number, start: string): Promise<Answer> => {
      for (let attempt = 0; ; attempt++) {
        const a = await call(APPS[(i + attempt) % APPS.length], r, 'POST', '/api/appointments', {
          shopSlug: slug,
          serviceId: free.id,
          start,
        });
        // RFC 9110: 201 made, 409 taken (or this rider's earlier try did commit), 503 try again
        expect([0, 201, 409, 503]).toContain(a.status);
        if (a.status === 201 || a.status === 409 || attempt >= 20) return a;
        retried += 1;
        await new Promise((res) => setTimeout(res, 200 + Math.random() * 300));
      }
    };
    const made = new Map<string, string>(); // appointment id → start
    let killed = false;
    for (const [round, start] of starts.entries()) {
      const t0 = Date.now();
      const race = Promise.all(riders.map((r, i) => book(r, i, start)));
      if (round === 1) {
        // mid-run: while the second round's requests are in flight
        await new Promise((res) => setTimeout(res, 30));
        process.kill(pid, 'SIGKILL');
        killed = true;
        live = NODE_PORTS.filter((_, i) => i !== victim);
      }
      const answers = await race;
      console.log(`kill run, round ${round + 1}: ${Date.now() - t0} ms`);
      for (const a of answers) expect([201, 409]).toContain(a.status); // every rider got an answer
      for (const a of answers.filter((x) => x.status === 201)) made.set(a.body.id!, start);
    }
    expect(killed).toBe(true);
    // Galera docs: the survivors form the primary component of two
    await until('the survivors see a cluster of two', 30_000, async () =>
      (await Promise.all(live.map((p) => status(p, 'wsrep_cluster_size')))).every((n) => n === '2'),
    );
    for (const p of live) {
      const ids = [...made.keys()];
      const rows = await onNode<RowDataPacket & { id: string }>(
        p,
        `SELECT id FROM appointments WHERE id IN (${ids.map(() => '?').join(',')})`,
        ids,
      );
      // every 2xx booking exists, exactly once
      expect(rows.map((r) => r.id).sort()).toEqual(ids.sort());
      for (const start of starts) {
        const at = await liveAt(p, start);
        // never more than capacity, and no rider twice at one time
        expect(at.length).toBeLessThanOrEqual(BENCHES);
        expect(new Set(at.map((r) => r.bench)).size).toBe(at.length);
        expect(new Set(at.map((r) => r.rider_id)).size).toBe(at.length);
        // a booking whose answer died with the node may exist without a 201: only ones we counted or such
        for (const r of at) if (!made.has(r.id)) expect(riders.some((x) => x.id === r.rider_id)).toBe(true);
      }
    }
    const [a, b] = await Promise.all(
      live.map((p) =>
        onNode(p, 'SELECT id, bench, start_at, status FROM appointments WHERE shop_id = ? ORDER BY id', [
          shopId,
        ]),
      ),
    );
    expect(b).toEqual(a);
    // the run completed with full rounds: each start has its benches taken
    for (const start of starts) expect((await liveAt(live[0], start)).length).toBe(BENCHES);
    console.log(`kill run: ${made.size} bookings made, ${retried} retries after 503 or a dropped connection`);
  });
});
