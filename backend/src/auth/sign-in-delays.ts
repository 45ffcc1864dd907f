import { createHash } from 'node:crypto';
import type { Clock } from '../common/clock/clock';
import { normaliseEmail } from '../common/email';

/** Failures for one address that cost nothing: a typo or two should not slow anyone down. */
export const FREE_FAILURES = 3;
/** The delay stops growing here. */
export const MAX_DELAY_MS = 5000;
/** Failures older than this are forgotten. */
export const FAILURE_WINDOW_MS = 15 * 60 * 1000;

/** One address's failed sign-ins: how many, and when the last one was. */
export interface FailureEntry {
  failures: number;
  lastAt: Date;
}

/**
 * Where the failures are kept, by the SHA-256 of the normalised address (`sign_in_failures` in the
 * app, `SignInFailureTable`). `addFailure` must be atomic: a count whose last failure is older than
 * `staleBefore` starts again at one.
 */
export interface SignInFailureStore {
  get(emailHash: string): Promise<FailureEntry | null>;
  addFailure(emailHash: string, at: Date, staleBefore: Date): Promise<void>;
  clear(emailHash: string): Promise<void>;
}

/** The key of an address: SHA-256 hex of its normalised form (never the address itself). */
export function emailHash(email: string): string {
  const n = normaliseEmail(email) || email.normalize('NFC').trim().toLowerCase();
  return createHash('sha256').update(n).digest('hex');
}

/** The wait for an entry at `now`: pure, the rule of the class below. */
export function delayFor(entry: FailureEntry | null, now: Date, baseMs: number): number {
  if (!entry || baseMs === 0) return 0;
  if (now.getTime() - entry.lastAt.getTime() > FAILURE_WINDOW_MS) return 0;
  const over = entry.failures - FREE_FAILURES;
  if (over < 0) return 0;
  return Math.min(baseMs * 2 ** over, MAX_DELAY_MS);
}

/**
 * Repeated failed sign-ins for one address slow down: after three free failures each further
 * attempt waits base, 2·base, 4·base … up to 5 s, until a success or 15 quiet minutes. The counts
 * live in the database (`SignInFailureTable`), so failures made through any app instance count
 * (docs/scaling.md); the per-IP rate limit sits in front of it. A database that cannot be reached
 * throws (the sign-in answers 503), it is never taken as "no failures".
 */
export class SignInDelays {
  constructor(
    private readonly baseMs: number,
    private readonly store: SignInFailureStore,
    private readonly clock: Clock,
  ) {}

  /** How long the next attempt for this address waits before its password is checked. */
  async delayMs(email: string): Promise<number> {
    if (this.baseMs === 0) return 0;
    return delayFor(await this.store.get(emailHash(email)), this.clock.now(), this.baseMs);
  }

  async recordFailure(email: string): Promise<void> {
    if (this.baseMs === 0) return;
    const now = this.clock.now();
    await this.store.addFailure(emailHash(email), now, new Date(now.getTime() - FAILURE_WINDOW_MS));
  }

  async recordSuccess(email: string): Promise<void> {
    if (this.baseMs === 0) return;
    await this.store.clear(emailHash(email));
  }
}
