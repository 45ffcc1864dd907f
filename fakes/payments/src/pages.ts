import type Stripe from 'stripe';
import type { PaymentStore, StoredEvent } from './store';

/** The fake's own pages: the payments list, the test authentication step and the demo page. */

export function escapeHtml(value: unknown): string {
  return String(value)
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

/** `1234` `eur` → `€12.34`; zero-decimal currencies (`jpy`) keep their whole units. */
export function formatAmount(amount: number, currency: string): string {
  try {
    const fmt = new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() });
    const digits = fmt.resolvedOptions().maximumFractionDigits ?? 2;
    return fmt.format(amount / 10 ** digits);
  } catch {
    return `${amount} ${currency}`;
  }
}

const STYLE = `
body { font: 15px/1.45 system-ui, sans-serif; margin: 1.5rem; color: #1d1d1d; max-width: 72rem; }
table { border-collapse: collapse; width: 100%; margin-bottom: 1.5rem; }
th, td { text-align: left; padding: .3rem .5rem; border-bottom: 1px solid #ddd; vertical-align: top; }
code { font-size: .9em; }
.muted { color: #595959; }
button { font: inherit; padding: .45rem .9rem; margin-right: .5rem; }
button:focus-visible, a:focus-visible, input:focus-visible { outline: 3px solid #1a5fb4; outline-offset: 2px; }
`;

function layout(title: string, body: string, extraHead = ''): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>${STYLE}</style>
${extraHead}
</head>
<body>
${body}
</body>
</html>`;
}

function time(unix: number): string {
  return new Date(unix * 1000).toISOString().replace('T', ' ').slice(0, 19);
}

function metadataList(metadata: Stripe.Metadata | null): string {
  const entries = Object.entries(metadata ?? {});
  if (entries.length === 0) return '<span class="muted">—</span>';
  return entries.map(([k, v]) => `<code>${escapeHtml(k)}</code>=${escapeHtml(v)}`).join('<br>');
}

function deliveries(stored: StoredEvent): string {
  if (stored.deliveries.length === 0) return `<span class="muted">${escapeHtml(stored.state)}</span>`;
  const rows = stored.deliveries.map(
    (d) =>
      `${escapeHtml(d.at.slice(11, 19))} #${d.attempt}${d.manual ? ' (redeliver)' : ''}: ${escapeHtml(
        d.status ?? d.error ?? 'no answer',
      )}`,
  );
  return `<strong>${escapeHtml(stored.state)}</strong><br>${rows.join('<br>')}`;
}

export function indexPage(store: PaymentStore, info: { webhookUrl: string | null; paused: boolean }): string {
  const intents = [...store.intents.values()].reverse();
  const refunds = [...store.refunds.values()].reverse();
  const events = [...store.events].reverse().slice(0, 200);
  const intentRows = intents
    .map((pi) => {
      const charge = typeof pi.latest_charge === 'string' ? store.charges.get(pi.latest_charge) : undefined;
      const card = charge?.payment_method_details?.card;
      const refunded =
        charge && charge.amount_refunded > 0
          ? ` (refunded ${formatAmount(charge.amount_refunded, pi.currency)})`
          : '';
      return `<tr><td><code>${escapeHtml(pi.id)}</code><br><span class="muted">${time(pi.created)}</span></td>
<td>${escapeHtml(formatAmount(pi.amount, pi.currency))}${escapeHtml(refunded)}</td>
<td>${escapeHtml(pi.status)}${pi.last_payment_error ? `<br><span class="muted">${escapeHtml(pi.last_payment_error.code ?? '')} ${escapeHtml(pi.last_payment_error.decline_code ?? '')}</span>` : ''}</td>
<td>${card ? `${escapeHtml(card.brand ?? '')} …${escapeHtml(card.last4 ?? '')}` : '<span class="muted">—</span>'}</td>
<td>${escapeHtml(pi.description ?? '')}</td>
<td>${metadataList(pi.metadata)}</td></tr>`;
    })
    .join('\n');
  const refundRows = refunds
    .map(
      (
        r,
      ) => `<tr><td><code>${escapeHtml(r.id)}</code></td><td>${escapeHtml(formatAmount(r.amount, r.currency))}</td>
<td><code>${escapeHtml(r.payment_intent ?? '')}</code></td><td>${escapeHtml(r.reason ?? '')}</td><td>${metadataList(r.metadata)}</td></tr>`,
    )
    .join('\n');
  const eventRows = events
    .map((e) => {
      const obj = e.event.data.object as { id?: string };
      return `<tr><td><code>${escapeHtml(e.event.id)}</code><br><span class="muted">${time(e.event.created)}</span></td>
<td>${escapeHtml(e.event.type)}</td><td><code>${escapeHtml(obj.id ?? '')}</code></td><td>${deliveries(e)}</td></tr>`;
    })
    .join('\n');
  const webhook = info.webhookUrl
    ? `Webhooks go to <code>${escapeHtml(info.webhookUrl)}</code>${info.paused ? ' — <strong>paused</strong>' : ''}.`
    : 'No webhook URL: events are only stored.';
  return layout(
    'Payments fake',
    `<h1>Payments fake</h1>
<p>The local stand-in for the hosted payment API (test mode only). ${webhook}
<a href="/demo">Demo checkout</a> · <a href="/_fake/state">State as JSON</a></p>
<h2>Payments (${intents.length})</h2>
${intents.length ? `<table><thead><tr><th>Payment</th><th>Amount</th><th>Status</th><th>Card</th><th>Description</th><th>Metadata</th></tr></thead><tbody>${intentRows}</tbody></table>` : '<p class="muted">No payments yet.</p>'}
<h2>Refunds (${refunds.length})</h2>
${refunds.length ? `<table><thead><tr><th>Refund</th><th>Amount</th><th>Payment</th><th>Reason</th><th>Metadata</th></tr></thead><tbody>${refundRows}</tbody></table>` : '<p class="muted">No refunds yet.</p>'}
<h2>Events (${store.events.length})</h2>
${events.length ? `<table><thead><tr><th>Event</th><th>Type</th><th>Object</th><th>Deliveries</th></tr></thead><tbody>${eventRows}</tbody></table>` : '<p class="muted">No events yet.</p>'}`,
  );
}

export function authenticatePage(pi: Stripe.PaymentIntent, clientSecret: string): string {
  const amount = formatAmount(pi.amount, pi.currency);
  return layout(
    'Test authentication',
    `<main>
<h1>Test authentication</h1>
<p>This card asks the bank to confirm the payment of <strong>${escapeHtml(amount)}</strong>.</p>
<p class="muted">This is the local payments fake: no bank is involved. Choose what the bank answers.</p>
<form method="post" action="/authenticate/${encodeURIComponent(pi.id)}">
<input type="hidden" name="client_secret" value="${escapeHtml(clientSecret)}">
<button type="submit" name="outcome" value="complete">Complete authentication</button>
<button type="submit" name="outcome" value="fail">Fail authentication</button>
</form>
</main>
<script>
// The autofocus attribute is ignored in a cross-origin frame, and focus() is too until the frame
// itself has the focus (stripe.js gives it on load): focus the first button then, once.
var first = document.querySelector('button');
first.focus();
window.addEventListener('focus', function () {
  if (document.activeElement === document.body) first.focus();
});
</script>`,
  );
}

/**
 * After the choice: inside the checkout's frame the page tells its parent (stripe.js removes the
 * overlay); opened on its own (a redirect flow) it goes on to the return URL, as the bank's page would.
 */
export function authenticatedPage(
  pi: Stripe.PaymentIntent,
  outcome: 'complete' | 'fail',
  returnUrl: string | null,
): string {
  const message = {
    source: 'loamline-payments-fake',
    type: 'authentication-result',
    paymentIntent: pi.id,
    outcome,
  };
  let target: string | null = null;
  if (returnUrl) {
    try {
      const u = new URL(returnUrl);
      u.searchParams.set('payment_intent', pi.id);
      u.searchParams.set('payment_intent_client_secret', pi.client_secret ?? '');
      u.searchParams.set('redirect_status', outcome === 'complete' ? 'succeeded' : 'failed');
      target = u.toString();
    } catch {
      target = null;
    }
  }
  const json = (v: unknown): string => JSON.stringify(v).replace(/</g, '\\u003c');
  return layout(
    'Test authentication',
    `<main>
<h1>Test authentication</h1>
<p role="status">${outcome === 'complete' ? 'Authentication completed.' : 'Authentication failed.'}</p>
${target ? `<p><a href="${escapeHtml(target)}">Back to the shop</a></p>` : ''}
</main>
<script>
(function () {
  var message = ${json(message)};
  var target = ${json(target)};
  if (window.parent !== window) window.parent.postMessage(message, '*');
  else if (target) window.location.replace(target);
})();
</script>`,
  );
}

export function demoPage(publishableKey: string, clientSecret: string | null): string {
  const body = clientSecret
    ? `<p>Paying <code id="secret">${escapeHtml(clientSecret.replace(/_secret_.*/, ''))}</code>. Test cards:
4242 4242 4242 4242 (pays), 4000 0000 0000 0002 (declined), 4000 0000 0000 9995 (insufficient funds),
4000 0027 6000 3184 (asks for authentication); any future expiry, any CVC.</p>
<form id="pay">
<div id="card"></div>
<p id="card-error" role="alert"></p>
<button type="submit" id="submit">Pay</button>
</form>
<p>Result: <output id="result" data-state="idle">—</output></p>
<pre id="detail"></pre>
<script src="/js/stripe.js"></script>
<script>
(function () {
  var stripe = window.Stripe(${JSON.stringify(publishableKey).replace(/</g, '\\u003c')});
  var secret = ${JSON.stringify(clientSecret).replace(/</g, '\\u003c')};
  var card = stripe.elements().create('card');
  card.mount('#card');
  card.on('change', function (e) {
    document.getElementById('card-error').textContent = e.error ? e.error.message : '';
  });
  var result = document.getElementById('result');
  document.getElementById('pay').addEventListener('submit', function (ev) {
    ev.preventDefault();
    result.dataset.state = 'paying';
    result.textContent = 'Paying…';
    stripe.confirmCardPayment(secret, { payment_method: { card: card } }).then(function (r) {
      if (r.error) {
        result.dataset.state = 'error';
        result.textContent = 'Error: ' + (r.error.decline_code || r.error.code || r.error.type) + ' — ' + r.error.message;
      } else {
        result.dataset.state = r.paymentIntent.status;
        result.textContent = 'Payment ' + r.paymentIntent.status;
      }
      document.getElementById('detail').textContent = JSON.stringify(r, null, 2);
    });
  });
})();
</script>`
    : `<form method="post" action="/demo">
<p><label>Amount in cents <input name="amount" value="4500" inputmode="numeric"></label>
<label>Currency <input name="currency" value="eur" size="4"></label></p>
<button type="submit">Create a test payment</button>
</form>
<p class="muted">Or open <code>/demo?client_secret=…</code> with the client secret of a payment the app made.</p>`;
  return layout('Payments fake — demo checkout', `<h1>Demo checkout</h1>\n${body}`);
}

export function notFoundPage(message: string): string {
  return layout(
    'Not found',
    `<h1>Not found</h1><p>${escapeHtml(message)}</p><p><a href="/">All payments</a></p>`,
  );
}
