/**
 * 100 parallel bookings of one time: a shop whose capacity at that time is its number of benches,
 * 100 signed-in riders, one POST /api/appointments each, all sent at once. Exactly `capacity` may
 * succeed (201); every other answer must be a 409 that says the time was taken; no 5xx. The
 * database is read afterwards: the live appointments at that time are exactly `capacity`.
 */
import { Agent, request } from 'node:http';
import { DateTime } from 'luxon';
import { median } from './load';
import type { Row } from './report';
import { benchPool, seedBurstShop } from './seed';

export const BURST_RIDERS = Number(process.env.BENCH_BURST ?? 100);
export const BURST_CAPACITY = 3;

interface Answer {
  status: number;
  body: string;
  ms: number;
}

function send(
  agent: Agent,
  url: string,
  method: string,
  body: unknown,
  headers: Record<string, string> = {},
): Promise<Answer> {
  const began = performance.now();
  const payload = JSON.stringify(body);
  return new Promise((resolve, reject) => {
    const req = request(
      url,
      {
        method,
        agent,
        headers: {
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(payload),
          ...headers,
        },
      },
      (res) => {
        let s = '';
        res.on('data', (c: Buffer) => (s += c.toString()));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: s, ms: performance.now() - began }));
      },
    );
    req.on('error', reject);
    req.end(payload);
  });
}

const percentile = (xs: number[], p: number): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)];
};

export async function bookingBurstFigure(app: string, notes: string[]): Promise<Row> {
  const pool = benchPool(4);
  const agent = new Agent({ keepAlive: true, maxSockets: BURST_RIDERS + 10 });
  try {
    const password = 'bench-burst-password-2026';
    const { shop, riders } = await seedBurstShop(pool, BURST_CAPACITY, BURST_RIDERS, password);
    const service = shop.services[0];

    // every rider signs in through the real route (10 at a time); the token goes as a Bearer header
    const tokens: string[] = [];
    for (let i = 0; i < riders.length; i += 10) {
      const batch = await Promise.all(
        riders
          .slice(i, i + 10)
          .map((r) => send(agent, `${app}/api/auth/sign-in`, 'POST', { email: r.email, password })),
      );
      for (const a of batch) {
        if (a.status !== 200) throw new Error(`sign-in answered ${a.status}: ${a.body}`);
        tokens.push((JSON.parse(a.body) as { accessToken: string }).accessToken);
      }
    }

    const start = DateTime.now()
      .setZone(shop.timeZone)
      .startOf('day')
      .plus({ days: 1 })
      .set({ hour: 10 })
      .toISO({ suppressMilliseconds: true })!;
    const body = { shopSlug: shop.slug, serviceId: service.id, start };
    const began = performance.now();
    const answers = await Promise.all(
      tokens.map((t) =>
        send(agent, `${app}/api/appointments`, 'POST', body, { authorization: `Bearer ${t}` }).catch(
          (e: unknown): Answer => ({ status: 0, body: String(e), ms: performance.now() - began }),
        ),
      ),
    );
    const wallMs = performance.now() - began;

    const created = answers.filter((a) => a.status === 201).length;
    const conflicts = answers.filter((a) => a.status === 409);
    const clearConflicts = conflicts.filter((a) => /no longer free|already/i.test(a.body)).length;
    const fivexx = answers.filter((a) => a.status >= 500 || a.status === 0).length;
    const other = answers.length - created - conflicts.length - fivexx;
    const [[{ live }]] = (await pool.query(
      `SELECT COUNT(*) AS live FROM appointments WHERE shop_id = ? AND start_at = ?
         AND status IN ('held', 'requested', 'confirmed')`,
      [shop.id, new Date(Date.parse(start))],
    )) as unknown as [[{ live: number }]];
    const ms = answers.map((a) => a.ms);
    const pass =
      created === BURST_CAPACITY &&
      Number(live) === BURST_CAPACITY &&
      conflicts.length === BURST_RIDERS - BURST_CAPACITY &&
      clearConflicts === conflicts.length &&
      fivexx === 0;
    if (conflicts[0]) notes.push(`bookings: a refused booking reads ${conflicts[0].body}`);
    const otherStatuses = [
      ...new Set(answers.filter((a) => ![201, 409].includes(a.status)).map((a) => a.status)),
    ];
    return {
      figure: `${BURST_RIDERS} parallel bookings of one time, capacity ${BURST_CAPACITY}`,
      measured:
        `${created} booked, ${conflicts.length} × 409, ${fivexx} × 5xx` +
        (other ? `, ${other} other (${otherStatuses.join(', ')})` : '') +
        `; ${Number(live)} live in the database; all in ${wallMs.toFixed(0)} ms`,
      baseline: '—',
      ratio: '—',
      latency: `${median(ms).toFixed(0)} / ${percentile(ms, 99).toFixed(0)}`,
      budget: `exactly ${BURST_CAPACITY} booked, the rest a clear 409, no 5xx`,
      pass,
    };
  } finally {
    agent.destroy();
    await pool.end();
  }
}
