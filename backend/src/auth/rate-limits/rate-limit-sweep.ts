import { Inject, Injectable, Logger } from '@nestjs/common';
import { Interval } from '@nestjs/schedule';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource } from 'typeorm';
import { CLOCK, type Clock } from '../../common/clock/clock';
import { FAILURE_WINDOW_MS } from '../sign-in-delays';

/** Rows deleted per table and run at most, so one run stays short (the next run takes the rest). */
export const SWEEP_BATCH = 5000;

/**
 * Deletes the shared rate-limit rows nobody needs any more: counters whose window and block are
 * over (`IDX_rate_limit_hits_expires`) and failed sign-ins older than 15 minutes
 * (`IDX_sign_in_failures_last`). Every instance sweeps once a minute; two sweeps at once delete the
 * same rows (on Galera one may lose certification), which is harmless. A failed run is one log line.
 */
@Injectable()
export class RateLimitSweep {
  private readonly logger = new Logger(RateLimitSweep.name);

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(CLOCK) private readonly clock: Clock,
  ) {}

  @Interval('rate-limit-sweep', 60_000)
  async tick(): Promise<void> {
    try {
      await this.sweep();
    } catch (e) {
      this.logger.warn(`rate-limit sweep failed, will retry: ${(e as Error).message}`);
    }
  }

  /** One run; returns the rows deleted from each table. */
  async sweep(): Promise<{ hits: number; failures: number }> {
    const now = this.clock.now();
    const hits = await this.dataSource.query<{ affectedRows?: number }>(
      'DELETE FROM `rate_limit_hits` WHERE `expires_at` < ? LIMIT ?',
      [now, SWEEP_BATCH],
    );
    const failures = await this.dataSource.query<{ affectedRows?: number }>(
      'DELETE FROM `sign_in_failures` WHERE `last_failure_at` < ? LIMIT ?',
      [new Date(now.getTime() - FAILURE_WINDOW_MS), SWEEP_BATCH],
    );
    return { hits: hits.affectedRows ?? 0, failures: failures.affectedRows ?? 0 };
  }
}
