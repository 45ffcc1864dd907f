import { readFileSync } from 'node:fs';
import { type IncomingMessage, type Server, type ServerResponse, createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { type ApiKeys, CORS_HEADERS, type IdempotentAnswer, handleApi, readBody } from './api';
import { parseForm } from './form';
import { authenticatePage, authenticatedPage, demoPage, indexPage, notFoundPage } from './pages';
import { StateFile, readStateFile, restore, snapshot } from './state-file';
import { ApiError, NO_REQUEST, PaymentStore } from './store';
import { WebhookSender } from './webhooks';

export interface PaymentsFakeOptions {
  /** 0 picks a free port (the one taken is in the result). */
  port: number;
  host?: string;
  /** Where browsers reach the fake (authentication URLs); default `http://<host>:<port>`. */
  publicUrl?: string;
  secretKey?: string;
  publishableKey?: string;
  /** The app's webhook endpoint; without one, events are only stored. */
  webhookUrl?: string | null;
  webhookSecret?: string;
  /** First webhook retry after this many ms, doubling up to 60 s (default 1000). */
  webhookRetryBaseMs?: number;
  /** Attempts before an event's delivery is given up (default 20). */
  webhookMaxAttempts?: number;
  /**
   * Keep the state in this JSON file: loaded at start (missing = empty; unreadable = the start fails
   * naming the file), saved after every change and on close(). Without it, state is memory only.
   */
  stateFile?: string;
}

export interface PaymentsFake {
  port: number;
  url: string;
  store: PaymentStore;
  webhooks: WebhookSender;
  /** Stops the server and the webhook timers, saves the state file; resolves once it no longer listens. */
  close(): Promise<void>;
}

export const DEFAULT_SECRET_KEY = 'sk_test_loamline_local';
export const DEFAULT_PUBLISHABLE_KEY = 'pk_test_loamline_local';
export const DEFAULT_WEBHOOK_SECRET = 'whsec_loamline_local';

const BROWSER_SCRIPT = readFileSync(join(__dirname, 'browser', 'stripe.js'), 'utf8');

const PAGE_HEADERS = {
  'cache-control': 'no-store',
  'x-content-type-options': 'nosniff',
  // The authentication page is framed by the app's checkout, so no frame-ancestors limit.
  'content-security-policy': [
    "default-src 'self'",
    "script-src 'self' 'unsafe-inline'",
    "style-src 'self' 'unsafe-inline'",
    "form-action 'self'",
    "base-uri 'none'",
  ].join('; '),
};

function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, { ...PAGE_HEADERS, 'content-type': 'text/html; charset=utf-8' });
  res.end(html);
}

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'cache-control': 'no-store', 'content-type': 'application/json; charset=utf-8' });
  res.end(JSON.stringify(body, null, 2));
}

/** Starts the fake; rejects when the port cannot be taken or the state file cannot be read. */
export async function startPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const host = options.host ?? '127.0.0.1';
  const keys: ApiKeys = {
    secret: options.secretKey ?? DEFAULT_SECRET_KEY,
    publishable: options.publishableKey ?? DEFAULT_PUBLISHABLE_KEY,
  };
  const webhookUrl = options.webhookUrl || null;
  let publicUrl = options.publicUrl?.replace(/\/+$/, '') ?? '';
  const idempotency = new Map<string, IdempotentAnswer>();
  const saved = options.stateFile ? readStateFile(options.stateFile) : null;
  let stateFile: StateFile | null = null;
  const changed = (): void => stateFile?.changed();
  let webhooks: WebhookSender | null = null;
  const store = new PaymentStore({
    get publicUrl() {
      return publicUrl;
    },
    pendingWebhooks: () => (webhookUrl ? 1 : 0),
    onEvent: () => {
      changed();
      webhooks?.kick();
    },
  });
  if (saved) restore(store, idempotency, saved);
  if (options.stateFile) stateFile = new StateFile(options.stateFile, () => snapshot(store, idempotency));
  webhooks = new WebhookSender(store, {
    url: webhookUrl,
    secret: options.webhookSecret ?? DEFAULT_WEBHOOK_SECRET,
    retryBaseMs: options.webhookRetryBaseMs ?? 1000,
    maxAttempts: options.webhookMaxAttempts,
    onChange: changed,
  });
  const sender = webhooks;
  let script = BROWSER_SCRIPT;

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://fake.invalid');
    const method = req.method ?? 'GET';
    const path = url.pathname;
    if (path.startsWith('/v1/')) return handleApi({ store, keys, idempotency }, req, res, url);

    if (method === 'GET' && path === '/health')
      return sendJson(res, 200, { status: 'ok', service: 'payments-fake' });
    if (method === 'GET' && path === '/') {
      return sendHtml(res, 200, indexPage(store, { webhookUrl, paused: sender.isPaused }));
    }
    if (method === 'GET' && path === '/js/stripe.js') {
      res.writeHead(200, {
        'content-type': 'application/javascript; charset=utf-8',
        'cache-control': 'no-cache',
        'access-control-allow-origin': '*',
        'cross-origin-resource-policy': 'cross-origin',
        'x-content-type-options': 'nosniff',
      });
      res.end(script);
      return;
    }
    if (method === 'GET' && path === '/demo') {
      return sendHtml(res, 200, demoPage(keys.publishable, url.searchParams.get('client_secret')));
    }
    if (method === 'POST' && path === '/demo') {
      const form = parseForm(await readBody(req));
      const amount = Number(form.amount);
      const currency = typeof form.currency === 'string' ? form.currency.toLowerCase() : 'eur';
      if (!Number.isInteger(amount) || amount < 1 || !/^[a-z]{3}$/.test(currency)) {
        return sendHtml(res, 400, notFoundPage('Give a whole amount in cents and a three-letter currency.'));
      }
      const pi = store.createIntent(
        {
          amount,
          currency,
          description: 'Demo payment',
          metadata: { demo: 'true' },
          paymentMethodTypes: ['card'],
          automatic: false,
          receiptEmail: null,
          paymentMethod: null,
        },
        NO_REQUEST,
      );
      res.writeHead(303, { location: `/demo?client_secret=${encodeURIComponent(pi.client_secret ?? '')}` });
      res.end();
      return;
    }
    const auth = /^\/authenticate\/(pi_[A-Za-z0-9]+)$/.exec(path);
    if (auth) {
      const pi = store.intents.get(auth[1]);
      const secret = method === 'POST' ? null : url.searchParams.get('client_secret');
      const form = method === 'POST' ? parseForm(await readBody(req)) : {};
      const given = secret ?? (typeof form.client_secret === 'string' ? form.client_secret : null);
      if (!pi || given !== pi.client_secret)
        return sendHtml(res, 404, notFoundPage('No such payment to authenticate.'));
      if (method === 'GET') {
        if (pi.status !== 'requires_action') {
          return sendHtml(
            res,
            409,
            notFoundPage(`This payment is ${pi.status}; there is nothing to authenticate.`),
          );
        }
        return sendHtml(res, 200, authenticatePage(pi, given ?? ''));
      }
      if (method === 'POST') {
        const outcome = form.outcome === 'fail' ? 'fail' : form.outcome === 'complete' ? 'complete' : null;
        if (!outcome) return sendHtml(res, 400, notFoundPage('Choose complete or fail.'));
        const returnUrl = pi.next_action?.redirect_to_url?.return_url ?? null;
        try {
          store.authenticate(pi.id, outcome);
        } catch (err) {
          if (err instanceof ApiError) return sendHtml(res, 409, notFoundPage(err.message));
          throw err;
        }
        return sendHtml(res, 200, authenticatedPage(pi, outcome, returnUrl));
      }
    }

    if (path.startsWith('/_fake/')) {
      if (method === 'GET' && path === '/_fake/state') {
        return sendJson(res, 200, {
          webhooks: { url: webhookUrl, paused: sender.isPaused },
          intents: [...store.intents.values()],
          charges: [...store.charges.values()],
          refunds: [...store.refunds.values()],
          events: store.events,
        });
      }
      if (method === 'POST' && path === '/_fake/webhooks/pause') {
        sender.pause();
        return sendJson(res, 200, { paused: true });
      }
      if (method === 'POST' && path === '/_fake/webhooks/resume') {
        sender.resume();
        return sendJson(res, 200, { paused: false });
      }
      if (method === 'POST' && path === '/_fake/reset') {
        store.reset();
        idempotency.clear();
        sender.clearTimer();
        return sendJson(res, 200, { reset: true });
      }
      const redeliver = /^\/_fake\/events\/([^/]+)\/redeliver$/.exec(path);
      if (method === 'POST' && redeliver) {
        const stored = store.event(redeliver[1]);
        if (!stored)
          return sendJson(res, 404, {
            error: { type: 'invalid_request_error', message: `No such event: '${redeliver[1]}'` },
          });
        const delivery = await sender.redeliver(stored);
        return sendJson(res, 200, { event: stored.event.id, delivery });
      }
      return sendJson(res, 404, {
        error: { type: 'invalid_request_error', message: `Unrecognized fake route (${method} ${path})` },
      });
    }
    if (method === 'OPTIONS') {
      res.writeHead(204, CORS_HEADERS);
      res.end();
      return;
    }
    sendJson(res, 404, {
      error: { type: 'invalid_request_error', message: `Unrecognized request URL (${method}: ${path}).` },
    });
  }

  const server: Server = createServer((req, res) => {
    // Whatever a request changes (the API and its idempotency answers, authentication, the demo,
    // /_fake/… routes) is saved once it has been answered; reads change nothing.
    if (stateFile && !['GET', 'HEAD', 'OPTIONS'].includes(req.method ?? 'GET')) {
      res.once('close', changed);
    }
    handle(req, res).catch((err: unknown) => {
      if (!res.headersSent) {
        const message = err instanceof Error ? err.message : String(err);
        sendJson(res, err instanceof ApiError ? err.status : 500, { error: { type: 'api_error', message } });
      } else res.destroy();
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  publicUrl ||= `http://${host}:${port}`;
  script = BROWSER_SCRIPT.replace('__PAYMENTS_FAKE_URL__', publicUrl);
  // Events the app had not yet taken before the restart go out again now.
  if (saved) sender.kick();

  let closing: Promise<void> | null = null;
  const close = (): Promise<void> => {
    closing ??= new Promise<void>((resolve) => {
      sender.close();
      server.close(() => {
        stateFile?.close();
        resolve();
      });
      server.closeAllConnections();
      stateFile?.flush();
    });
    return closing;
  };
  return { port, url: publicUrl, store, webhooks: sender, close };
}
