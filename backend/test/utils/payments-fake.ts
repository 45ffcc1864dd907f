import type Stripe from 'stripe';

export interface FakeState {
  webhooks: { url: string | null; paused: boolean };
  intents: Stripe.PaymentIntent[];
  refunds: Stripe.Refund[];
  events: { event: Stripe.Event; deliveries?: unknown[] }[];
}

/**
 * The payment fake that `npm test` started (PAYMENTS_URL): its JSON view and control routes. Its
 * webhooks go to the stack's app instance, which shares the test database with the app under
 * test, as a second instance of a cluster would.
 */
export class PaymentsFake {
  readonly url: string;

  constructor(url = process.env.PAYMENTS_URL) {
    if (!url) throw new Error('PAYMENTS_URL is not set (npm test sets it to the payment fake)');
    this.url = url.replace(/\/+$/, '');
  }

  get port(): number {
    return Number(new URL(this.url).port);
  }

  async state(): Promise<FakeState> {
    return (await (await fetch(`${this.url}/_fake/state`)).json()) as FakeState;
  }

  async control(path: 'webhooks/pause' | 'webhooks/resume'): Promise<void> {
    const r = await fetch(`${this.url}/_fake/${path}`, { method: 'POST' });
    if (!r.ok) throw new Error(`payments fake ${path}: ${r.status}`);
  }

  async redeliver(eventId: string): Promise<void> {
    const r = await fetch(`${this.url}/_fake/events/${eventId}/redeliver`, { method: 'POST' });
    if (!r.ok) throw new Error(`payments fake redeliver: ${r.status}`);
  }

  /** What a rider does on the fake's authentication page. */
  async authenticate(intent: Stripe.PaymentIntent, outcome: 'complete' | 'fail'): Promise<void> {
    const r = await fetch(`${this.url}/authenticate/${intent.id}`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ client_secret: intent.client_secret ?? '', outcome }).toString(),
    });
    if (!r.ok) throw new Error(`payments fake authenticate: ${r.status}`);
  }
}
