import { createHmac } from 'node:crypto';
import type { Delivery, PaymentStore, StoredEvent } from './store';

/**
 * Posts events to the app's webhook URL the way the hosted service does: JSON bodies, a fresh
 * `Stripe-Signature: t=<unix s>,v1=<hex HMAC-SHA256(secret, "<t>.<body>")>` on every attempt, and
 * retries with exponential back-off until the app answers 2xx. One delivery at a time, oldest due
 * event first, so the events of one payment arrive in the order they were made unless a failure
 * (or a pause) holds one back.
 */
export interface WebhookOptions {
  url: string | null;
  secret: string;
  /** First retry after this many ms; each next one doubles, up to `capMs`. */
  retryBaseMs: number;
  capMs?: number;
  /** Attempts before an event is given up (`failed`). */
  maxAttempts?: number;
  /** Per-attempt timeout. */
  timeoutMs?: number;
  /** Called after each attempt has been recorded (the state file saves it). */
  onChange?: () => void;
}

export function signPayload(payload: string, secret: string, timestamp: number): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

export class WebhookSender {
  private paused = false;
  private running = false;
  private timer: NodeJS.Timeout | null = null;
  private closed = false;
  private readonly capMs: number;
  private readonly maxAttempts: number;
  private readonly timeoutMs: number;
  private readonly inFlight = new Set<AbortController>();

  constructor(
    private readonly store: PaymentStore,
    private readonly options: WebhookOptions,
  ) {
    this.capMs = options.capMs ?? 60_000;
    this.maxAttempts = options.maxAttempts ?? 20;
    this.timeoutMs = options.timeoutMs ?? 10_000;
  }

  get configured(): boolean {
    return this.options.url !== null && this.options.url !== '';
  }

  get isPaused(): boolean {
    return this.paused;
  }

  pause(): void {
    this.paused = true;
  }

  resume(): void {
    this.paused = false;
    this.kick();
  }

  /** Wakes the queue (a new event, a resume). */
  kick(): void {
    if (this.closed || this.paused || this.running || !this.configured) return;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    void this.pump();
  }

  close(): void {
    this.closed = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    for (const c of this.inFlight) c.abort();
  }

  /** After a reset: nothing is due any more. */
  clearTimer(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
  }

  private due(): StoredEvent | undefined {
    const now = Date.now();
    return this.store.events.find(
      (e) => e.state === 'pending' && e.nextAttemptAt !== null && e.nextAttemptAt <= now,
    );
  }

  private async pump(): Promise<void> {
    this.running = true;
    try {
      for (let next = this.due(); next && !this.paused && !this.closed; next = this.due()) {
        await this.attempt(next, false);
      }
    } finally {
      this.running = false;
    }
    this.schedule();
  }

  private schedule(): void {
    if (this.closed || this.paused) return;
    const times = this.store.events
      .filter((e) => e.state === 'pending' && e.nextAttemptAt !== null)
      .map((e) => e.nextAttemptAt as number);
    if (times.length === 0) return;
    const wait = Math.max(0, Math.min(...times) - Date.now());
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      this.kick();
    }, wait);
    this.timer.unref();
  }

  /** Sends one event once more, now, whatever its state (`/_fake/events/:id/redeliver`). */
  async redeliver(stored: StoredEvent): Promise<Delivery> {
    return this.attempt(stored, true);
  }

  private async attempt(stored: StoredEvent, manual: boolean): Promise<Delivery> {
    const started = Date.now();
    const delivery: Delivery = {
      attempt: stored.deliveries.length + 1,
      at: new Date(started).toISOString(),
      status: null,
      ms: 0,
      manual,
    };
    if (!this.configured) {
      delivery.error = 'no webhook URL configured';
      stored.deliveries.push(delivery);
      this.options.onChange?.();
      return delivery;
    }
    const payload = JSON.stringify(stored.event, null, 2);
    const controller = new AbortController();
    this.inFlight.add(controller);
    const timeout = setTimeout(() => controller.abort(), this.timeoutMs);
    try {
      const res = await fetch(this.options.url as string, {
        method: 'POST',
        headers: {
          'content-type': 'application/json; charset=utf-8',
          'user-agent': 'loamline-payments-fake/0.1',
          'stripe-signature': signPayload(payload, this.options.secret, Math.floor(Date.now() / 1000)),
        },
        body: payload,
        signal: controller.signal,
      });
      delivery.status = res.status;
      await res.arrayBuffer().catch(() => undefined);
    } catch (err) {
      delivery.error =
        err instanceof Error ? (err.cause instanceof Error ? err.cause.message : err.message) : String(err);
    } finally {
      clearTimeout(timeout);
      this.inFlight.delete(controller);
    }
    delivery.ms = Date.now() - started;
    stored.deliveries.push(delivery);
    const ok = delivery.status !== null && delivery.status >= 200 && delivery.status < 300;
    if (ok) {
      stored.state = 'delivered';
      stored.nextAttemptAt = null;
    } else if (!manual && stored.state === 'pending') {
      const automatic = stored.deliveries.filter((d) => !d.manual).length;
      if (automatic >= this.maxAttempts) {
        stored.state = 'failed';
        stored.nextAttemptAt = null;
      } else {
        const wait = Math.min(this.options.retryBaseMs * 2 ** (automatic - 1), this.capMs);
        stored.nextAttemptAt = Date.now() + wait;
      }
    }
    this.options.onChange?.();
    return delivery;
  }
}
