import { Inject, Injectable, Logger } from '@nestjs/common';
import type { AvailableStart } from '@loamline/shared-types';
import { CLOCK, type Clock } from '../common/clock/clock';

/**
 * How long one instance answers a calendar's free starts from what it worked out last: the hard
 * expiry, counted from when that computation began.
 */
export const AVAILABILITY_REUSE_MS = 1000;
/**
 * From this age of the kept answer on (80 % of AVAILABILITY_REUSE_MS), the next request starts one
 * refresh in the background and is still answered from the kept answer.
 */
export const AVAILABILITY_REFRESH_MS = 800;
/** Questions kept at most (a month of one service of one shop each); past it the lot is dropped. */
const AVAILABILITY_REUSE_MAX = 2000;

type Work = () => Promise<{ shopId: string; starts: AvailableStart[] }>;

/** One computation of one question's answer. */
interface Answer {
  /** performance.now() when it began */
  at: number;
  /** the injected clock then (tests move it: an answer is not reused across a move) */
  clockAt: number;
  /** known once the answer is worked out; a change to any shop drops questions still pending */
  shopId: string | null;
  starts: Promise<AvailableStart[]>;
  /** the answer's JSON, made once for everyone who gets it */
  json?: Promise<string>;
}

/** What is kept for one question (a key). */
interface Slot {
  /** the answer served: worked out, or still being worked out with its first requests waiting */
  current: Answer;
  /** the refresh under way, at most one; it replaces `current` when it succeeds */
  next: Answer | null;
}

/**
 * The free starts a shop's booking calendar shows, kept for AVAILABILITY_REUSE_MS per instance
 * (a "micro-cache": many riders opening the same shop's month at once cost about one computation a
 * second instead of one each; requests that arrive while it is worked out share it).
 *
 * Refresh ahead: once the kept answer is AVAILABILITY_REFRESH_MS old, the next request starts one
 * computation in the background (single-flight: one per question at a time) and it, and every request
 * after it, is answered from the kept answer until the new one is in, which then replaces it. Only
 * when no refresh finished in time — the answer is AVAILABILITY_REUSE_MS old (the hard expiry) —
 * do requests wait: on the refresh under way if it began less than AVAILABILITY_REUSE_MS ago, else on
 * a computation of their own (shared as above). Under steady load nobody waits for a recomputation;
 * the first request after a quiet spell does, as before.
 *
 * Staleness, the same bound as without refresh-ahead: a request is only ever answered by a computation
 * that began less than AVAILABILITY_REUSE_MS before the request arrived (the answer's age is counted
 * from the start of its computation, on the monotonic clock and on the injected one; the clock moved
 * back counts as expired). A refresh only shortens how old the answers are. (The shop's hours and
 * closures inside a computation come from ShopSettingsService's own one-second calendar, as before.)
 *
 * Dropped on this instance at once when anything that shapes the answer changes here: a booking,
 * move, cancellation, decline or expiry at the shop (AppointmentsService's listener), its settings
 * (hours, closures, benches, rules: ShopSettingsService.put) or its services. Dropping a question
 * drops its refresh under way with it: a refresh installs its answer only into the very slot it was
 * started for (the slot object is the generation), so an answer that began before a change never
 * comes back after it; requests that had already joined a computation before the change still get
 * its answer, as before. A change made through another instance is seen within AVAILABILITY_REUSE_MS.
 * Nothing is booked from it: booking, moving and proposing read everything afresh, and a time taken
 * meanwhile answers 409 "no longer free".
 *
 * Failures are never kept. A first computation that fails fails its waiters and leaves nothing
 * behind. A refresh that fails is logged and forgotten; the kept answer is served on until its hard
 * expiry and the next request past the refresh point tries again (requests already waiting on that
 * refresh past the hard expiry get its error).
 *
 * Memory: at most AVAILABILITY_REUSE_MAX questions, each with one answer and at most one refresh under
 * way; past the limit the lot is dropped (refreshes under way then find their slot gone and are discarded).
 */
@Injectable()
export class AvailabilityCache {
  private readonly slots = new Map<string, Slot>();
  private readonly logger = new Logger(AvailabilityCache.name);

  constructor(@Inject(CLOCK) private readonly clock: Clock) {}

  /** The kept answer for `key`, or `work()`'s (shared by everyone asking while it runs). */
  answer(key: string, work: Work): Promise<AvailableStart[]> {
    return this.entry(key, work).starts;
  }

  /** The same as JSON text, serialized once per answer rather than once per request. */
  answerJson(key: string, work: Work): Promise<string> {
    const e = this.entry(key, work);
    e.json ??= e.starts.then((s) => JSON.stringify(s));
    return e.json;
  }

  /** Something that shapes the shop's free starts changed (pending answers and refreshes go too). */
  forgetShop(shopId: string): void {
    for (const [key, slot] of this.slots)
      if (slot.current.shopId === shopId || slot.current.shopId === null) this.slots.delete(key);
  }

  private entry(key: string, work: Work): Answer {
    const now = performance.now();
    const clockNow = this.clock.now().getTime();
    const slot = this.slots.get(key);
    if (slot) {
      const age = ageOf(slot.current, now, clockNow);
      if (age < AVAILABILITY_REUSE_MS) {
        // a worked-out answer (shopId known) past the refresh point, and no refresh under way
        if (age >= AVAILABILITY_REFRESH_MS && slot.current.shopId !== null && !slot.next)
          this.refresh(key, slot, work, now, clockNow);
        return slot.current;
      }
      // past the hard expiry: wait for the refresh under way, if it is young enough to be served
      if (slot.next && ageOf(slot.next, now, clockNow) < AVAILABILITY_REUSE_MS) return slot.next;
    } else if (this.slots.size >= AVAILABILITY_REUSE_MAX) this.slots.clear();
    const answer = newAnswer(now, clockNow);
    const fresh: Slot = { current: answer, next: null };
    answer.starts = work().then(
      ({ shopId, starts }) => {
        answer.shopId = shopId;
        return starts;
      },
      (err: unknown) => {
        // a failure (no such shop, a bad range, the database away) is never kept
        if (this.slots.get(key) === fresh) this.slots.delete(key);
        throw err;
      },
    );
    this.slots.set(key, fresh);
    return answer;
  }

  /** Starts the one background refresh of `slot`; its answer goes in only if the slot is still kept. */
  private refresh(key: string, slot: Slot, work: Work, now: number, clockNow: number): void {
    const next = newAnswer(now, clockNow);
    next.starts = work().then(
      ({ shopId, starts }) => {
        next.shopId = shopId;
        if (this.slots.get(key) === slot && slot.next === next) {
          // serialized here, off the requests' path, when this question is asked for as JSON
          if (slot.current.json) next.json ??= Promise.resolve(JSON.stringify(starts));
          slot.current = next;
          slot.next = null;
        }
        return starts;
      },
      (err: unknown) => {
        if (slot.next === next) slot.next = null;
        this.logger.warn(
          `refreshing availability ${key} failed, the kept answer stays until it expires: ${errorText(err)}`,
        );
        throw err;
      },
    );
    // nobody need be waiting on a refresh: its failure is logged above, not left unhandled
    next.starts.catch(() => undefined);
    slot.next = next;
  }
}

function newAnswer(now: number, clockNow: number): Answer {
  return { at: now, clockAt: clockNow, shopId: null, starts: Promise.resolve([]) };
}

/** How old an answer is: the larger of the monotonic and the injected clock's reading; moved back, expired. */
function ageOf(a: Answer, now: number, clockNow: number): number {
  if (clockNow < a.clockAt) return Infinity;
  return Math.max(now - a.at, clockNow - a.clockAt);
}

function errorText(err: unknown): string {
  return err instanceof Error ? (err.stack ?? err.message) : String(err);
}
