import { randomUUID } from 'node:crypto';
import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnModuleDestroy,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { retryAborted } from '../../appointments/booking-errors';
import { CLOCK, type Clock } from '../../common/clock/clock';
import { isDatabaseUnavailable, isWriteConflict } from '../../common/filters/database-errors';
import type { AuthConfig, MailConfig } from '../../config/app.config';
import { MailService, type OutgoingMail } from '../mail.service';
import { MailOutboxEntry } from './mail-outbox.entity';
import { OutboxCrypto } from './outbox-crypto';

/** How long a relay run holds the rows it claimed before another may take them again. */
const LEASE_MS = 2 * 60_000;
/** Rows one run claims at most. */
const BATCH = 20;
/** The longest wait between two attempts. */
const MAX_BACKOFF_MS = 30 * 60_000;

/** Runs in the transaction that marks a mail sent (e.g. an invitation replaces older ones only then). */
export type SentHook = (manager: EntityManager, entry: MailOutboxEntry) => Promise<void>;

/**
 * Sends what the outbox holds. Each run claims due rows with one UPDATE that only one relay can
 * win (rows unsent, not given up, due, and not held by a live claim), so two app instances on one
 * database — or on two nodes of a Galera cluster, where the losing claim fails certification —
 * never send the same row twice; a run that dies mid-send loses its claim after
 * LEASE_MS and the row is tried again (at-least-once only in that crash case). A failed send is
 * retried with doubling waits (MAIL_RETRY_BASE_MS, 2×, 4× … up to 30 min) until
 * MAIL_MAX_ATTEMPTS, then given up with one error line. One line is logged per failed attempt.
 */
@Injectable()
export class MailRelay implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('MailRelay');
  private readonly config: MailConfig;
  private readonly crypto: OutboxCrypto;
  private readonly hooks = new Map<string, SentHook>();
  private readonly inFlight = new Set<Promise<unknown>>();
  private timer: NodeJS.Timeout | null = null;
  private stopped = false;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly mail: MailService,
    @Inject(CLOCK) private readonly clock: Clock,
    config: ConfigService,
  ) {
    this.config = config.getOrThrow<MailConfig>('mail');
    this.crypto = new OutboxCrypto(config.getOrThrow<AuthConfig>('auth').jwtSecret);
  }

  onApplicationBootstrap(): void {
    const every = this.config.relayIntervalMs;
    if (every > 0) {
      this.timer = setInterval(() => this.runSoon(), every);
      this.timer.unref();
    }
  }

  async onModuleDestroy(): Promise<void> {
    this.stopped = true;
    if (this.timer) clearInterval(this.timer);
    await Promise.allSettled([...this.inFlight]);
  }

  onSent(kind: string, hook: SentHook): void {
    this.hooks.set(kind, hook);
  }

  /** The sealed form of a mail, for an outbox row. */
  seal(mail: OutgoingMail): Buffer {
    return this.crypto.seal(JSON.stringify(mail));
  }

  /** Starts a run in the background (only over `ids` when given: a request's own fresh rows). */
  runSoon(ids?: string[]): void {
    if (this.stopped) return;
    const run = this.runOnce(ids).catch((err: unknown) => {
      const msg = `Mail relay run failed: ${err instanceof Error ? err.message : String(err)}`;
      // the database away for a moment (a cluster node changing views, a restart): the next run sends
      if (isDatabaseUnavailable(err)) this.logger.warn(`${msg}; the next run tries again`);
      else this.logger.error(msg);
    });
    this.inFlight.add(run);
    void run.finally(() => this.inFlight.delete(run));
  }

  /** Claims due rows (all, or only `ids`), sends each once; returns how many were sent. */
  async runOnce(ids?: string[]): Promise<number> {
    if (ids && ids.length === 0) return 0;
    const now = this.clock.now();
    const claim = randomUUID();
    // The claim and the read of what it claimed in one transaction, on one connection (so on one
    // node of a cluster). Two relays on two Galera nodes may both claim a row; the second commit
    // fails certification (1213) and that relay sends nothing: the row is the winner's.
    let rows: MailOutboxEntry[];
    try {
      rows = await this.dataSource.transaction(async (m) => {
        const update = m
          .createQueryBuilder()
          .update(MailOutboxEntry)
          .set({
            claimedBy: claim,
            claimedUntil: new Date(now.getTime() + LEASE_MS),
            attempts: () => 'attempts + 1',
          })
          .where('sent_at IS NULL AND failed_at IS NULL AND next_attempt_at <= :now', { now })
          .andWhere('(claimed_until IS NULL OR claimed_until < :now)', { now });
        if (ids) update.andWhere('id IN (:...ids)', { ids });
        const claimed = await update.orderBy('id', 'ASC').limit(BATCH).execute();
        if (!claimed.affected) return [];
        return m.find(MailOutboxEntry, { where: { claimedBy: claim }, order: { id: 'ASC' } });
      });
    } catch (err) {
      // another relay won these rows (a certification conflict, or its claim held them too long)
      if (isWriteConflict(err)) return 0;
      throw err;
    }
    if (rows.length === 0) return 0;
    let sent = 0;
    for (const row of rows) {
      if (await this.deliver(row, claim)) sent += 1;
    }
    return sent;
  }

  private async deliver(row: MailOutboxEntry, claim: string): Promise<boolean> {
    let mail: OutgoingMail;
    try {
      mail = JSON.parse(this.crypto.open(row.payload ?? Buffer.alloc(0))) as OutgoingMail;
    } catch {
      await this.giveUp(row, claim, 'the payload cannot be read (another key?)');
      return false;
    }
    try {
      await this.mail.send(mail);
    } catch (err) {
      await this.failed(row, claim, err instanceof Error ? err.message : String(err));
      return false;
    }
    // Only the holder of the claim marks the row sent; a cluster conflict (1213) is tried again.
    await retryAborted(() =>
      this.dataSource.transaction(async (manager) => {
        const done = await manager
          .createQueryBuilder()
          .update(MailOutboxEntry)
          .set({ sentAt: this.clock.now(), payload: null, claimedBy: null, claimedUntil: null })
          .where('id = :id AND claimed_by = :claim AND sent_at IS NULL', { id: row.id, claim })
          .execute();
        if (done.affected === 1) await this.hooks.get(row.kind)?.(manager, row);
      }),
    );
    return true;
  }

  private async failed(row: MailOutboxEntry, claim: string, error: string): Promise<void> {
    if (row.attempts >= this.config.maxAttempts) {
      await this.giveUp(row, claim, error);
      return;
    }
    const wait = Math.min(this.config.retryBaseMs * 2 ** (row.attempts - 1), MAX_BACKOFF_MS);
    const next = new Date(this.clock.now().getTime() + wait);
    this.logger.warn(
      `Could not send ${row.kind} mail #${row.id} (attempt ${row.attempts}): ${error}; next try in ${Math.round(wait / 1000)} s`,
    );
    await this.release(row, claim, { nextAttemptAt: next, lastError: error.slice(0, 500) });
  }

  private async giveUp(row: MailOutboxEntry, claim: string, error: string): Promise<void> {
    this.logger.error(`Gave up on ${row.kind} mail #${row.id} after ${row.attempts} attempts: ${error}`);
    await this.release(row, claim, {
      failedAt: this.clock.now(),
      payload: null,
      lastError: error.slice(0, 500),
    });
  }

  private async release(row: MailOutboxEntry, claim: string, set: Partial<MailOutboxEntry>): Promise<void> {
    await retryAborted(() =>
      this.dataSource
        .createQueryBuilder()
        .update(MailOutboxEntry)
        .set({ ...set, claimedBy: null, claimedUntil: null })
        .where('id = :id AND claimed_by = :claim', { id: row.id, claim })
        .execute(),
    );
  }
}
