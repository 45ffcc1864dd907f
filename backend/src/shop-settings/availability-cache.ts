import { Inject, Injectable } from '@nestjs/common';
import type { AvailableStart } from '@loamline/shared-types';
import { CLOCK, type Clock } from '../common/clock/clock';

/** How long one instance answers a calendar's free starts from what it worked out last. */
export const AVAILABILITY_REUSE_MS = 1000;
/** Answers kept at most (a month of one service of one shop each); past it the lot is dropped. */
const AVAILABILITY_REUSE_MAX = 2000;

interface Entry {
  /** performance.now() when it was worked out */
  at: number;
  /** the injected clock then (tests move it: an answer is not reused across a move) */
  clockAt: number;
  /** known once the answer is worked out; a change to any shop drops answers still pending */
  shopId: string | null;
  starts: Promise<AvailableStart[]>;
  /** the answer's JSON, made once for everyone who gets it */
  json?: Promise<string>;
}

/**
 * The free starts a shop's booking calendar shows, kept for AVAILABILITY_REUSE_MS per instance
 * (a "micro-cache": many riders opening the same shop's month at once cost one computation a
 * second instead of one each; requests that arrive while it is worked out share it).
 *
 * Dropped on this instance at once when anything that shapes the answer changes here: a booking,
 * move, cancellation, decline or expiry at the shop (AppointmentsService's listener), its settings
 * (hours, closures, benches, rules: ShopSettingsService.put) or its services. A change made through
 * another instance is seen within AVAILABILITY_REUSE_MS. Nothing is booked from it: booking, moving
 * and proposing read everything afresh, and a time taken meanwhile answers 409 "no longer free".
 */
@Injectable()
export class AvailabilityCache {
  private readonly entries = new Map<string, Entry>();

  constructor(@Inject(CLOCK) private readonly clock: Clock) {}

  /** The kept answer for `key`, or `work()`'s (shared by everyone asking while it runs). */
  answer(
    key: string,
    work: () => Promise<{ shopId: string; starts: AvailableStart[] }>,
  ): Promise<AvailableStart[]> {
    return this.entry(key, work).starts;
  }

  /** The same as JSON text, serialized once per answer rather than once per request. */
  answerJson(
    key: string,
    work: () => Promise<{ shopId: string; starts: AvailableStart[] }>,
  ): Promise<string> {
    const e = this.entry(key, work);
    e.json ??= e.starts.then((s) => JSON.stringify(s));
    return e.json;
  }

  private entry(key: string, work: () => Promise<{ shopId: string; starts: AvailableStart[] }>): Entry {
    const now = performance.now();
    const clockNow = this.clock.now().getTime();
    const hit = this.entries.get(key);
    const fresh = (e: Entry): boolean =>
      now - e.at < AVAILABILITY_REUSE_MS &&
      clockNow >= e.clockAt &&
      clockNow - e.clockAt < AVAILABILITY_REUSE_MS;
    if (hit && fresh(hit)) return hit;
    if (this.entries.size >= AVAILABILITY_REUSE_MAX) this.entries.clear();
    const entry: Entry = { at: now, clockAt: clockNow, shopId: null, starts: Promise.resolve([]) };
    entry.starts = work().then(
      ({ shopId, starts }) => {
        entry.shopId = shopId;
        return starts;
      },
      (err: unknown) => {
        // a failure (no such shop, a bad range, the database away) is never kept
        if (this.entries.get(key) === entry) this.entries.delete(key);
        throw err;
      },
    );
    this.entries.set(key, entry);
    return entry;
  }

  /** Something that shapes the shop's free starts changed (pending answers go too). */
  forgetShop(shopId: string): void {
    for (const [key, e] of this.entries)
      if (e.shopId === shopId || e.shopId === null) this.entries.delete(key);
  }
}
