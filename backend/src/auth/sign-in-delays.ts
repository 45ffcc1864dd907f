/** Failures for one address that cost nothing: a typo or two should not slow anyone down. */
const FREE_FAILURES = 3;
/** The delay stops growing here. */
const MAX_DELAY_MS = 5000;
/** Failures older than this are forgotten. */
const WINDOW_MS = 15 * 60 * 1000;
/** Addresses remembered at most (the oldest go first), so the map cannot grow without end. */
const MAX_ENTRIES = 10_000;

interface Entry {
  failures: number;
  lastAt: number;
}

/**
 * Repeated failed sign-ins for one address slow down: after three free failures each further
 * attempt waits base, 2·base, 4·base … up to 5 s, until a success or 15 quiet minutes. Kept in
 * memory (one server process); the per-IP rate limit sits in front of it.
 */
export class SignInDelays {
  private readonly entries = new Map<string, Entry>();

  constructor(
    private readonly baseMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  /** How long the next attempt for this address waits before its password is checked. */
  delayMs(email: string): number {
    const e = this.current(email);
    if (!e || this.baseMs === 0) return 0;
    const over = e.failures - FREE_FAILURES;
    if (over < 0) return 0;
    return Math.min(this.baseMs * 2 ** over, MAX_DELAY_MS);
  }

  recordFailure(email: string): void {
    const e = this.current(email);
    this.entries.delete(email); // re-insert: Map order is then oldest-first
    this.entries.set(email, { failures: (e?.failures ?? 0) + 1, lastAt: this.now() });
    if (this.entries.size > MAX_ENTRIES) {
      const oldest = this.entries.keys().next().value;
      if (oldest !== undefined) this.entries.delete(oldest);
    }
  }

  recordSuccess(email: string): void {
    this.entries.delete(email);
  }

  private current(email: string): Entry | undefined {
    const e = this.entries.get(email);
    if (e && this.now() - e.lastAt > WINDOW_MS) {
      this.entries.delete(email);
      return undefined;
    }
    return e;
  }
}
