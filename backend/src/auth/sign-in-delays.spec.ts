import { ManualClock } from '../common/clock/clock';
import {
  delayFor,
  emailHash,
  type FailureEntry,
  type SignInFailureStore,
  SignInDelays,
} from './sign-in-delays';

/** The store's contract in memory (the app's is `sign_in_failures`, tested in shared-rate-limits). */
class MemoryFailures implements SignInFailureStore {
  readonly rows = new Map<string, FailureEntry>();
  get(hash: string): Promise<FailureEntry | null> {
    return Promise.resolve(this.rows.get(hash) ?? null);
  }
  addFailure(hash: string, at: Date, staleBefore: Date): Promise<void> {
    const e = this.rows.get(hash);
    const fresh = !e || e.lastAt < staleBefore;
    this.rows.set(hash, { failures: fresh ? 1 : e.failures + 1, lastAt: at });
    return Promise.resolve();
  }
  clear(hash: string): Promise<void> {
    this.rows.delete(hash);
    return Promise.resolve();
  }
}

describe('SignInDelays', () => {
  let clock: ManualClock;
  let store: MemoryFailures;

  beforeEach(() => {
    clock = new ManualClock(new Date(1_000_000));
    store = new MemoryFailures();
  });

  it('lets three failures pass, then doubles from the base delay up to 5 s', async () => {
    const d = new SignInDelays(250, store, clock);
    const seen: number[] = [];
    for (let i = 0; i < 10; i++) {
      seen.push(await d.delayMs('a@example.test'));
      await d.recordFailure('a@example.test');
    }
    expect(seen).toEqual([0, 0, 0, 250, 500, 1000, 2000, 4000, 5000, 5000]);
  });

  it('counts per address, and a success clears it', async () => {
    const d = new SignInDelays(100, store, clock);
    for (let i = 0; i < 5; i++) await d.recordFailure('a@example.test');
    expect(await d.delayMs('a@example.test')).toBe(400);
    expect(await d.delayMs('b@example.test')).toBe(0);
    await d.recordSuccess('a@example.test');
    expect(await d.delayMs('a@example.test')).toBe(0);
  });

  it('forgets failures after 15 quiet minutes', async () => {
    const d = new SignInDelays(100, store, clock);
    for (let i = 0; i < 5; i++) await d.recordFailure('a@example.test');
    clock.advance(15 * 60 * 1000);
    expect(await d.delayMs('a@example.test')).toBe(400);
    clock.advance(1);
    expect(await d.delayMs('a@example.test')).toBe(0);
    // and the next failure starts a new count
    await d.recordFailure('a@example.test');
    expect(store.rows.get(emailHash('a@example.test'))?.failures).toBe(1);
  });

  it('is off with a base of 0', async () => {
    const d = new SignInDelays(0, store, clock);
    for (let i = 0; i < 8; i++) await d.recordFailure('a@example.test');
    expect(await d.delayMs('a@example.test')).toBe(0);
  });

  it('keys an address by the SHA-256 of its normalised form, never the address itself', async () => {
    const d = new SignInDelays(100, store, clock);
    for (let i = 0; i < 2; i++) await d.recordFailure('A@Example.TEST');
    await d.recordFailure(' a@example.test ');
    expect(await d.delayMs('a@example.test')).toBe(100);
    expect([...store.rows.keys()]).toEqual([emailHash('a@example.test')]);
    expect(emailHash('a@example.test')).toMatch(/^[0-9a-f]{64}$/);
  });

  it('does not take a store that fails for "no failures"', async () => {
    const down: SignInFailureStore = {
      get: () => Promise.reject(new Error('connect ECONNREFUSED')),
      addFailure: () => Promise.reject(new Error('connect ECONNREFUSED')),
      clear: () => Promise.reject(new Error('connect ECONNREFUSED')),
    };
    const d = new SignInDelays(100, down, clock);
    await expect(d.delayMs('a@example.test')).rejects.toThrow(/ECONNREFUSED/);
    await expect(d.recordFailure('a@example.test')).rejects.toThrow(/ECONNREFUSED/);
  });
});

describe('delayFor', () => {
  const at = new Date(2_000_000);
  it('is 0 without an entry, within the free failures, or after the window', () => {
    expect(delayFor(null, at, 100)).toBe(0);
    expect(delayFor({ failures: 2, lastAt: at }, at, 100)).toBe(0);
    expect(delayFor({ failures: 9, lastAt: new Date(at.getTime() - 15 * 60 * 1000 - 1) }, at, 100)).toBe(0);
  });
  it('doubles past the free failures and stops at 5 s', () => {
    expect(delayFor({ failures: 3, lastAt: at }, at, 100)).toBe(100);
    expect(delayFor({ failures: 4, lastAt: at }, at, 100)).toBe(200);
    expect(delayFor({ failures: 40, lastAt: at }, at, 100)).toBe(5000);
  });
});
