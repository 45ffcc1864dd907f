import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { retryAborted } from '../../appointments/booking-errors';
import type { FailureEntry, SignInFailureStore } from '../sign-in-delays';

/**
 * One more failure, atomically: a count whose last failure is older than the window starts again at
 * one. `failures` reads the old `last_failure_at` (assignments run left to right); the last failure
 * never moves back (two instances whose clocks differ a little). Parameters: hash, now, stale
 * before, now.
 */
export const ADD_FAILURE_SQL = `INSERT INTO \`sign_in_failures\` (\`email_hash\`, \`failures\`, \`last_failure_at\`)
  VALUES (?, 1, ?)
  ON DUPLICATE KEY UPDATE
    \`failures\` = IF(\`last_failure_at\` < ?, 1, \`failures\` + 1),
    \`last_failure_at\` = GREATEST(\`last_failure_at\`, ?)`;

/** `sign_in_failures`: the failed sign-ins per address (by hash) that every app instance shares. */
@Injectable()
export class SignInFailureTable implements SignInFailureStore {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  async get(emailHash: string): Promise<FailureEntry | null> {
    const rows = await this.dataSource.query<{ failures: number; last_failure_at: Date }[]>(
      'SELECT `failures`, `last_failure_at` FROM `sign_in_failures` WHERE `email_hash` = ?',
      [emailHash],
    );
    const r = rows[0];
    return r ? { failures: Number(r.failures), lastAt: r.last_failure_at } : null;
  }

  async addFailure(emailHash: string, at: Date, staleBefore: Date): Promise<void> {
    await retryAborted(() => this.dataSource.query(ADD_FAILURE_SQL, [emailHash, at, staleBefore, at]));
  }

  async clear(emailHash: string): Promise<void> {
    await retryAborted(() =>
      this.dataSource.query('DELETE FROM `sign_in_failures` WHERE `email_hash` = ?', [emailHash]),
    );
  }
}
