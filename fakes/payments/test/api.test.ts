import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import Stripe from 'stripe';
import { parseForm } from '../src/form';
import { type PaymentsFake, startPaymentsFake } from '../src/payments-fake';

/** The fake in-process on a free port, spoken to by the real stripe SDK as the app speaks to it. */
let fake: PaymentsFake;
let stripe: Stripe;

const SECRET = 'sk_test_fake_suite';
const PUBLISHABLE = 'pk_test_fake_suite';

function sdk(key = SECRET, extra: Partial<Stripe.StripeConfig> = {}): Stripe {
  return new Stripe(key, {
    host: '127.0.0.1',
    port: fake.port,
    protocol: 'http',
    maxNetworkRetries: 0,
    ...extra,
  });
}

async function intent(amount = 4500): Promise<Stripe.PaymentIntent> {
  // The SDK's types for this API version leave payment_method_types out; the wire still takes it.
  return stripe.paymentIntents.create({
    amount,
    currency: 'eur',
    payment_method_types: ['card'],
    metadata: { appointmentId: 'apt-1' },
  } as Stripe.PaymentIntentCreateParams);
}

async function rejects<T extends Error>(
  promise: Promise<unknown>,
  type: new (...args: never[]) => T,
): Promise<T> {
  try {
    await promise;
  } catch (err) {
    assert.ok(err instanceof type, `expected ${type.name}, got ${String(err)}`);
    return err;
  }
  assert.fail(`expected ${type.name}, but it resolved`);
}

before(async () => {
  fake = await startPaymentsFake({ port: 0, secretKey: SECRET, publishableKey: PUBLISHABLE });
  stripe = sdk();
});
after(() => fake.close());

void describe('form parameters', () => {
  void it('reads bracket nesting, indexed and appended arrays, and keeps leaves as strings', () => {
    const params = parseForm(
      'amount=4500&metadata[appointmentId]=42&expand[0]=latest_charge&expand[1]=payment_method&types[]=a&types[]=b' +
        '&payment_method_data[card][number]=4242%204242&description=Fork+service',
    );
    assert.deepEqual(params, {
      amount: '4500',
      metadata: { appointmentId: '42' },
      expand: ['latest_charge', 'payment_method'],
      types: ['a', 'b'],
      payment_method_data: { card: { number: '4242 4242' } },
      description: 'Fork service',
    });
    assert.throws(() => parseForm('__proto__[x]=1'));
    assert.throws(() => parseForm('a=1&a[b]=2'));
  });
});

void describe('payment intents', () => {
  void it('creates one in requires_payment_method with a client secret, and retrieves it', async () => {
    const pi = await stripe.paymentIntents.create({
      amount: 12_050,
      currency: 'eur',
      description: 'Fork service',
      metadata: { appointmentId: 'apt-7', shop: 'demo' },
      automatic_payment_methods: { enabled: true },
    });
    assert.match(pi.id, /^pi_/);
    assert.equal(pi.object, 'payment_intent');
    assert.equal(pi.status, 'requires_payment_method');
    assert.equal(pi.client_secret?.startsWith(`${pi.id}_secret_`), true);
    assert.equal(pi.amount_received, 0);
    assert.equal(pi.latest_charge, null);
    assert.equal(pi.last_payment_error, null);
    assert.equal(pi.next_action, null);
    assert.equal(pi.livemode, false);
    assert.deepEqual(pi.metadata, { appointmentId: 'apt-7', shop: 'demo' });
    assert.equal(pi.automatic_payment_methods?.enabled, true);
    assert.ok(Math.abs(pi.created - Date.now() / 1000) < 5);
    assert.match(pi.lastResponse.requestId, /^req_/);
    const again = await stripe.paymentIntents.retrieve(pi.id);
    assert.equal(again.id, pi.id);
    assert.equal(again.description, 'Fork service');
  });

  void it('refuses a bad amount, a bad currency and unknown parameters, as the SDK error classes', async () => {
    const zero = await rejects(
      stripe.paymentIntents.create({ amount: 0, currency: 'eur' }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(zero.param, 'amount');
    await rejects(
      stripe.paymentIntents.create({ amount: 10.5, currency: 'eur' }),
      Stripe.errors.StripeInvalidRequestError,
    );
    const cur = await rejects(
      stripe.paymentIntents.create({ amount: 100, currency: 'EURO' }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(cur.param, 'currency');
    const unknown = await rejects(
      stripe.paymentIntents.create({
        amount: 100,
        currency: 'eur',
        colour: 'red',
      } as Stripe.PaymentIntentCreateParams),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(unknown.code, 'parameter_unknown');
    const missing = await rejects(
      stripe.paymentIntents.retrieve('pi_nope'),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(missing.statusCode, 404);
    assert.equal(missing.code, 'resource_missing');
  });

  void it('answers 401 to a wrong or missing key', async () => {
    const wrong = await rejects(
      sdk('sk_test_wrong').paymentIntents.create({ amount: 100, currency: 'eur' }),
      Stripe.errors.StripeAuthenticationError,
    );
    assert.equal(wrong.statusCode, 401);
    assert.equal(wrong.type, 'StripeAuthenticationError');
    const res = await fetch(`${fake.url}/v1/payment_intents`, { method: 'POST' });
    assert.equal(res.status, 401);
    const body = (await res.json()) as { error: { type: string; message: string } };
    assert.equal(body.error.type, 'invalid_request_error');
    assert.match(body.error.message, /did not provide an API key/);
    // The publishable key reaches an intent only with its client secret, and never creates one.
    await rejects(
      sdk(PUBLISHABLE).paymentIntents.create({ amount: 100, currency: 'eur' }),
      Stripe.errors.StripeAuthenticationError,
    );
  });

  void it('confirms with pm_card_visa: succeeded, a charge as latest_charge (expandable), events in order', async () => {
    const pi = await intent();
    const paid = await stripe.paymentIntents.confirm(pi.id, {
      payment_method: 'pm_card_visa',
      expand: ['latest_charge'],
    });
    assert.equal(paid.status, 'succeeded');
    assert.equal(paid.amount_received, 4500);
    assert.match(paid.payment_method as string, /^pm_/);
    const charge = paid.latest_charge as Stripe.Charge;
    assert.match(charge.id, /^ch_/);
    assert.equal(charge.paid, true);
    assert.equal(charge.payment_method_details?.card?.brand, 'visa');
    assert.equal(charge.payment_method_details?.card?.last4, '4242');
    const plain = await stripe.paymentIntents.retrieve(pi.id);
    assert.equal(plain.latest_charge, charge.id);
    const types = fake.store.events
      .filter(
        (e) =>
          (e.event.data.object as { id: string; payment_intent?: string }).id === pi.id ||
          (e.event.data.object as { payment_intent?: string }).payment_intent === pi.id,
      )
      .map((e) => e.event.type);
    assert.deepEqual(types, ['payment_intent.created', 'charge.succeeded', 'payment_intent.succeeded']);
    const again = await rejects(
      stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(again.code, 'payment_intent_unexpected_state');
    const cancel = await rejects(
      stripe.paymentIntents.cancel(pi.id),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(cancel.code, 'payment_intent_unexpected_state');
  });

  for (const [token, declineCode, message] of [
    ['pm_card_chargeDeclined', 'generic_decline', 'Your card was declined.'],
    ['pm_card_chargeDeclinedInsufficientFunds', 'insufficient_funds', 'Your card has insufficient funds.'],
  ] as const) {
    void it(`declines ${token} with 402 card_error ${declineCode}, leaving the intent payable`, async () => {
      const pi = await intent();
      const err = await rejects(
        stripe.paymentIntents.confirm(pi.id, { payment_method: token }),
        Stripe.errors.StripeCardError,
      );
      assert.equal(err.statusCode, 402);
      assert.equal(err.code, 'card_declined');
      assert.equal(err.decline_code, declineCode);
      assert.equal(err.message, message);
      assert.equal(err.payment_intent?.id, pi.id);
      assert.equal(err.payment_intent?.status, 'requires_payment_method');
      const after = await stripe.paymentIntents.retrieve(pi.id);
      assert.equal(after.status, 'requires_payment_method');
      assert.equal(after.last_payment_error?.decline_code, declineCode);
      assert.equal(after.last_payment_error?.type, 'card_error');
      // Another card then pays it.
      const paid = await stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' });
      assert.equal(paid.status, 'succeeded');
      assert.equal(paid.last_payment_error, null);
    });
  }

  void it('asks pm_card_authenticationRequired to authenticate (redirect_to_url), then completes or fails it', async () => {
    const pi = await intent();
    const pending = await stripe.paymentIntents.confirm(pi.id, {
      payment_method: 'pm_card_authenticationRequired',
      return_url: 'http://127.0.0.1:23999/back',
    });
    assert.equal(pending.status, 'requires_action');
    assert.equal(pending.next_action?.type, 'redirect_to_url');
    const url = pending.next_action?.redirect_to_url?.url ?? '';
    assert.ok(url.startsWith(`${fake.url}/authenticate/${pi.id}?client_secret=`), url);
    assert.equal(pending.next_action?.redirect_to_url?.return_url, 'http://127.0.0.1:23999/back');
    const page = await fetch(url);
    assert.equal(page.status, 200);
    const html = await page.text();
    assert.match(html, /Test authentication/);
    assert.match(html, /Complete authentication/);
    assert.match(html, /Fail authentication/);
    const done = await fetch(`${fake.url}/authenticate/${pi.id}`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ client_secret: pi.client_secret ?? '', outcome: 'complete' }),
    });
    assert.equal(done.status, 200);
    assert.match(await done.text(), /redirect_status=succeeded/);
    assert.equal((await stripe.paymentIntents.retrieve(pi.id)).status, 'succeeded');

    const other = await intent();
    await stripe.paymentIntents.confirm(other.id, { payment_method: 'pm_card_authenticationRequired' });
    const failed = await fetch(`${fake.url}/authenticate/${other.id}`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ client_secret: other.client_secret ?? '', outcome: 'fail' }),
    });
    assert.equal(failed.status, 200);
    const after = await stripe.paymentIntents.retrieve(other.id);
    assert.equal(after.status, 'requires_payment_method');
    assert.equal(after.last_payment_error?.code, 'payment_intent_authentication_failure');
    const types = fake.store.events
      .filter((e) => (e.event.data.object as { id: string }).id === other.id)
      .map((e) => e.event.type);
    assert.deepEqual(types, [
      'payment_intent.created',
      'payment_intent.requires_action',
      'payment_intent.payment_failed',
    ]);
  });

  void it('confirms on creation (confirm=true) and refuses an unknown payment method', async () => {
    const pi = await stripe.paymentIntents.create({
      amount: 900,
      currency: 'gbp',
      confirm: true,
      payment_method: 'pm_card_visa',
    });
    assert.equal(pi.status, 'succeeded');
    const waiting = await stripe.paymentIntents.create({
      amount: 700,
      currency: 'eur',
      payment_method: 'pm_card_visa',
    });
    assert.equal(waiting.status, 'requires_confirmation');
    assert.equal((await stripe.paymentIntents.confirm(waiting.id)).status, 'succeeded');
    const count = fake.store.intents.size;
    const unknownAtCreate = await rejects(
      stripe.paymentIntents.create({
        amount: 700,
        currency: 'eur',
        payment_method: 'pm_nope',
        confirm: true,
      }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(unknownAtCreate.code, 'resource_missing');
    assert.equal(fake.store.intents.size, count);
    const other = await intent();
    const err = await rejects(
      stripe.paymentIntents.confirm(other.id, { payment_method: 'pm_nope' }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(err.code, 'resource_missing');
  });

  void it('cancels an unpaid intent, then refuses to confirm it', async () => {
    const pi = await intent();
    const canceled = await stripe.paymentIntents.cancel(pi.id, {
      cancellation_reason: 'requested_by_customer',
    });
    assert.equal(canceled.status, 'canceled');
    assert.equal(canceled.cancellation_reason, 'requested_by_customer');
    assert.ok(canceled.canceled_at);
    const err = await rejects(
      stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(err.code, 'payment_intent_unexpected_state');
  });

  void it('lets the browser path confirm with the publishable key, the client secret and raw card data', async () => {
    const pi = await intent();
    const browser = sdk(PUBLISHABLE);
    const seen = await browser.paymentIntents.retrieve(pi.id, {
      client_secret: pi.client_secret ?? '',
    });
    assert.equal(seen.id, pi.id);
    await rejects(browser.paymentIntents.retrieve(pi.id), Stripe.errors.StripeInvalidRequestError);
    await rejects(
      browser.paymentIntents.retrieve(pi.id, {
        client_secret: `${pi.id}_secret_wrong`,
      }),
      Stripe.errors.StripeInvalidRequestError,
    );
    const confirm = (number: string): Promise<Response> =>
      fetch(`${fake.url}/v1/payment_intents/${pi.id}/confirm`, {
        method: 'POST',
        headers: {
          authorization: `Bearer ${PUBLISHABLE}`,
          'content-type': 'application/x-www-form-urlencoded',
        },
        body: new URLSearchParams({
          client_secret: pi.client_secret ?? '',
          'payment_method_data[type]': 'card',
          'payment_method_data[card][number]': number,
          'payment_method_data[card][exp_month]': '12',
          'payment_method_data[card][exp_year]': String(new Date().getFullYear() + 2),
          'payment_method_data[card][cvc]': '123',
        }),
      });
    const bad = await confirm('4242424242424241');
    assert.equal(bad.status, 402);
    assert.equal(((await bad.json()) as { error: { code: string } }).error.code, 'invalid_number');
    const unknown = await confirm('4111111111111111');
    assert.equal(((await unknown.json()) as { error: { code: string } }).error.code, 'incorrect_number');
    const ok = await confirm('4242 4242 4242 4242');
    assert.equal(ok.status, 200);
    assert.equal(ok.headers.get('access-control-allow-origin'), '*');
    const body = (await ok.json()) as Stripe.PaymentIntent;
    assert.equal(body.status, 'succeeded');
    const pre = await fetch(`${fake.url}/v1/payment_intents/${pi.id}/confirm`, { method: 'OPTIONS' });
    assert.equal(pre.status, 204);
    assert.match(pre.headers.get('access-control-allow-headers') ?? '', /Authorization/);
  });
});

void describe('refunds', () => {
  void it('refunds in part, then the rest, then refuses more; the charge follows', async () => {
    const pi = await intent(5000);
    await stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' });
    const part = await stripe.refunds.create({
      payment_intent: pi.id,
      amount: 1500,
      reason: 'requested_by_customer',
      metadata: { kind: 'partial' },
    });
    assert.match(part.id, /^re_/);
    assert.equal(part.object, 'refund');
    assert.equal(part.status, 'succeeded');
    assert.equal(part.amount, 1500);
    assert.equal(part.payment_intent, pi.id);
    assert.deepEqual(part.metadata, { kind: 'partial' });
    const tooMuch = await rejects(
      stripe.refunds.create({ payment_intent: pi.id, amount: 4000 }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(tooMuch.code, 'amount_too_large');
    const rest = await stripe.refunds.create({ payment_intent: pi.id });
    assert.equal(rest.amount, 3500);
    const charge = await stripe.charges.retrieve(rest.charge as string);
    assert.equal(charge.amount_refunded, 5000);
    assert.equal(charge.refunded, true);
    const done = await rejects(
      stripe.refunds.create({ payment_intent: pi.id }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(done.code, 'charge_already_refunded');
    const list = await stripe.refunds.list({ payment_intent: pi.id });
    assert.equal(list.object, 'list');
    assert.equal(list.has_more, false);
    assert.deepEqual(
      list.data.map((r) => r.id),
      [rest.id, part.id],
    );
    assert.equal((await stripe.refunds.retrieve(part.id)).amount, 1500);
    const byCharge = await stripe.refunds.create({ charge: charge.id }).catch((e: Error) => e);
    assert.ok(byCharge instanceof Stripe.errors.StripeInvalidRequestError);
  });

  void it('refuses to refund an unpaid intent', async () => {
    const pi = await intent();
    const err = await rejects(
      stripe.refunds.create({ payment_intent: pi.id }),
      Stripe.errors.StripeInvalidRequestError,
    );
    assert.equal(err.statusCode, 400);
    assert.match(err.message, /does not have a successful charge/);
  });
});

void describe('idempotency', () => {
  void it('replays the first answer for the same key and parameters, and refuses other parameters', async () => {
    const before = fake.store.intents.size;
    const params = { amount: 2000, currency: 'eur', metadata: { appointmentId: 'apt-9' } };
    const first = await stripe.paymentIntents.create(params, { idempotencyKey: 'booking-apt-9' });
    const second = await stripe.paymentIntents.create(params, { idempotencyKey: 'booking-apt-9' });
    assert.equal(second.id, first.id);
    assert.equal(second.client_secret, first.client_secret);
    assert.equal(second.lastResponse.headers['idempotent-replayed'], 'true');
    assert.equal(fake.store.intents.size, before + 1);
    const err = await rejects(
      stripe.paymentIntents.create({ ...params, amount: 2100 }, { idempotencyKey: 'booking-apt-9' }),
      Stripe.errors.StripeIdempotencyError,
    );
    assert.equal(err.type, 'StripeIdempotencyError');
    assert.match(err.message, /Keys for idempotent requests can only be used with the same parameters/);
    // Keys are per API key: the same key under another API key is a new request.
    const otherKey = await fetch(`${fake.url}/v1/payment_intents/${first.id}/confirm`, {
      method: 'POST',
      headers: {
        authorization: `Bearer ${PUBLISHABLE}`,
        'content-type': 'application/x-www-form-urlencoded',
        'idempotency-key': 'booking-apt-9',
      },
      body: new URLSearchParams({ client_secret: first.client_secret ?? '', payment_method: 'pm_card_visa' }),
    });
    assert.equal(otherKey.status, 200);
  });

  void it('replays a decline too (same status and body), without a second attempt', async () => {
    const pi = await intent();
    const a = await rejects(
      stripe.paymentIntents.confirm(
        pi.id,
        { payment_method: 'pm_card_chargeDeclined' },
        { idempotencyKey: 'try-1' },
      ),
      Stripe.errors.StripeCardError,
    );
    const b = await rejects(
      stripe.paymentIntents.confirm(
        pi.id,
        { payment_method: 'pm_card_chargeDeclined' },
        { idempotencyKey: 'try-1' },
      ),
      Stripe.errors.StripeCardError,
    );
    assert.equal(b.requestId, a.requestId);
    const failures = fake.store.events.filter(
      (e) =>
        e.event.type === 'payment_intent.payment_failed' &&
        (e.event.data.object as { id: string }).id === pi.id,
    );
    assert.equal(failures.length, 1);
  });

  void it('sends an Idempotency-Key on every POST from the SDK, which the fake records on the events', async () => {
    const pi = await intent();
    const created = fake.store.events.find((e) => (e.event.data.object as { id: string }).id === pi.id);
    assert.match(String(created?.event.request?.idempotency_key), /^stripe-node-retry-/);
    assert.match(String(created?.event.request?.id), /^req_/);
  });
});

void describe('pages and control routes', () => {
  void it('lists payments with formatted amounts and escaped metadata', async () => {
    await stripe.paymentIntents.create({ amount: 12_345, currency: 'eur', metadata: { note: '<b>x</b>' } });
    const html = await (await fetch(`${fake.url}/`)).text();
    assert.match(html, /€123\.45/);
    assert.match(html, /&lt;b&gt;x&lt;\/b&gt;/);
    assert.doesNotMatch(html, /<b>x<\/b>/);
    const state = (await (await fetch(`${fake.url}/_fake/state`)).json()) as {
      intents: unknown[];
      events: unknown[];
    };
    assert.ok(state.intents.length > 0);
    assert.ok(state.events.length > 0);
    const js = await fetch(`${fake.url}/js/stripe.js`);
    assert.match(js.headers.get('content-type') ?? '', /application\/javascript/);
    assert.match(await js.text(), /window\.Stripe = Stripe/);
  });
});
