import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import type Stripe from 'stripe';
import { freePort } from './mail-fake-process';

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

/**
 * A payment fake of the test's own (fakes/payments) as a process on a fixed port, with its state
 * in a file, so a test can stop it and start it again on the same port with the same intents, as
 * the hosted service going away and coming back. Webhooks go nowhere (events are only stored).
 */
export class PaymentsFakeProcess {
  private child: ChildProcess | null = null;

  constructor(
    readonly port: number,
    readonly stateFile: string,
  ) {}

  static async onFreePort(): Promise<PaymentsFakeProcess> {
    const dir = mkdtempSync(join(tmpdir(), 'lm-payments-'));
    return new PaymentsFakeProcess(await freePort(), join(dir, 'state.json'));
  }

  get fake(): PaymentsFake {
    return new PaymentsFake(`http://127.0.0.1:${this.port}`);
  }

  /** Starts the fake (a running one is left as it is) and waits for its health route. */
  async start(): Promise<void> {
    if (this.child && this.child.exitCode === null) return;
    const child = spawn(process.execPath, ['--import', 'tsx', 'fakes/payments/src/main.ts'], {
      cwd: join(__dirname, '..', '..', '..'),
      env: {
        ...process.env,
        PORT: String(this.port),
        PAYMENTS_URL: `http://127.0.0.1:${this.port}`,
        PAYMENTS_WEBHOOK_URL: '',
        PAYMENTS_STATE_FILE: this.stateFile,
      },
      stdio: 'ignore',
    });
    this.child = child;
    const until = Date.now() + 20_000;
    for (;;) {
      try {
        if ((await fetch(`http://127.0.0.1:${this.port}/health`)).ok) return;
      } catch {
        /* not up yet */
      }
      if (child.exitCode !== null) throw new Error('the payments fake exited');
      if (Date.now() > until) throw new Error('the payments fake did not start');
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  async stop(): Promise<void> {
    const child = this.child;
    this.child = null;
    if (!child || child.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    });
  }

  async destroy(): Promise<void> {
    await this.stop();
    rmSync(dirname(this.stateFile), { recursive: true, force: true });
  }
}
