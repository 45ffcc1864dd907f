import { toRecord } from './shared-throttler-storage';

describe('toRecord (the throttler record from a rate_limit_hits row)', () => {
  const now = new Date(1_000_000);
  const at = (ms: number): Date => new Date(now.getTime() + ms);

  it('a counted hit: seconds to the window end, rounded up; not blocked', () => {
    expect(toRecord({ hits: 2, window_ends_at: at(59_001), blocked_until: null }, now)).toEqual({
      totalHits: 2,
      timeToExpire: 60,
      isBlocked: false,
      timeToBlockExpire: 0,
    });
  });

  it('a blocked key: seconds to the block end', () => {
    expect(toRecord({ hits: 6, window_ends_at: at(10_000), blocked_until: at(45_500) }, now)).toEqual({
      totalHits: 6,
      timeToExpire: 10,
      isBlocked: true,
      timeToBlockExpire: 46,
    });
  });

  it('a block that has ended is no block, and time never goes below 0', () => {
    expect(toRecord({ hits: 1, window_ends_at: at(-5), blocked_until: at(0) }, now)).toEqual({
      totalHits: 1,
      timeToExpire: 0,
      isBlocked: false,
      timeToBlockExpire: 0,
    });
  });

  it('reads a count the driver gave as a string', () => {
    const row = { hits: '3' as unknown as number, window_ends_at: at(1000), blocked_until: null };
    expect(toRecord(row, now).totalHits).toBe(3);
  });
});
