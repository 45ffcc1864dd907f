import assert from 'node:assert/strict';
import { type Server, createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, beforeEach, describe, it } from 'node:test';
import Stripe from 'stripe';
import { type PaymentsFake, startPaymentsFake } from '../src/payments-fake';
import type { StoredEvent } from '../src/store';

/**
 * The webhook side: a tiny receiver stands in for the app's `/api/payments/webhook`; it answers with
 * whatever status the test queues (200 once the queue is empty) and keeps every delivery.
 */
const WEBHOOK_SECRET = 'whsec_fake_suite';

interface Received {
  body: string;
  signature: string;
  event: Stripe.Event;
}

let receiver: Server;
let receiverUrl: string;
const received: Received[] = [];
const answers: number[] = [];
let fake: PaymentsFake;
let stripe: Stripe;

function waitFor<T>(check: () => T | undefined | false, ms = 5000): Promise<T> {
  const until = Date.now() + ms;
  return new Promise((resolve, reject) => {
    const tick = (): void => {
      const value = check();
      if (value) resolve(value);
      else if (Date.now() > until) reject(new Error('timed out waiting'));
      else setTimeout(tick, 10);
    };
    tick();
  });
}

function deliveredOf(type: string, objectId: string): Received[] {
  return received.filter(
    (r) => r.event.type === type && (r.event.data.object as { id: string }).id === objectId,
  );
}

function storedOf(type: string, objectId: string): StoredEvent | undefined {
  return fake.store.events.find(
    (e) => e.event.type === type && (e.event.data.object as { id: string }).id === objectId,
  );
}

before(async () => {
  receiver = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      received.push({
        body,
        signature: String(req.headers['stripe-signature']),
        event: JSON.parse(body) as Stripe.Event,
      });
      res.writeHead(answers.shift() ?? 200).end();
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
  receiverUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/api/payments/webhook`;
  fake = await startPaymentsFake({
    port: 0,
    webhookUrl: receiverUrl,
    webhookSecret: WEBHOOK_SECRET,
    webhookRetryBaseMs: 20,
    webhookMaxAttempts: 4,
  });
  stripe = new Stripe('sk_test_loamline_local', { host: '127.0.0.1', port: fake.port, protocol: 'http' });
});

after(async () => {
  await fake.close();
  await new Promise<void>((resolve) => receiver.close(() => resolve()));
});

beforeEach(() => {
  answers.length = 0;
});

void describe('webhooks', () => {
  void it('posts signed events the SDK accepts with the secret and rejects with another one', async () => {
    const pi = await stripe.paymentIntents.create({
      amount: 3000,
      currency: 'eur',
      metadata: { appointmentId: 'a1' },
    });
    await stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' });
    const got = await waitFor(() => deliveredOf('payment_intent.succeeded', pi.id)[0]);
    const event = stripe.webhooks.constructEvent(got.body, got.signature, WEBHOOK_SECRET);
    assert.equal(event.type, 'payment_intent.succeeded');
    assert.match(event.id, /^evt_/);
    assert.equal(event.object, 'event');
    assert.equal(event.livemode, false);
    assert.equal(event.pending_webhooks, 1);
    assert.ok(event.api_version);
    assert.match(String(event.request?.idempotency_key), /^stripe-node-retry-/);
    const object = event.data.object;
    assert.equal(object.id, pi.id);
    assert.equal(object.status, 'succeeded');
    assert.deepEqual(object.metadata, { appointmentId: 'a1' });
    assert.throws(
      () => stripe.webhooks.constructEvent(got.body, got.signature, 'whsec_other'),
      Stripe.errors.StripeSignatureVerificationError,
    );
    assert.throws(
      () => stripe.webhooks.constructEvent(got.body.replace('3000', '3001'), got.signature, WEBHOOK_SECRET),
      Stripe.errors.StripeSignatureVerificationError,
    );
    // Every event of the payment, in the order it was made.
    await waitFor(() => deliveredOf('charge.succeeded', object.latest_charge as string).length > 0);
    const order = received
      .filter((r) => [pi.id, object.latest_charge].includes((r.event.data.object as { id: string }).id))
      .map((r) => r.event.type);
    assert.deepEqual(order, ['payment_intent.created', 'charge.succeeded', 'payment_intent.succeeded']);
  });

  void it('retries after a 500 with back-off, signing each attempt afresh, until a 2xx', async () => {
    answers.push(500);
    const pi = await stripe.paymentIntents.create({ amount: 1000, currency: 'eur' });
    await waitFor(() => storedOf('payment_intent.created', pi.id)?.state === 'delivered');
    const stored = storedOf('payment_intent.created', pi.id);
    assert.deepEqual(
      stored?.deliveries.map((d) => d.status),
      [500, 200],
    );
    const copies = deliveredOf('payment_intent.created', pi.id);
    assert.equal(copies.length, 2);
    assert.equal(copies[0].event.id, copies[1].event.id);
    for (const c of copies) assert.ok(stripe.webhooks.constructEvent(c.body, c.signature, WEBHOOK_SECRET));
    const gap = Date.parse(stored?.deliveries[1].at ?? '') - Date.parse(stored?.deliveries[0].at ?? '');
    assert.ok(gap >= 15, `retried after ${gap} ms`);
  });

  void it('gives up after the last attempt', async () => {
    answers.push(500, 502, 503, 500);
    const pi = await stripe.paymentIntents.create({ amount: 1100, currency: 'eur' });
    const stored = await waitFor(() => {
      const s = storedOf('payment_intent.created', pi.id);
      return s?.state === 'failed' ? s : undefined;
    });
    assert.equal(stored.deliveries.length, 4);
  });

  void it('redelivers an event on request, with the same id', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 1200, currency: 'eur' });
    const stored = await waitFor(() => {
      const s = storedOf('payment_intent.created', pi.id);
      return s?.state === 'delivered' ? s : undefined;
    });
    const res = await fetch(`${fake.url}/_fake/events/${stored.event.id}/redeliver`, { method: 'POST' });
    assert.equal(res.status, 200);
    const body = (await res.json()) as { event: string; delivery: { status: number; manual: boolean } };
    assert.equal(body.event, stored.event.id);
    assert.equal(body.delivery.status, 200);
    assert.equal(body.delivery.manual, true);
    const copies = deliveredOf('payment_intent.created', pi.id);
    assert.equal(copies.length, 2);
    assert.equal(copies[1].event.id, copies[0].event.id);
    assert.ok(stripe.webhooks.constructEvent(copies[1].body, copies[1].signature, WEBHOOK_SECRET));
  });

  void it('holds deliveries while paused and sends them, in order, on resume', async () => {
    assert.equal((await fetch(`${fake.url}/_fake/webhooks/pause`, { method: 'POST' })).status, 200);
    const pi = await stripe.paymentIntents.create({ amount: 1300, currency: 'eur' });
    await stripe.paymentIntents.cancel(pi.id);
    await new Promise((r) => setTimeout(r, 100));
    assert.equal(deliveredOf('payment_intent.created', pi.id).length, 0);
    const state = (await (await fetch(`${fake.url}/_fake/state`)).json()) as {
      webhooks: { paused: boolean };
      events: StoredEvent[];
    };
    assert.equal(state.webhooks.paused, true);
    assert.equal(
      state.events.find((e) => (e.event.data.object as { id: string }).id === pi.id)?.state,
      'pending',
    );
    await fetch(`${fake.url}/_fake/webhooks/resume`, { method: 'POST' });
    await waitFor(() => deliveredOf('payment_intent.canceled', pi.id).length > 0);
    const order = received
      .filter((r) => (r.event.data.object as { id: string }).id === pi.id)
      .map((r) => r.event.type);
    assert.deepEqual(order, ['payment_intent.created', 'payment_intent.canceled']);
  });

  void it('makes refund.created and charge.refunded for a refund', async () => {
    const pi = await stripe.paymentIntents.create({
      amount: 2500,
      currency: 'eur',
      confirm: true,
      payment_method: 'pm_card_visa',
    });
    const refund = await stripe.refunds.create({ payment_intent: pi.id, amount: 500 });
    const created = await waitFor(() => deliveredOf('refund.created', refund.id)[0]);
    assert.equal((created.event.data.object as Stripe.Refund).amount, 500);
    const charged = await waitFor(() => deliveredOf('charge.refunded', refund.charge as string)[0]);
    assert.equal((charged.event.data.object as Stripe.Charge).amount_refunded, 500);
  });

  void it('only stores events when no webhook URL is configured', async () => {
    const quiet = await startPaymentsFake({ port: 0 });
    try {
      const client = new Stripe('sk_test_loamline_local', {
        host: '127.0.0.1',
        port: quiet.port,
        protocol: 'http',
      });
      await client.paymentIntents.create({ amount: 100, currency: 'eur' });
      assert.equal(quiet.store.events.length, 1);
      assert.equal(quiet.store.events[0].state, 'stored');
      assert.equal(quiet.store.events[0].event.pending_webhooks, 0);
      const reset = await fetch(`${quiet.url}/_fake/reset`, { method: 'POST' });
      assert.equal(reset.status, 200);
      assert.equal(quiet.store.intents.size, 0);
      assert.equal(quiet.store.events.length, 0);
    } finally {
      await quiet.close();
    }
  });
});
