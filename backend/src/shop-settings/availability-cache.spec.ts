import { Logger } from '@nestjs/common';
import type { AvailableStart } from '@loamline/shared-types';
import { ManualClock } from '../common/clock/clock';
import { AVAILABILITY_REFRESH_MS, AVAILABILITY_REUSE_MS, AvailabilityCache } from './availability-cache';

/* A per-instance micro-cache of one second (common practice, no source): what is checked is that it
   never outlives a change it heard of, a moved clock, a failure or its second. */
const start = (iso: string): AvailableStart => ({ start: iso, end: iso, benchesFree: 1 });

describe('AvailabilityCache', () => {
  let clock: ManualClock;
  let cache: AvailabilityCache;
  let calls: number;
  const work =
    (shopId = 'shop-a') =>
    () => {
      calls += 1;
      return Promise.resolve({ shopId, starts: [start(`2027-01-0${calls}T09:00:00Z`)] });
    };

  beforeEach(() => {
    clock = new ManualClock(new Date('2027-01-01T08:00:00Z'));
    cache = new AvailabilityCache(clock);
    calls = 0;
  });

  it('answers the same question from one computation, also while it runs', async () => {
    const [a, b] = await Promise.all([cache.answer('k', work()), cache.answer('k', work())]);
    expect(await cache.answer('k', work())).toBe(a);
    expect(b).toBe(a);
    expect(calls).toBe(1);
  });

  it('works a different question out on its own', async () => {
    await cache.answer('k1', work());
    await cache.answer('k2', work());
    expect(calls).toBe(2);
  });

  it('forgets a shop at once when it changes (and leaves other shops)', async () => {
    await cache.answer('a', work('shop-a'));
    await cache.answer('b', work('shop-b'));
    cache.forgetShop('shop-a');
    await cache.answer('a', work('shop-a'));
    await cache.answer('b', work('shop-b'));
    expect(calls).toBe(3);
  });

  it('does not reuse an answer once the clock moved a second, forward or back', async () => {
    await cache.answer('k', work());
    clock.advance(AVAILABILITY_REUSE_MS);
    await cache.answer('k', work());
    clock.advance(-5_000);
    await cache.answer('k', work());
    expect(calls).toBe(3);
  });

  it('does not reuse an answer after a second of real time, however still the clock', async () => {
    const now = jest.spyOn(performance, 'now');
    now.mockReturnValue(10_000);
    await cache.answer('k', work());
    now.mockReturnValue(10_000 + AVAILABILITY_REUSE_MS);
    await cache.answer('k', work());
    expect(calls).toBe(2);
    now.mockRestore();
  });

  it('never keeps a failure', async () => {
    await expect(cache.answer('k', () => Promise.reject(new Error('no such shop')))).rejects.toThrow();
    await cache.answer('k', work());
    expect(calls).toBe(1);
  });
});

/* Refresh ahead: both clocks the cache reads (performance.now() and the injected clock) are moved by
   hand, and every computation is held open until the test settles it, so nothing here depends on how
   fast the machine is. */
describe('AvailabilityCache refresh-ahead', () => {
  type Result = { shopId: string; starts: AvailableStart[] };
  interface Held {
    resolve: (r: Result) => void;
    reject: (e: unknown) => void;
  }
  let clock: ManualClock;
  let cache: AvailabilityCache;
  let perfNow: number;
  let held: Held[];
  let warn: jest.SpyInstance;

  /** A computation the test settles by hand (`held[i]`), one per call. */
  const work = () => () =>
    new Promise<Result>((resolve, reject) => {
      held.push({ resolve, reject });
    });
  const answerOf = (label: string, shopId = 'shop-a'): Result => ({ shopId, starts: [start(label)] });
  const advance = (ms: number) => {
    perfNow += ms;
    clock.advance(ms);
  };
  /** Lets settled computations run their callbacks. */
  const settle = () => new Promise<void>((r) => setImmediate(r));
  /** Whether `p` has settled by now. */
  const isSettled = async (p: Promise<unknown>) => {
    let done = false;
    void p.then(
      () => (done = true),
      () => (done = true),
    );
    await settle();
    return done;
  };
  /** The first answer of 'k', worked out and kept. */
  const primed = async (label = 'A') => {
    const first = cache.answer('k', work());
    held[0].resolve(answerOf(label));
    return first;
  };

  beforeEach(() => {
    clock = new ManualClock(new Date('2027-01-01T08:00:00Z'));
    cache = new AvailabilityCache(clock);
    perfNow = 50_000;
    jest.spyOn(performance, 'now').mockImplementation(() => perfNow);
    warn = jest.spyOn(Logger.prototype, 'warn').mockImplementation(() => undefined);
    held = [];
  });
  afterEach(() => jest.restoreAllMocks());

  it('serves the kept answer, at once, while one refresh runs, and the new one once it is in', async () => {
    const a = await primed('A');
    advance(AVAILABILITY_REFRESH_MS - 1);
    expect(await cache.answer('k', work())).toBe(a); // before the refresh point: no refresh
    expect(held).toHaveLength(1);
    advance(1);
    const during = cache.answer('k', work()); // starts the refresh...
    expect(held).toHaveLength(2);
    expect(await isSettled(during)).toBe(true); // ...and is not kept waiting for it
    expect(await during).toBe(a);
    held[1].resolve(answerOf('B'));
    await settle();
    const b = await cache.answer('k', work());
    expect(b).not.toBe(a);
    expect(b[0].start).toBe('B');
    expect(held).toHaveLength(2);
  });

  it('runs only one refresh at once, and requests past the hard expiry wait for it rather than start another', async () => {
    const a = await primed('A');
    advance(AVAILABILITY_REFRESH_MS);
    const served = await Promise.all(Array.from({ length: 20 }, () => cache.answer('k', work())));
    expect(served.every((s) => s === a)).toBe(true);
    expect(held).toHaveLength(2); // the first and one refresh
    advance(AVAILABILITY_REUSE_MS - AVAILABILITY_REFRESH_MS); // A has expired, the refresh is young
    const waiting = [cache.answer('k', work()), cache.answerJson('k', work())] as const;
    expect(held).toHaveLength(2);
    expect(await isSettled(Promise.race(waiting))).toBe(false); // A is not served past its second
    held[1].resolve(answerOf('B'));
    const [b, json] = await Promise.all(waiting);
    expect(b[0].start).toBe('B');
    expect(json).toBe(JSON.stringify(b));
    expect(held).toHaveLength(2);
  });

  it('lets an invalidation during a refresh win: the older answer the refresh brings is not put back', async () => {
    await primed('A');
    advance(AVAILABILITY_REFRESH_MS);
    await cache.answer('k', work()); // refresh under way
    expect(held).toHaveLength(2);
    cache.forgetShop('shop-a');
    held[1].resolve(answerOf('B, read before the change'));
    await settle();
    const after = cache.answer('k', work()); // worked out afresh
    expect(held).toHaveLength(3);
    held[2].resolve(answerOf('C'));
    expect((await after)[0].start).toBe('C');
    expect((await cache.answer('k', work()))[0].start).toBe('C');
    expect(held).toHaveLength(3);
  });

  it('keeps a refresh going when another shop changes', async () => {
    await primed('A');
    advance(AVAILABILITY_REFRESH_MS);
    await cache.answer('k', work());
    cache.forgetShop('shop-b');
    held[1].resolve(answerOf('B'));
    await settle();
    expect((await cache.answer('k', work()))[0].start).toBe('B');
    expect(held).toHaveLength(2);
  });

  it('keeps the old answer when a refresh fails, logs it, and lets the next request try again', async () => {
    const a = await primed('A');
    advance(AVAILABILITY_REFRESH_MS);
    expect(await cache.answer('k', work())).toBe(a);
    held[1].reject(new Error('database away'));
    await settle();
    expect(warn).toHaveBeenCalledTimes(1);
    expect(String(warn.mock.calls[0][0])).toContain('database away');
    expect(await cache.answer('k', work())).toBe(a); // still served, and a second refresh began
    expect(held).toHaveLength(3);
    expect(await cache.answer('k', work())).toBe(a); // only one at once, also the second time
    expect(held).toHaveLength(3);
    held[2].resolve(answerOf('B'));
    await settle();
    expect((await cache.answer('k', work()))[0].start).toBe('B');
  });

  it('does not serve the old answer past its hard expiry after a failed refresh', async () => {
    await primed('A');
    advance(AVAILABILITY_REFRESH_MS);
    await cache.answer('k', work());
    held[1].reject(new Error('database away'));
    await settle();
    advance(AVAILABILITY_REUSE_MS - AVAILABILITY_REFRESH_MS);
    const after = cache.answer('k', work());
    expect(held).toHaveLength(3);
    held[2].reject(new Error('still away'));
    await expect(after).rejects.toThrow('still away');
  });

  it('waits at the hard expiry when no refresh ran (a quiet second), as without refresh-ahead', async () => {
    const a = await primed('A');
    advance(AVAILABILITY_REUSE_MS);
    const after = cache.answerJson('k', work());
    expect(held).toHaveLength(2);
    expect(await isSettled(after)).toBe(false);
    held[1].resolve(answerOf('B'));
    expect(await after).not.toBe(JSON.stringify(a));
    expect(JSON.parse(await after)).toEqual([start('B')]);
  });

  it('never serves a refresh that began a second or more before the request', async () => {
    await primed('A');
    advance(AVAILABILITY_REFRESH_MS);
    await cache.answer('k', work()); // the refresh begins here and hangs
    advance(AVAILABILITY_REUSE_MS);
    const after = cache.answer('k', work()); // neither A nor the hanging refresh: a computation of its own
    expect(held).toHaveLength(3);
    held[2].resolve(answerOf('C'));
    held[1].resolve(answerOf('B, too late'));
    expect((await after)[0].start).toBe('C');
    await settle();
    expect((await cache.answer('k', work()))[0].start).toBe('C');
  });

  it('serializes a refreshed answer asked for as JSON once, in the refresh', async () => {
    const first = cache.answerJson('k', work());
    held[0].resolve(answerOf('A'));
    const a = await first;
    advance(AVAILABILITY_REFRESH_MS);
    expect(await cache.answerJson('k', work())).toBe(a);
    const stringify = jest.spyOn(JSON, 'stringify');
    held[1].resolve(answerOf('B'));
    await settle();
    const [b1, b2] = await Promise.all([cache.answerJson('k', work()), cache.answerJson('k', work())]);
    expect(b1).toBe(JSON.stringify([start('B')]));
    expect(b2).toBe(b1);
    expect(stringify).toHaveBeenCalledTimes(2); // the refresh's and the expectation's own
  });
});
