import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { type Server, createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, describe, it } from 'node:test';
import { build } from 'esbuild';
import { type Browser, type Page, chromium } from 'playwright-core';
import Stripe from 'stripe';
import { type PaymentsFake, startPaymentsFake } from '../src/payments-fake';

/**
 * The browser script (`/js/stripe.js`) in headless Chromium. A "shop" page on another origin stands
 * in for the app: it loads the script from the fake, gets its Stripe object through the real
 * `@stripe/stripe-js` `loadStripe`, and runs under a strict CSP that allows the fake's origin only in
 * script-src, connect-src and frame-src — the policy DEVELOPERS.md ("The payments fake") tells the app to use.
 */
const PUBLISHABLE = 'pk_test_loamline_local';
const NONCE = 'shop-nonce-1';
const NEXT_YEAR = String((new Date().getFullYear() + 1) % 100).padStart(2, '0');

let fake: PaymentsFake;
let stripe: Stripe;
let shop: Server;
let shopUrl: string;
let browser: Browser;

/** `@stripe/stripe-js/pure` as the app's bundle has it, wrapped for a plain script tag. */
const loadStripeShim = `(function () { var exports = {};\n${readFileSync(
  require.resolve('@stripe/stripe-js/dist/pure.js'),
  'utf8',
)}\nwindow.loadStripe = exports.loadStripe; })();`;

function shopPage(clientSecret: string): string {
  const json = (v: unknown): string => JSON.stringify(v).replace(/</g, '\\u003c');
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Shop checkout</title>
<script nonce="${NONCE}">
window.__violations = [];
document.addEventListener('securitypolicyviolation', function (e) {
  window.__violations.push(e.violatedDirective + ' ' + e.blockedURI);
});
</script>
<script src="${fake.url}/js/stripe.js"></script>
<script src="/load-stripe.js"></script>
</head><body>
<main><h1>Checkout</h1>
<form id="pay"><div id="card"></div><p id="card-error" role="alert"></p><button type="submit">Pay</button></form>
<output id="result" data-state="loading"></output></main>
<script nonce="${NONCE}">
(function () {
  var secret = ${json(clientSecret)};
  var result = document.getElementById('result');
  window.__changes = [];
  window.loadStripe(${json(PUBLISHABLE)}).then(function (stripe) {
    window.__isStripe = typeof stripe.elements === 'function' && typeof stripe.createToken === 'function' &&
      typeof stripe.createPaymentMethod === 'function' && typeof stripe.confirmCardPayment === 'function';
    var elements = stripe.elements();
    var card = elements.create('card', { style: { base: { fontSize: '16px' } } });
    card.mount('#card');
    card.on('ready', function () { result.dataset.state = 'ready'; });
    card.on('change', function (e) {
      window.__changes.push(e);
      document.getElementById('card-error').textContent = e.error ? e.error.message : '';
    });
    document.getElementById('pay').addEventListener('submit', function (ev) {
      ev.preventDefault();
      result.dataset.state = 'paying';
      stripe.confirmCardPayment(secret, { payment_method: { card: elements.getElement('card') } }).then(function (r) {
        window.__result = r;
        result.dataset.state = r.error ? 'error' : r.paymentIntent.status;
      }, function (err) {
        window.__result = { rejected: String(err) };
        result.dataset.state = 'rejected';
      });
    });
  });
})();
</script></body></html>`;
}

/**
 * The app's own way in: `loadStripe` from `@stripe/stripe-js/pure`, `<Elements>`, `<CardElement>`,
 * `useStripe`, `useElements().getElement(CardElement)`, in StrictMode (which mounts, destroys and
 * mounts the element again), bundled for the browser by esbuild.
 */
const REACT_APP = `
import { StrictMode, useState } from 'react';
import { createRoot } from 'react-dom/client';
import { loadStripe } from '@stripe/stripe-js/pure';
import { CardElement, Elements, useElements, useStripe } from '@stripe/react-stripe-js';

const stripePromise = loadStripe(${JSON.stringify(PUBLISHABLE)});
const secret = new URLSearchParams(window.location.search).get('client_secret') ?? '';

function Checkout() {
  const stripe = useStripe();
  const elements = useElements();
  const [state, setState] = useState('loading');
  const [message, setMessage] = useState('');
  async function onSubmit(e: { preventDefault(): void }) {
    e.preventDefault();
    const card = elements?.getElement(CardElement);
    if (!stripe || !card) return;
    setState('paying');
    const r = await stripe.confirmCardPayment(secret, { payment_method: { card } });
    if (r.error) {
      setMessage(r.error.decline_code ?? r.error.code ?? r.error.type);
      setState('error');
    } else setState(r.paymentIntent.status);
  }
  return (
    <form onSubmit={onSubmit}>
      <CardElement onReady={() => setState('ready')} onChange={(e) => setMessage(e.error?.message ?? '')} />
      <button type="submit" disabled={!stripe}>Pay</button>
      <output id="result" data-state={state}>{message}</output>
    </form>
  );
}

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <Elements stripe={stripePromise}>
      <Checkout />
    </Elements>
  </StrictMode>,
);
`;
let reactBundle = '';

before(async () => {
  const bundled = await build({
    stdin: { contents: REACT_APP, loader: 'tsx', resolveDir: __dirname, sourcefile: 'react-app.tsx' },
    bundle: true,
    write: false,
    format: 'iife',
    jsx: 'automatic',
    define: { 'process.env.NODE_ENV': '"production"' },
    logLevel: 'silent',
  });
  reactBundle = bundled.outputFiles[0].text;
  fake = await startPaymentsFake({ port: 0 });
  stripe = new Stripe('sk_test_loamline_local', { host: '127.0.0.1', port: fake.port, protocol: 'http' });
  shop = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://shop.invalid');
    if (url.pathname === '/react-app.js') {
      res.writeHead(200, { 'content-type': 'application/javascript' }).end(reactBundle);
      return;
    }
    const html =
      url.pathname === '/react'
        ? `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Shop checkout (React)</title>
<script src="${fake.url}/js/stripe.js"></script></head>
<body><main id="root"></main><script src="/react-app.js"></script></body></html>`
        : shopPage(url.searchParams.get('client_secret') ?? '');
    if (url.pathname === '/load-stripe.js') {
      res.writeHead(200, { 'content-type': 'application/javascript' }).end(loadStripeShim);
      return;
    }
    res
      .writeHead(200, {
        'content-type': 'text/html; charset=utf-8',
        'content-security-policy': [
          "default-src 'self'",
          `script-src 'self' 'nonce-${NONCE}' ${fake.url}`,
          `connect-src 'self' ${fake.url}`,
          `frame-src ${fake.url}`,
          "style-src 'self'",
          "img-src 'self'",
        ].join('; '),
      })
      .end(html);
  });
  // Another origin than the fake's: localhost instead of 127.0.0.1.
  await new Promise<void>((resolve) => shop.listen(0, '127.0.0.1', resolve));
  shopUrl = `http://localhost:${(shop.address() as AddressInfo).port}`;
  browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-sync',
    ],
  });
});

after(async () => {
  await browser?.close();
  await new Promise<void>((resolve) => shop.close(() => resolve()));
  await fake.close();
});

async function checkout(): Promise<{ page: Page; pi: Stripe.PaymentIntent; warnings: string[] }> {
  const pi = await stripe.paymentIntents.create({
    amount: 8900,
    currency: 'eur',
    metadata: { appointmentId: 'b1' },
  });
  const page = await browser.newPage();
  page.setDefaultTimeout(10_000);
  const warnings: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'warning' || m.type() === 'error') warnings.push(m.text());
  });
  page.on('pageerror', (e) => warnings.push(e.message));
  await page.goto(`${shopUrl}/?client_secret=${encodeURIComponent(pi.client_secret ?? '')}`);
  await page.locator('#result[data-state="ready"]').waitFor({ state: 'attached' });
  return { page, pi, warnings };
}

/** Types as a person would: the number, then (focus moves on by itself) expiry and CVC. */
async function typeCard(page: Page, number: string): Promise<void> {
  await page.getByLabel('Card number').click();
  await page.keyboard.type(`${number}12${NEXT_YEAR}123`);
}

async function pay(page: Page): Promise<string> {
  await page.getByRole('button', { name: 'Pay' }).click();
  const result = page.locator('#result:not([data-state="paying"])');
  await result.waitFor({ state: 'attached' });
  return (await result.getAttribute('data-state')) ?? '';
}

interface Outcome {
  paymentIntent?: Stripe.PaymentIntent;
  error?: {
    type: string;
    code?: string;
    decline_code?: string;
    message: string;
    payment_intent?: Stripe.PaymentIntent;
  };
  rejected?: string;
}

const outcome = (page: Page): Promise<Outcome> =>
  page.evaluate(() => (globalThis as unknown as { __result: Outcome }).__result);

async function noViolations(page: Page, warnings: string[]): Promise<void> {
  const violations = await page.evaluate(
    () => (globalThis as unknown as { __violations: string[] }).__violations,
  );
  assert.deepEqual(violations, []);
  assert.deepEqual(warnings, []);
}

void describe('stripe.js stand-in in a browser', () => {
  void it('is what loadStripe picks up, passes react-stripe-js isStripe, and pays with 4242 4242 4242 4242', async () => {
    const { page, pi, warnings } = await checkout();
    assert.equal(
      await page.evaluate(() => (globalThis as unknown as { __isStripe: boolean }).__isStripe),
      true,
    );
    assert.equal(await page.getByRole('group', { name: 'Card details' }).count(), 1);
    await typeCard(page, '4242424242424242');
    assert.equal(await page.getByLabel('Card number').inputValue(), '4242 4242 4242 4242');
    assert.equal(await page.getByLabel('Expiry (MM / YY)').inputValue(), `12 / ${NEXT_YEAR}`);
    assert.equal(await page.getByLabel('CVC').inputValue(), '123');
    const changes = await page.evaluate(
      () =>
        (globalThis as unknown as { __changes: { complete: boolean; brand: string; empty: boolean }[] })
          .__changes,
    );
    const last = changes[changes.length - 1];
    assert.equal(last.complete, true);
    assert.equal(last.brand, 'visa');
    assert.equal(last.empty, false);
    assert.equal(await page.locator('#card.StripeElement--complete').count(), 1);
    assert.equal(await pay(page), 'succeeded');
    const r = await outcome(page);
    assert.equal(r.paymentIntent?.id, pi.id);
    assert.equal((await stripe.paymentIntents.retrieve(pi.id)).status, 'succeeded');
    await noViolations(page, warnings);
    await page.close();
  });

  for (const [number, declineCode, message] of [
    ['4000000000000002', 'generic_decline', 'Your card was declined.'],
    ['4000000000009995', 'insufficient_funds', 'Your card has insufficient funds.'],
  ] as const) {
    void it(`resolves { error } for ${number} (${declineCode}) without rejecting`, async () => {
      const { page, pi, warnings } = await checkout();
      await typeCard(page, number);
      assert.equal(await pay(page), 'error');
      const r = await outcome(page);
      assert.equal(r.error?.type, 'card_error');
      assert.equal(r.error?.code, 'card_declined');
      assert.equal(r.error?.decline_code, declineCode);
      assert.equal(r.error?.message, message);
      assert.equal(r.error?.payment_intent?.id, pi.id);
      assert.equal(r.error?.payment_intent?.status, 'requires_payment_method');
      // The 402 is the console's only complaint (the browser logs failed requests).
      await noViolations(
        page,
        warnings.filter((w) => !/402/.test(w)),
      );
      await page.close();
    });
  }

  void it('reports an invalid number while typing, and an unknown one as incorrect_number', async () => {
    const { page } = await checkout();
    await page.getByLabel('Card number').click();
    await page.keyboard.type('4242424242424241');
    await page.getByRole('alert').filter({ hasText: 'Your card number is invalid.' }).waitFor();
    assert.equal(await page.getByLabel('Card number').getAttribute('aria-invalid'), 'true');
    assert.equal(await pay(page), 'error');
    assert.equal((await outcome(page)).error?.code, 'invalid_number');
    await page.getByLabel('Card number').fill('');
    await typeCard(page, '4111111111111111');
    assert.equal(await pay(page), 'error');
    assert.equal((await outcome(page)).error?.code, 'incorrect_number');
    await page.close();
  });

  void it('shows the authentication step for 4000 0027 6000 3184; completing it pays', async () => {
    const { page, pi, warnings } = await checkout();
    await typeCard(page, '4000002760003184');
    await page.getByRole('button', { name: 'Pay' }).click();
    const dialog = page.getByRole('dialog', { name: 'Test authentication' });
    await dialog.waitFor();
    const frame = page.frameLocator('iframe[title="Test authentication"]');
    await frame.getByText('this card asks the bank to confirm the payment', { exact: false }).waitFor();
    assert.equal((await stripe.paymentIntents.retrieve(pi.id)).status, 'requires_action');
    await frame.getByRole('button', { name: 'Complete authentication' }).click();
    await page.locator('#result[data-state="succeeded"]').waitFor({ state: 'attached' });
    assert.equal(await dialog.count(), 0);
    assert.equal((await outcome(page)).paymentIntent?.status, 'succeeded');
    assert.equal((await stripe.paymentIntents.retrieve(pi.id)).status, 'succeeded');
    await noViolations(page, warnings);
    await page.close();
  });

  void it('failing the authentication (by keyboard) resolves payment_intent_authentication_failure', async () => {
    const { page, pi } = await checkout();
    await typeCard(page, '4000002760003184');
    await page.keyboard.press('Enter');
    const frame = page.frameLocator('iframe[title="Test authentication"]');
    await frame.getByRole('button', { name: 'Complete authentication' }).waitFor();
    await frame.getByRole('button', { name: 'Complete authentication' }).focus();
    await page.keyboard.press('Tab');
    // Enter submits as it goes down and the overlay goes with the answer; the key comes up after.
    // A key-up sent while the (out-of-process) frame that has the focus is being removed is never
    // acknowledged by the browser, and keyboard.press waits for that with no timeout.
    await page.keyboard.down('Enter');
    await page.getByRole('dialog').waitFor({ state: 'detached' });
    await page.keyboard.up('Enter');
    await page.locator('#result[data-state="error"]').waitFor({ state: 'attached' });
    const r = await outcome(page);
    assert.equal(r.error?.code, 'payment_intent_authentication_failure');
    assert.equal(r.error?.payment_intent?.status, 'requires_payment_method');
    assert.equal(await page.getByRole('dialog').count(), 0);
    assert.equal((await stripe.paymentIntents.retrieve(pi.id)).status, 'requires_payment_method');
    await page.close();
  });

  for (const [number, expected] of [
    ['4242424242424242', 'succeeded'],
    ['4000000000009995', 'error'],
  ] as const) {
    void it(`works with @stripe/react-stripe-js (Elements, CardElement, StrictMode): ${number} → ${expected}`, async () => {
      const pi = await stripe.paymentIntents.create({ amount: 6100, currency: 'eur' });
      const page = await browser.newPage();
      page.setDefaultTimeout(10_000);
      const problems: string[] = [];
      page.on('pageerror', (e) => problems.push(e.message));
      page.on('console', (m) => {
        if (m.type() === 'warning' || (m.type() === 'error' && !/402/.test(m.text())))
          problems.push(m.text());
      });
      await page.goto(`${shopUrl}/react?client_secret=${encodeURIComponent(pi.client_secret ?? '')}`);
      await page.locator('#result[data-state="ready"]').waitFor({ state: 'attached' });
      // StrictMode mounted, destroyed and mounted the element again: one card group is left.
      assert.equal(await page.getByRole('group', { name: 'Card details' }).count(), 1);
      await typeCard(page, number);
      await page.getByRole('button', { name: 'Pay' }).click();
      await page.locator(`#result[data-state="${expected}"]`).waitFor({ state: 'attached' });
      if (expected === 'error')
        assert.equal(await page.locator('#result').textContent(), 'insufficient_funds');
      assert.deepEqual(problems, []);
      assert.equal(
        (await stripe.paymentIntents.retrieve(pi.id)).status,
        expected === 'error' ? 'requires_payment_method' : 'succeeded',
      );
      await page.close();
    });
  }

  void it('the demo page pays a client secret', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 1500, currency: 'gbp' });
    const page = await browser.newPage();
    await page.goto(`${fake.url}/demo?client_secret=${encodeURIComponent(pi.client_secret ?? '')}`);
    await typeCard(page, '4242424242424242');
    await page.getByRole('button', { name: 'Pay' }).click();
    await page.locator('#result[data-state="succeeded"]').waitFor({ state: 'attached' });
    assert.equal((await stripe.paymentIntents.retrieve(pi.id)).status, 'succeeded');
    await page.close();
  });
});
