import assert from 'node:assert/strict';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { type Server, createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { after, before, describe, it } from 'node:test';
import Stripe from 'stripe';
import { type PaymentsFake, startPaymentsFake } from '../src/payments-fake';

/**
 * `stateFile`: a fake stopped and started again on the same file still knows its payments, refunds,
 * events and idempotency answers, spoken to by the real stripe SDK as the app speaks to it.
 */
const SECRET = 'sk_test_state_suite';
let dir: string;

function sdk(fake: PaymentsFake): Stripe {
  return new Stripe(SECRET, { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
}

function start(stateFile: string, webhookUrl: string | null = null): Promise<PaymentsFake> {
  return startPaymentsFake({ port: 0, secretKey: SECRET, stateFile, webhookUrl, webhookRetryBaseMs: 20 });
}

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

before(() => {
  dir = mkdtempSync(join(tmpdir(), 'payments-fake-state-'));
});
after(() => rmSync(dir, { recursive: true, force: true }));

void describe('state file', () => {
  void it('keeps intents, charges, refunds and idempotency answers across a restart', async () => {
    const file = join(dir, 'nested', 'payments-fake.json');
    const createParams = {
      amount: 4500,
      currency: 'eur',
      payment_method_types: ['card'],
      metadata: { appointmentId: 'apt-1' },
    } as Stripe.PaymentIntentCreateParams;

    let fake = await start(file);
    let stripe = sdk(fake);
    const pi = await stripe.paymentIntents.create(createParams, { idempotencyKey: 'booking-apt-1' });
    const paid = await stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' });
    assert.equal(paid.status, 'succeeded');
    const chargeId = paid.latest_charge as string;
    const firstRefund = await stripe.refunds.create(
      { payment_intent: pi.id, amount: 1500 },
      { idempotencyKey: 'refund-apt-1-a' },
    );
    const events = fake.store.events.map((e) => e.event.id);
    await fake.close();

    assert.ok(existsSync(file));
    assert.ok(!existsSync(`${file}.tmp`));
    assert.equal(statSync(file).mode & 0o777, 0o600);

    fake = await start(file);
    stripe = sdk(fake);
    try {
      const again = await stripe.paymentIntents.retrieve(pi.id, { expand: ['latest_charge'] });
      assert.equal(again.status, 'succeeded');
      assert.equal(again.amount_received, 4500);
      assert.equal(again.client_secret, pi.client_secret);
      assert.deepEqual(again.metadata, { appointmentId: 'apt-1' });
      const charge = again.latest_charge as Stripe.Charge;
      assert.equal(charge.id, chargeId);
      assert.equal(charge.amount_refunded, 1500);
      assert.equal(charge.refunded, false);
      assert.equal((await stripe.charges.retrieve(chargeId)).payment_method, paid.payment_method);
      assert.equal((await stripe.refunds.retrieve(firstRefund.id)).amount, 1500);
      assert.deepEqual(
        fake.store.events.map((e) => e.event.id),
        events,
      );

      // The rest can be refunded; a third refund finds nothing left.
      const rest = await stripe.refunds.create({ payment_intent: pi.id });
      assert.equal(rest.amount, 3000);
      assert.equal(rest.charge, chargeId);
      assert.equal((await stripe.charges.retrieve(chargeId)).refunded, true);
      const list = await stripe.refunds.list({ payment_intent: pi.id });
      assert.deepEqual(
        list.data.map((r) => r.id),
        [rest.id, firstRefund.id],
      );
      await assert.rejects(
        stripe.refunds.create({ payment_intent: pi.id }),
        (err: unknown) =>
          err instanceof Stripe.errors.StripeInvalidRequestError && err.code === 'charge_already_refunded',
      );

      // Requests made before the restart, repeated with their keys, get their first answers.
      const replayedIntent = await stripe.paymentIntents.create(createParams, {
        idempotencyKey: 'booking-apt-1',
      });
      assert.equal(replayedIntent.id, pi.id);
      assert.equal(replayedIntent.status, 'requires_payment_method');
      assert.equal(replayedIntent.lastResponse.headers['idempotent-replayed'], 'true');
      assert.equal(replayedIntent.lastResponse.requestId, pi.lastResponse.requestId);
      const replayedRefund = await stripe.refunds.create(
        { payment_intent: pi.id, amount: 1500 },
        { idempotencyKey: 'refund-apt-1-a' },
      );
      assert.equal(replayedRefund.id, firstRefund.id);
      assert.equal(replayedRefund.lastResponse.headers['idempotent-replayed'], 'true');
      assert.equal(fake.store.refunds.size, 2);
      await assert.rejects(
        stripe.refunds.create({ payment_intent: pi.id, amount: 1000 }, { idempotencyKey: 'refund-apt-1-a' }),
        Stripe.errors.StripeIdempotencyError,
      );
    } finally {
      await fake.close();
    }

    // What the second run did was saved too.
    fake = await start(file);
    try {
      assert.equal(fake.store.refunds.size, 2);
      assert.equal(fake.store.charges.get(chargeId)?.refunded, true);
    } finally {
      await fake.close();
    }
  });

  void it('saves a change soon after it is made, without waiting for close()', async () => {
    const file = join(dir, 'live.json');
    const fake = await start(file);
    try {
      const pi = await sdk(fake).paymentIntents.create({ amount: 700, currency: 'eur' });
      const saved = await waitFor(() => {
        if (!existsSync(file)) return undefined;
        const state = JSON.parse(readFileSync(file, 'utf8')) as { intents: { id: string }[] };
        return state.intents.some((i) => i.id === pi.id) && state;
      });
      assert.ok(saved);
    } finally {
      await fake.close();
    }
  });

  void it('delivers again after a restart the events the app had not taken', async () => {
    const file = join(dir, 'webhooks.json');
    const received: Stripe.Event[] = [];
    let status = 503;
    const receiver: Server = createServer((req, res) => {
      const chunks: Buffer[] = [];
      req.on('data', (c: Buffer) => chunks.push(c));
      req.on('end', () => {
        received.push(JSON.parse(Buffer.concat(chunks).toString('utf8')) as Stripe.Event);
        res.writeHead(status).end();
      });
    });
    await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
    const url = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/hook`;
    try {
      let fake = await start(file, url);
      const pi = await sdk(fake).paymentIntents.create({ amount: 900, currency: 'eur' });
      const created = (): boolean =>
        received.some(
          (e) => e.type === 'payment_intent.created' && (e.data.object as { id: string }).id === pi.id,
        );
      await waitFor(created);
      await fake.close();
      assert.equal(fake.store.events[0].state, 'pending');

      status = 200;
      received.length = 0;
      fake = await start(file, url);
      try {
        const stored = await waitFor(() => fake.store.events.find((e) => e.state === 'delivered'));
        assert.equal(stored.event.type, 'payment_intent.created');
        assert.ok(created());
        assert.ok(stored.deliveries.length >= 2, 'the attempts before the restart are kept');
        assert.equal(stored.deliveries.at(-1)?.status, 200);
      } finally {
        await fake.close();
      }
    } finally {
      await new Promise<void>((resolve) => receiver.close(() => resolve()));
    }
  });

  void it('refuses to start on a corrupt file, naming it, and leaves the file alone', async () => {
    const file = join(dir, 'corrupt.json');
    writeFileSync(file, '{"version":1,"intents":[');
    await assert.rejects(start(file), (err: unknown) => {
      assert.ok(err instanceof Error);
      assert.match(err.message, /corrupt/);
      assert.ok(err.message.includes(file), err.message);
      return true;
    });
    const wrongShape = join(dir, 'wrong-shape.json');
    writeFileSync(wrongShape, JSON.stringify({ version: 1, intents: {} }));
    await assert.rejects(start(wrongShape), /wrong-shape\.json is corrupt \("intents" is not a list\)/);
    assert.equal(readFileSync(file, 'utf8'), '{"version":1,"intents":[');
  });

  void it('starts empty when the file does not exist yet, and keeps memory only without one', async () => {
    const file = join(dir, 'missing.json');
    const fake = await start(file);
    assert.equal(fake.store.intents.size, 0);
    await fake.close();
    const memory = await startPaymentsFake({ port: 0, secretKey: SECRET });
    await sdk(memory).paymentIntents.create({ amount: 100, currency: 'eur' });
    await memory.close();
  });
});
