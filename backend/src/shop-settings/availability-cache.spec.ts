import type { AvailableStart } from '@loamline/shared-types';
import { ManualClock } from '../common/clock/clock';
import { AVAILABILITY_REUSE_MS, AvailabilityCache } from './availability-cache';

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
