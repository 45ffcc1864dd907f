/**
 * The bench's own data, written straight into the app's tables through a mysql2 pool as the app's
 * database user (bulk inserts, a few seconds): nothing here is part of the product or its demo
 * seed. Everything is synthetic and generated from a fixed-seed PRNG, so every run has the same
 * shop, the same five years of appointments and the same riders (only "today" moves).
 */
import { randomBytes, scrypt } from 'node:crypto';
import { DateTime } from 'luxon';
import { type Pool, createPool } from 'mysql2/promise';

/** The app's query (AppointmentsService.busy): bench time kept by live appointments in a window. */
export const BUSY_SQL = `SELECT bench, start_at, keep_until FROM appointments
  WHERE shop_id = ? AND start_at < ? AND keep_until > ?
    AND (status IN ('requested', 'confirmed') OR (status = 'held' AND hold_expires_at > ?))`;

export function benchPool(connectionLimit = 10): Pool {
  return createPool({
    host: process.env.DB_HOST,
    port: Number(process.env.DB_PORT),
    user: process.env.DB_USER,
    password: process.env.DB_PASSWORD,
    database: process.env.DB_NAME,
    connectionLimit,
    timezone: 'Z', // the app stores UTC instants (typeorm-options.ts)
    dateStrings: false,
  });
}

/** mulberry32: a small, fixed-seed PRNG (uniform in [0, 1)); not for secrets. */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A version-4-shaped UUID from the PRNG, so the seeded ids repeat from run to run. */
export function uuidFrom(rand: () => number): string {
  const b = Array.from({ length: 16 }, () => Math.floor(rand() * 256));
  b[6] = (b[6] & 0x0f) | 0x40;
  b[8] = (b[8] & 0x3f) | 0x80;
  const h = b.map((x) => x.toString(16).padStart(2, '0')).join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/** INSERT … VALUES ? in chunks: one round trip per `chunk` rows. */
export async function bulkInsert(
  pool: Pool,
  table: string,
  columns: string[],
  rows: unknown[][],
  chunk = 2000,
): Promise<void> {
  const cols = columns.map((c) => `\`${c}\``).join(', ');
  for (let i = 0; i < rows.length; i += chunk) {
    await pool.query(`INSERT INTO \`${table}\` (${cols}) VALUES ?`, [rows.slice(i, i + chunk)]);
  }
}

/**
 * A password hash in the app's stored format (password-hasher.ts: `$scrypt$ln=…,r=…,p=…$salt$key`),
 * at a cheap cost (ln=10) so that the bench can sign a hundred riders in within a second; the app
 * verifies any stored cost, and registers real accounts at OWASP's (ln=17).
 */
export async function cheapPasswordHash(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await new Promise<Buffer>((resolve, reject) =>
    scrypt(password.normalize('NFKC'), salt, 32, { N: 2 ** 10, r: 8, p: 1 }, (e, k) =>
      e ? reject(e) : resolve(k),
    ),
  );
  const b64 = (x: Buffer): string => x.toString('base64').replace(/=+$/, '');
  return `$scrypt$ln=10,r=8,p=1$${b64(salt)}$${b64(key)}`;
}

export interface SeededShop {
  id: string;
  slug: string;
  timeZone: string;
  benches: number;
  services: { id: string; durationMinutes: number; bufferAfterMinutes: number }[];
}

interface ShopSpec {
  slug: string;
  name: string;
  town: string;
  timeZone: string;
  currency: string;
  benches: number;
  slotStepMinutes: number;
  minNoticeMinutes: number;
  maxDaysAhead: number;
  /** [weekday 1–7, start minute, end minute] */
  hours: [number, number, number][];
  services: { name: string; durationMinutes: number; bufferAfterMinutes: number; priceMinor: number }[];
}

/**
 * Removes what an earlier bench run left of a shop and its riders (a bench run against the kept
 * database of `npm start`), children first: the appointments' foreign keys restrict.
 */
async function removeShop(pool: Pool, slug: string, emailPrefix: string): Promise<void> {
  const [rows] = await pool.query('SELECT id FROM shops WHERE slug = ?', [slug]);
  for (const { id } of rows as { id: string }[]) {
    await pool.query('DELETE FROM appointment_cells WHERE shop_id = ?', [id]);
    await pool.query('DELETE FROM appointments WHERE shop_id = ?', [id]);
    await pool.query('DELETE FROM shop_services WHERE shop_id = ?', [id]);
    await pool.query('DELETE FROM users WHERE shop_id = ?', [id]); // its staff (sessions cascade)
    await pool.query('DELETE FROM shops WHERE id = ?', [id]);
  }
  await pool.query('DELETE FROM users WHERE email LIKE ?', [`${emailPrefix}-%@bench.example.test`]);
}

async function insertShop(pool: Pool, rand: () => number, s: ShopSpec): Promise<SeededShop> {
  const id = uuidFrom(rand);
  await pool.query(
    `INSERT INTO shops (id, slug, name, town, time_zone, currency, benches, slot_step_minutes,
       min_notice_minutes, max_days_ahead, hold_minutes, cancellation_window_hours)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 15, 48)`,
    [
      id,
      s.slug,
      s.name,
      s.town,
      s.timeZone,
      s.currency,
      s.benches,
      s.slotStepMinutes,
      s.minNoticeMinutes,
      s.maxDaysAhead,
    ],
  );
  await bulkInsert(
    pool,
    'shop_opening_intervals',
    ['id', 'shop_id', 'weekday', 'start_minute', 'end_minute'],
    s.hours.map(([w, a, b]) => [uuidFrom(rand), id, w, a, b]),
  );
  const services = s.services.map((v) => ({ id: uuidFrom(rand), ...v }));
  await bulkInsert(
    pool,
    'shop_services',
    [
      'id',
      'shop_id',
      'name',
      'description',
      'duration_minutes',
      'buffer_after_minutes',
      'price_minor',
      'deposit_minor',
      'active',
    ],
    services.map((v) => [v.id, id, v.name, '', v.durationMinutes, v.bufferAfterMinutes, v.priceMinor, 0, 1]),
  );
  return { id, slug: s.slug, timeZone: s.timeZone, benches: s.benches, services };
}

async function insertRiders(
  pool: Pool,
  rand: () => number,
  prefix: string,
  count: number,
  passwordHash: (i: number) => Promise<string>,
): Promise<{ id: string; email: string }[]> {
  const riders = Array.from({ length: count }, (_, i) => ({
    id: uuidFrom(rand),
    email: `${prefix}-${String(i + 1).padStart(4, '0')}@bench.example.test`,
    name: `Bench rider ${i + 1}`,
  }));
  const hashes = await Promise.all(riders.map((_, i) => passwordHash(i)));
  await bulkInsert(
    pool,
    'users',
    ['id', 'email', 'name', 'role', 'password_hash'],
    riders.map((r, i) => [r.id, r.email, r.name, 'rider', hashes[i]]),
  );
  return riders;
}

export interface HistoryStats {
  appointments: number;
  live: number;
  cells: number;
  closures: number;
  ms: number;
}

const PAST_STATES: [string, number][] = [
  ['completed', 0.8],
  ['cancelled', 0.08],
  ['declined', 0.04],
  ['expired', 0.05],
  ['no_show', 0.03],
];
const FUTURE_STATES: [string, number][] = [
  ['confirmed', 0.6],
  ['requested', 0.33],
  ['cancelled', 0.05],
  ['held', 0.02], // a hold that lapsed: not live
];

function pick(rand: () => number, table: [string, number][]): string {
  let x = rand();
  for (const [v, p] of table) {
    if (x < p) return v;
    x -= p;
  }
  return table[table.length - 1][0];
}

/**
 * A busy four-bench shop with five years of appointments behind today and its bookable days
 * ahead filled to about half: past visits completed (most), cancelled, declined, expired or missed;
 * the coming ones confirmed or requested with their bench cells, as the booking code writes them.
 */
export async function seedFiveYearShop(
  pool: Pool,
  nowMs: number,
): Promise<{ shop: SeededShop; stats: HistoryStats }> {
  const began = Date.now();
  await removeShop(pool, 'bench-five-years', 'history');
  const rand = prng(12_2026);
  const weekday: [number, number, number][] = [];
  for (let w = 1; w <= 5; w++) weekday.push([w, 8 * 60, 12 * 60], [w, 13 * 60, 18 * 60 + 30]);
  weekday.push([6, 9 * 60, 15 * 60]);
  const shop = await insertShop(pool, rand, {
    slug: 'bench-five-years',
    name: 'Bench Five Years Suspension Works',
    town: 'Scree Hollow',
    timeZone: 'Europe/Vienna',
    currency: 'EUR',
    benches: 4,
    slotStepMinutes: 15,
    minNoticeMinutes: 720,
    maxDaysAhead: 60,
    hours: weekday,
    services: [
      { name: 'Fork air-spring setup', durationMinutes: 60, bufferAfterMinutes: 15, priceMinor: 6000 },
      { name: 'Shock air-spring setup', durationMinutes: 45, bufferAfterMinutes: 15, priceMinor: 5000 },
      { name: 'Lower-leg service', durationMinutes: 90, bufferAfterMinutes: 15, priceMinor: 9000 },
      { name: 'Full setup, both ends', durationMinutes: 120, bufferAfterMinutes: 30, priceMinor: 14000 },
    ],
  });
  const riderHash = await cheapPasswordHash(randomBytes(24).toString('base64'));
  const riders = await insertRiders(pool, rand, 'history', 500, () => Promise.resolve(riderHash));

  const zone = shop.timeZone;
  const today = DateTime.fromMillis(nowMs, { zone }).startOf('day');
  const first = today.minus({ years: 5 });
  const last = today.plus({ days: 60 });

  // closures: two weeks at the turn of every year and a few single days
  const closures: [string, string, string, string][] = [];
  for (let y = first.year; y <= last.year; y++) {
    closures.push([uuidFrom(rand), `${y}-12-24`, `${y + 1}-01-06`, 'Winter break']);
    for (let k = 0; k < 6; k++) {
      const d = DateTime.fromObject({ year: y, month: 1, day: 1 }, { zone })
        .plus({ days: Math.floor(rand() * 340) + 10 })
        .toISODate()!;
      closures.push([uuidFrom(rand), d, d, 'Closed for the day']);
    }
  }
  await bulkInsert(
    pool,
    'shop_closures',
    ['id', 'shop_id', 'from_date', 'to_date', 'reason'],
    closures.map(([id, from, to, reason]) => [id, shop.id, from, to, reason]),
  );

  const appts: unknown[][] = [];
  const cells: unknown[][] = [];
  let live = 0;
  for (let day = first; day <= last; day = day.plus({ days: 1 })) {
    const iso = day.toISODate()!;
    if (closures.some(([, from, to]) => from <= iso && iso <= to)) continue;
    for (const [w, open, close] of weekday) {
      if (w !== day.weekday) continue;
      for (let bench = 1; bench <= shop.benches; bench++) {
        let m = open;
        while (m < close) {
          const service = shop.services[Math.floor(rand() * shop.services.length)];
          if (m + service.durationMinutes > close || rand() > 0.55) {
            m += 15;
            continue;
          }
          const start = day.set({ hour: Math.floor(m / 60), minute: m % 60 });
          const startMs = start.toMillis();
          const endMs = startMs + service.durationMinutes * 60_000;
          const keepMs = endMs + service.bufferAfterMinutes * 60_000;
          const future = startMs > nowMs;
          const status = pick(rand, future ? FUTURE_STATES : PAST_STATES);
          const id = uuidFrom(rand);
          const rider = riders[Math.floor(rand() * riders.length)];
          const held = status === 'held';
          appts.push([
            id,
            shop.id,
            service.id,
            rider.id,
            status,
            new Date(startMs),
            new Date(endMs),
            new Date(keepMs),
            bench,
            held ? new Date(nowMs - 60_000) : null,
            6000,
            0,
            'EUR',
            1,
          ]);
          if (status === 'confirmed' || status === 'requested') {
            live += 1;
            for (let t = startMs; t < keepMs; t += 5 * 60_000) cells.push([shop.id, bench, new Date(t), id]);
          }
          // the next one on this bench starts after the buffer, on the 15-minute step
          m += Math.ceil((service.durationMinutes + service.bufferAfterMinutes) / 15) * 15;
        }
      }
    }
  }
  await bulkInsert(
    pool,
    'appointments',
    [
      'id',
      'shop_id',
      'service_id',
      'rider_id',
      'status',
      'start_at',
      'end_at',
      'keep_until',
      'bench',
      'hold_expires_at',
      'price_minor',
      'deposit_minor',
      'currency',
      'version',
    ],
    appts,
  );
  await bulkInsert(pool, 'appointment_cells', ['shop_id', 'bench', 'cell_at', 'appointment_id'], cells, 5000);
  for (const t of ['appointments', 'appointment_cells', 'shop_closures']) {
    await pool.query(`ANALYZE TABLE \`${t}\``).catch(() => undefined);
  }
  return {
    shop,
    stats: {
      appointments: appts.length,
      live,
      cells: cells.length,
      closures: closures.length,
      ms: Date.now() - began,
    },
  };
}

/**
 * A shop open every day 08:00–20:00 with `benches` benches (its capacity at any one time), a free
 * 30-minute service (no payment step), and `riders` riders who can sign in with `password`.
 */
export async function seedBurstShop(
  pool: Pool,
  benches: number,
  riderCount: number,
  password: string,
): Promise<{ shop: SeededShop; riders: { id: string; email: string }[] }> {
  await removeShop(pool, 'bench-burst', 'burst');
  const rand = prng(100_2026);
  const shop = await insertShop(pool, rand, {
    slug: 'bench-burst',
    name: 'Bench Burst Suspension',
    town: 'Talus Flats',
    timeZone: 'America/Denver',
    currency: 'USD',
    benches,
    slotStepMinutes: 30,
    minNoticeMinutes: 60,
    maxDaysAhead: 30,
    hours: [1, 2, 3, 4, 5, 6, 7].map((w) => [w, 8 * 60, 20 * 60]),
    services: [{ name: 'Free sag check', durationMinutes: 30, bufferAfterMinutes: 0, priceMinor: 0 }],
  });
  const riders = await insertRiders(pool, rand, 'burst', riderCount, () => cheapPasswordHash(password));
  return { shop, riders };
}

/**
 * An owner of an already seeded shop who can sign in with `password` (the first-screen step opens
 * the Workshop's Requests as them). removeShop takes them away with the shop.
 */
export async function seedShopOwner(
  pool: Pool,
  shopSlug: string,
  password: string,
): Promise<{ email: string; password: string }> {
  const [rows] = await pool.query('SELECT id FROM shops WHERE slug = ?', [shopSlug]);
  const shop = (rows as { id: string }[])[0];
  if (!shop) throw new Error(`no shop ${shopSlug} to give an owner`);
  const email = `${shopSlug}-owner@bench.example.test`;
  await pool.query('DELETE FROM users WHERE email = ?', [email]);
  await bulkInsert(
    pool,
    'users',
    ['id', 'email', 'name', 'role', 'password_hash', 'shop_id'],
    [[uuidFrom(prng(7)), email, 'Bench owner', 'owner', await cheapPasswordHash(password), shop.id]],
  );
  return { email, password };
}
