import { createHash } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { ThrottlerStorage } from '@nestjs/throttler';
import type { DataSource } from 'typeorm';
import { retryAborted } from '../../appointments/booking-errors';
import { CLOCK, type Clock } from '../../common/clock/clock';
import { RATE_LIMIT_SCOPE } from './rate-limit-scope';

/** The record the throttler guard reads (not exported by name from @nestjs/throttler 6). */
export type ThrottlerStorageRecord = Awaited<ReturnType<ThrottlerStorage['increment']>>;

/** The row of `rate_limit_hits` as read back after an increment. */
export interface HitsRow {
  hits: number;
  window_ends_at: Date;
  blocked_until: Date | null;
}

/**
 * One statement counts a hit, atomically, whatever instance or Galera node runs it. The window is
 * fixed (it starts at the first hit and lasts `ttl`); the hit that goes over the limit blocks the key
 * for `blockDuration`, and hits while blocked are not counted. A key whose window or block has
 * passed starts again at one hit.
 *
 * MariaDB evaluates the assignments of ON DUPLICATE KEY UPDATE from left to right, each seeing the
 * columns already assigned (as a single-table UPDATE does): `hits` and `window_ends_at` read the
 * old `blocked_until` and `window_ends_at`; `blocked_until` reads the new `hits`; `expires_at` the
 * new window and block. Every time is a parameter from the app's clock, none is the server's.
 *
 * Parameters: key hash, window end, blocked at once (1 > limit), block end, expiry (the insert);
 * now, now, now, now, window end, now, limit, block end (the update).
 */
export const INCREMENT_SQL = `INSERT INTO \`rate_limit_hits\` (\`key_hash\`, \`hits\`, \`window_ends_at\`, \`blocked_until\`, \`expires_at\`)
  VALUES (?, 1, ?, IF(?, ?, NULL), ?)
  ON DUPLICATE KEY UPDATE
    \`hits\` = IF(\`blocked_until\` > ?, \`hits\`,
      IF(\`window_ends_at\` <= ? OR \`blocked_until\` IS NOT NULL, 1, \`hits\` + 1)),
    \`window_ends_at\` = IF(\`blocked_until\` > ?, \`window_ends_at\`,
      IF(\`window_ends_at\` <= ? OR \`blocked_until\` IS NOT NULL, ?, \`window_ends_at\`)),
    \`blocked_until\` = IF(\`blocked_until\` > ?, \`blocked_until\`, IF(\`hits\` > ?, ?, NULL)),
    \`expires_at\` = GREATEST(\`window_ends_at\`, COALESCE(\`blocked_until\`, \`window_ends_at\`))`;

/** What the guard reads back, in the same transaction. */
const READ_SQL =
  'SELECT `hits`, `window_ends_at`, `blocked_until` FROM `rate_limit_hits` WHERE `key_hash` = ?';

/**
 * `@nestjs/throttler`'s storage in MariaDB (table `rate_limit_hits`), so every app instance counts
 * against the same limit (docs/scaling.md). The key stored is the SHA-256 of the throttler's name
 * and the guard's key (itself a hash of the route and the client's address), never an address.
 * Each increment is one INSERT … ON DUPLICATE KEY UPDATE and the read of the row it wrote, in one
 * short transaction, run again on a deadlock or a Galera certification conflict. A database that
 * cannot be reached throws, and the exception filter answers 503: the limit never fails open.
 * Old rows go in `RateLimitSweep`.
 */
@Injectable()
export class SharedThrottlerStorage implements ThrottlerStorage {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(CLOCK) private readonly clock: Clock,
    @Inject(RATE_LIMIT_SCOPE) private readonly scope: string,
  ) {}

  /** The stored key: SHA-256 hex of (scope,) throttler name and key. */
  keyHash(key: string, throttlerName: string): string {
    return createHash('sha256').update(`${this.scope}\n${throttlerName}\n${key}`).digest('hex');
  }

  async increment(
    key: string,
    ttl: number,
    limit: number,
    blockDuration: number,
    throttlerName: string,
  ): Promise<ThrottlerStorageRecord> {
    const hash = this.keyHash(key, throttlerName);
    const now = this.clock.now();
    const windowEnd = new Date(now.getTime() + ttl);
    const blockEnd = new Date(now.getTime() + Math.max(blockDuration, 0));
    const blockedAtOnce = 1 > limit;
    const insertExpires = blockedAtOnce && blockEnd > windowEnd ? blockEnd : windowEnd;
    const row = await retryAborted(() =>
      this.dataSource.transaction(async (m) => {
        await m.query(INCREMENT_SQL, [
          hash,
          windowEnd,
          blockedAtOnce,
          blockEnd,
          insertExpires,
          now,
          now,
          now,
          now,
          windowEnd,
          now,
          limit,
          blockEnd,
        ]);
        const rows = await m.query<HitsRow[]>(READ_SQL, [hash]);
        return rows[0];
      }),
    );
    return toRecord(row, now);
  }
}

/** What the throttler guard wants to know, from the row and the time of the hit (seconds, rounded up). */
export function toRecord(row: HitsRow, now: Date): ThrottlerStorageRecord {
  const seconds = (until: Date): number => Math.max(0, Math.ceil((until.getTime() - now.getTime()) / 1000));
  const isBlocked = row.blocked_until !== null && row.blocked_until.getTime() > now.getTime();
  return {
    totalHits: Number(row.hits),
    timeToExpire: seconds(row.window_ends_at),
    isBlocked,
    timeToBlockExpire: isBlocked && row.blocked_until ? seconds(row.blocked_until) : 0,
  };
}
