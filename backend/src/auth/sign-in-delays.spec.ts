import { SignInDelays } from './sign-in-delays';

describe('SignInDelays', () => {
  let now = 0;
  const clock = (): number => now;

  beforeEach(() => {
    now = 1_000_000;
  });

  it('lets three failures pass, then doubles from the base delay up to 5 s', () => {
    const d = new SignInDelays(250, clock);
    const seen: number[] = [];
    for (let i = 0; i < 10; i++) {
      seen.push(d.delayMs('a@example.test'));
      d.recordFailure('a@example.test');
    }
    expect(seen).toEqual([0, 0, 0, 250, 500, 1000, 2000, 4000, 5000, 5000]);
  });

  it('counts per address, and a success clears it', () => {
    const d = new SignInDelays(100, clock);
    for (let i = 0; i < 5; i++) d.recordFailure('a@example.test');
    expect(d.delayMs('a@example.test')).toBe(400);
    expect(d.delayMs('b@example.test')).toBe(0);
    d.recordSuccess('a@example.test');
    expect(d.delayMs('a@example.test')).toBe(0);
  });

  it('forgets failures after 15 quiet minutes', () => {
    const d = new SignInDelays(100, clock);
    for (let i = 0; i < 5; i++) d.recordFailure('a@example.test');
    now += 15 * 60 * 1000;
    expect(d.delayMs('a@example.test')).toBe(400);
    now += 1;
    expect(d.delayMs('a@example.test')).toBe(0);
  });

  it('is off with a base of 0', () => {
    const d = new SignInDelays(0, clock);
    for (let i = 0; i < 8; i++) d.recordFailure('a@example.test');
    expect(d.delayMs('a@example.test')).toBe(0);
  });

  it('remembers a bounded number of addresses, dropping the oldest', () => {
    const d = new SignInDelays(100, clock);
    for (let i = 0; i < 4; i++) d.recordFailure('first@example.test');
    for (let i = 0; i < 10_000; i++) d.recordFailure(`other-${i}@example.test`);
    expect(d.delayMs('first@example.test')).toBe(0);
    // the newest address is still remembered: its one failure and three more make four
    for (let i = 0; i < 3; i++) d.recordFailure('other-9999@example.test');
    expect(d.delayMs('other-9999@example.test')).toBe(200);
  });
});
